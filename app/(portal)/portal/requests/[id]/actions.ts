"use server";

import { revalidatePath } from "next/cache";
import { getDb } from "@/db/client";
import { writeAudit } from "@/db/queries/audit";
import { snapshotOf } from "@/db/queries/addresses";
import { acceptanceContext } from "@/lib/orders/acceptance";
import { acceptQuoteAndCreateOrder, getLatestIssuedVersion, getQuoteWithRequest } from "@/db/queries/client-quotes";
import { createDocument } from "@/db/queries/documents";
import { getCurrentTerms } from "@/db/queries/issued-documents";
import { getUploadOwned } from "@/db/queries/files";
import { createMessage, getMessage } from "@/db/queries/messages";
import { getOrderWithRequest } from "@/db/queries/payments";
import { getRequest } from "@/db/queries/requests";
import { transitionStage } from "@/db/queries/stages";
import { getFileRetention, recordDeletionRequest } from "@/db/queries/retention";
import { assertCanSee, requirePermission, requireRole } from "@/lib/auth/guard";
import { FINISHED_STAGES } from "@/lib/retention/policy";
import { deleteRequestFiles } from "@/lib/retention/run";
import { deleteStoredFiles } from "@/lib/uploads/uploadthing";
import { env } from "@/lib/env";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { openCheckout, type CheckoutResult } from "@/lib/payments/checkout";
import { splitDeposit } from "@/lib/payments/deposit";
import { openBankTransfer } from "@/lib/payments/bank-transfer";
import { defineAction } from "@/lib/server/define-action";
import { z } from "zod";
import { getFirmTerms, openOnAccountCents } from "@/db/queries/account-terms";
import { checkCredit, isOnAccount } from "@/lib/payments/terms";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { acceptQuoteSchema, messageSchema, type AcceptQuoteInput } from "@/lib/validation/request";
import { formatDate } from "@/lib/dates";

const dateText = (d: Date) => formatDate(d);

const payByTransferSchema = z.object({ orderId: z.string().min(1).max(64), kind: z.enum(["deposit", "balance"], { error: "Unknown payment kind." }) });

/**
 * Accept an issued quote with a PO number and the terms: the order is made and the deposit's
 * Checkout Session opened; the browser goes to its URL. Expired, superseded or stale quotes are refused.
 */
export async function acceptQuote(input: AcceptQuoteInput): Promise<ActionResult<CheckoutResult & { orderId: string }>> {
  const parsed = acceptQuoteSchema.safeParse(input);
  if (!parsed.success) {
    const fe: Record<string, string[]> = {};
    for (const i of parsed.error.issues) (fe[i.path.join(".")] ??= []).push(i.message);
    return { ok: false, code: "invalid_input", message: "Check the highlighted fields.", fieldErrors: fe };
  }
  try {
    const user = await requirePermission("quote:accept");
    const db = getDb();
    const row = await getQuoteWithRequest(db, parsed.data.quoteId);
    assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "quote");
    const { quote, request } = row!;
    const now = new Date();
    if (quote.status === "accepted") throw new AppError("conflict:quote", "This quote is already accepted.");
    if (quote.status === "superseded") throw new AppError("conflict:quote", "A newer version of this quote replaces it; review the latest version.");
    if (quote.status === "expired" || (quote.validUntil && quote.validUntil.getTime() < now.getTime())) {
      throw new AppError("conflict:quote", `This quote expired${quote.validUntil ? ` on ${dateText(quote.validUntil)}` : ""}. Ask us for a fresh quote from the messages below.`);
    }
    if (quote.status !== "issued") throw new AppError("conflict:quote", "This quote cannot be accepted.");
    if (quote.isStale) throw new AppError("conflict:quote", "A part's file changed after this quote was made; our sales engineers will re-quote.");
    if ((await getLatestIssuedVersion(db, request.id)) !== quote.version) throw new AppError("conflict:quote", "A newer version of this quote replaces it; review the latest version.");
    if (request.stage !== "quoted") throw new AppError("conflict:stage", "This request is not waiting for a quote to be accepted.");

    // Where it ships decides the freight; a valid tax exemption takes the tax off.
    const ctx = await acceptanceContext(db, { quote, orgId: request.orgId, requestId: request.id, now });
    if (ctx.shipTos.length === 0) {
      throw new AppError("conflict:address", "Add a shipping address on your firm's page first: the order needs somewhere to ship, and the freight is priced to it.", { shipToId: ["Your firm has no shipping address yet."] });
    }
    const option = parsed.data.shipToId ? ctx.shipTos.find((o) => o.address.id === parsed.data.shipToId) : (ctx.shipTos.find((o) => o.address.isDefault) ?? ctx.shipTos[0]);
    if (!option) throw new AppError("invalid_input", "Pick one of your firm's shipping addresses.", { shipToId: ["That address is not in your firm's address book."] });
    const f = option.figures;
    const split = splitDeposit(quote.totalCents, quote.depositBp);
    const quotedDeposit = quote.depositCents > 0 ? quote.depositCents : split.depositCents;
    const totalCents = f.isChanged ? f.totalCents : quote.totalCents;
    const { payBy } = parsed.data;
    // On account: no deposit; the whole is invoiced on the firm's terms when the order ships.
    const terms = await getFirmTerms(db, request.orgId);
    const onAccount = payBy === "account";
    if (onAccount) {
      if (!terms || !isOnAccount(terms.paymentTerms)) {
        throw new AppError("conflict:terms", "Your firm does not pay on account yet: pay the deposit by card or bank transfer, or ask the bureau's accounts team for net terms.", { payBy: ["Not available to your firm yet."] });
      }
      const openCents = await openOnAccountCents(db, request.orgId);
      const credit = checkCredit({ limitCents: terms.creditLimitCents, openCents, orderCents: totalCents });
      if (!credit.ok) {
        const msg = `This order (${formatCents(totalCents, quote.currency)}) would take your firm past its credit limit of ${formatCents(terms.creditLimitCents, quote.currency)}: ${formatCents(openCents, quote.currency)} is open on account, ${formatCents(credit.availableCents, quote.currency)} is left. Pay the deposit by card or bank transfer instead; nothing was accepted.`;
        throw new AppError("conflict:credit_limit", msg, { payBy: [`Over your credit limit by ${formatCents(credit.overByCents, quote.currency)}.`] });
      }
    }
    let poUpload: Awaited<ReturnType<typeof getUploadOwned>> = null;
    if (parsed.data.poUploadId) {
      poUpload = await getUploadOwned(db, parsed.data.poUploadId, user.id);
      if (!poUpload) throw new AppError("invalid_input", "That purchase order file was not found; upload it again.", { poUploadId: ["Upload the PDF again."] });
      if (poUpload.contentType !== "application/pdf" && !/\.pdf$/i.test(poUpload.fileName)) throw new AppError("invalid_input", "The purchase order must be a PDF.", { poUploadId: ["Upload a PDF."] });
    }
    const depositCents = onAccount ? 0 : f.isChanged ? f.depositCents : quotedDeposit;
    const extra = {
      paymentTerms: onAccount && terms ? terms.paymentTerms : ("prepay" as const),
      poUploadId: poUpload?.id ?? null,
      shipTo: snapshotOf(option.address, option.zone),
      billTo: ctx.billing ? snapshotOf(ctx.billing) : null,
      ...(f.isChanged ? { lines: f.lines, subtotalCents: f.subtotalCents, marginCents: f.marginCents, taxBp: f.taxBp, taxCents: f.taxCents } : {}),
      taxExemption: ctx.exemption ? { certificateNumber: ctx.exemption.certificateNumber, issuedBy: ctx.exemption.issuedBy, expiresOn: ctx.exemption.expiresOn.toISOString() } : null,
    };
    // The terms printed on the quote are the ones accepted; a quote from before versioned terms takes the current ones.
    const termsVersion = quote.termsVersion ?? (await getCurrentTerms(db))?.version ?? null;
    const order = await db.transaction(async (tx) => {
      const o = await acceptQuoteAndCreateOrder(tx, {
        quoteId: quote.id,
        requestId: request.id,
        orgId: request.orgId,
        acceptedById: user.id,
        poNumber: parsed.data.poNumber,
        termsVersion,
        totalCents,
        depositCents,
        balanceCents: totalCents - depositCents,
        currency: quote.currency,
        now,
        extra,
      });
      if (!o) throw new AppError("conflict:quote", "This quote changed meanwhile; reload the page.");
      await transitionStage(tx, { requestId: request.id, to: "accepted", actorId: user.id, note: `Quote v${quote.version} accepted, PO ${parsed.data.poNumber}, ships to ${option.address.label}`, expectedFrom: "quoted" });
      if (onAccount && terms) {
        await transitionStage(tx, { requestId: request.id, to: "deposit_paid", actorId: user.id, note: `On account (${PAYMENT_TERMS_LABEL[terms.paymentTerms]}), PO ${parsed.data.poNumber}: no deposit; invoiced when the order ships`, expectedFrom: "accepted" });
      }
      if (poUpload) {
        await createDocument(tx, { requestId: request.id, orgId: request.orgId, kind: "attachment", title: `Purchase order ${parsed.data.poNumber}`, fileKey: poUpload.fileKey, fileName: poUpload.fileName, sizeBytes: poUpload.sizeBytes, contentType: poUpload.contentType, uploadedById: user.id });
      }
      await writeAudit(tx, {
        actorId: user.id, action: "quote.accept", entityType: "quote", entityId: quote.id, orgId: request.orgId,
        after: { poNumber: parsed.data.poNumber, payBy, paymentTerms: extra.paymentTerms, poFile: poUpload?.fileName ?? null, totalCents, quotedTotalCents: quote.totalCents, freightCents: f.freightCents, shipTo: option.address.label, freightZone: option.zone?.key ?? null, taxExempt: Boolean(ctx.exemption), termsVersion },
      });
      return o;
    });
    if (onAccount) {
      revalidatePath(`/portal/requests/${request.id}`);
      return { ok: true, data: { url: null, isComplete: false, orderId: order.id } };
    }
    if (payBy === "bank_transfer") {
      // The acceptance stands either way; the order page shows the details, or offers to open them again.
      await openBankTransfer(db, { orderId: order.id, kind: "deposit", userId: user.id }).catch((e: unknown) => console.error("bank transfer after acceptance failed", e));
      revalidatePath(`/portal/requests/${request.id}`);
      return { ok: true, data: { url: null, isComplete: false, orderId: order.id } };
    }
    const checkout = await openCheckout(db, { orderId: order.id, kind: "deposit", userId: user.id, email: user.email, appUrl: env().APP_URL }).catch((e: unknown) => {
      // The acceptance stands; the deposit can be paid from the order page.
      console.error("checkout after acceptance failed", e);
      return { url: null, isComplete: false };
    });
    revalidatePath(`/portal/requests/${request.id}`);
    return { ok: true, data: { ...checkout, orderId: order.id } };
  } catch (e) {
    return toActionError(e);
  }
}

/** Open (or reopen) the Checkout Session for an order's deposit or balance. */
export async function payOrder(input: { orderId: string; kind: "deposit" | "balance" }): Promise<ActionResult<CheckoutResult>> {
  try {
    if (!input || typeof input !== "object") throw new AppError("invalid_input", "The request was not valid.");
    const user = await requirePermission("payment:pay");
    if (input.kind !== "deposit" && input.kind !== "balance") throw new AppError("invalid_input", "Unknown payment kind.");
    const db = getDb();
    const row = await getOrderWithRequest(db, String(input.orderId));
    assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "order");
    const result = await openCheckout(db, { orderId: row!.order.id, kind: input.kind, userId: user.id, email: user.email, appUrl: env().APP_URL });
    return { ok: true, data: result };
  } catch (e) {
    return toActionError(e);
  }
}

/**
 * Pay an order's deposit or balance by bank transfer: the account details and the reference to
 * quote, opened once through the payment service's bank-transfer method and shown on the order page.
 */
export const payByTransfer = defineAction({ access: "payment:pay", input: payByTransferSchema }, async (input, { user, db }) => {
  const row = await getOrderWithRequest(db, input.orderId);
  assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "order");
  const t = await openBankTransfer(db, { orderId: row!.order.id, kind: input.kind, userId: user.id });
  revalidatePath(`/portal/requests/${row!.request.id}`);
  return { reference: t.reference, amountCents: t.amountCents };
});

/** Post a message (or a reply) on a request, with up to four uploaded attachments. */
export async function postMessage(input: { requestId: string; parentId?: string; body: string; uploadIds?: string[] }): Promise<ActionResult<{ id: string }>> {
  const parsed = messageSchema.safeParse(input);
  if (!parsed.success) return { ok: false, code: "invalid_input", message: parsed.error.issues[0]?.message ?? "Check the message.", fieldErrors: { body: parsed.error.issues.map((i) => i.message) } };
  try {
    const user = await requirePermission("message:post");
    const db = getDb();
    const req = await getRequest(db, parsed.data.requestId);
    assertCanSee(user, req ? { orgId: req.orgId, createdById: req.createdById } : null, "request");
    if (parsed.data.parentId) {
      const parent = await getMessage(db, parsed.data.parentId);
      if (!parent || parent.requestId !== req!.id) throw new AppError("not_found:message", "The message you replied to was not found.");
    }
    const msg = await createMessage(db, { requestId: req!.id, orgId: req!.orgId, authorId: user.id, parentId: parsed.data.parentId ?? null, isFromStaff: false, body: parsed.data.body });
    for (const uploadId of parsed.data.uploadIds) {
      const up = await getUploadOwned(db, uploadId, user.id);
      if (!up) continue;
      await createDocument(db, { requestId: req!.id, orgId: req!.orgId, messageId: msg.id, kind: "attachment", title: up.fileName, fileKey: up.fileKey, fileName: up.fileName, sizeBytes: up.sizeBytes, contentType: up.contentType, uploadedById: user.id });
    }
    revalidatePath(`/portal/requests/${req!.id}`);
    return { ok: true, data: msg };
  } catch (e) {
    return toActionError(e);
  }
}

/**
 * A client admin has a closed or cancelled order's model files deleted now, before the bureau's
 * retention period ends. Recorded first (so the daily job finishes it if storage fails now),
 * audited; the order's records and documents stay.
 */
export async function deleteOrderFilesNow(input: { requestId: string; confirm: string }): Promise<ActionResult<{ deletedCount: number | null }>> {
  try {
    if (!input || typeof input !== "object" || typeof input.requestId !== "string" || input.requestId.length > 64) throw new AppError("invalid_input", "The request was not valid.");
    if (input.confirm !== "delete") throw new AppError("invalid_input:confirmation", "Confirm that the files should be deleted.");
    const user = await requireRole("client_admin");
    const db = getDb();
    const req = await getRequest(db, input.requestId);
    assertCanSee(user, req ? { orgId: req.orgId, createdById: req.createdById } : null, "request");
    if (!(FINISHED_STAGES as readonly string[]).includes(req!.stage)) throw new AppError("conflict:stage", "Files can be deleted early once the order is closed or cancelled.");
    const state = await getFileRetention(db, req!.id);
    if (state?.filesDeletedAt) throw new AppError("conflict:deleted", "This order's files are already deleted.");
    const now = new Date();
    await recordDeletionRequest(db, { requestId: req!.id, orgId: req!.orgId, userId: user.id, now });
    let deletedCount: number | null = null;
    try {
      deletedCount = await deleteRequestFiles(db, { requestId: req!.id, orgId: req!.orgId }, { now, deleteStoredFiles, actorId: user.id, reason: "client_request" });
    } catch {
      // Storage did not answer: the request is recorded and the daily job deletes them.
    }
    revalidatePath(`/portal/requests/${req!.id}`);
    return { ok: true, data: { deletedCount } };
  } catch (e) {
    return toActionError(e);
  }
}
