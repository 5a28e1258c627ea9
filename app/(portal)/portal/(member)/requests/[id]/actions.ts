"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { snapshotOf } from "@/db/queries/addresses";
import { acceptanceContext } from "@/lib/orders/acceptance";
import { acceptableQuote, onAccountTerms, pickShipTo, purchaseOrderFile } from "@/lib/orders/accept-quote";
import { acceptQuoteAndCreateOrder } from "@/db/queries/client-quotes";
import { createDocument } from "@/db/queries/documents";
import { getCurrentTerms } from "@/db/queries/issued-documents";
import { getUploadOwned } from "@/db/queries/files";
import { createMessage, getMessage } from "@/db/queries/messages";
import { getOrderWithRequest } from "@/db/queries/payments";
import { getRequest } from "@/db/queries/requests";
import { transitionStage } from "@/lib/orders/transition";
import { getFileRetention, recordDeletionRequest } from "@/db/queries/retention";
import { assertCanSee } from "@/lib/auth/guard";
import { FINISHED_STAGES } from "@/lib/retention/policy";
import { deleteRequestFiles } from "@/lib/retention/run";
import { deleteStoredFiles } from "@/lib/uploads/uploadthing";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { openCheckout, type CheckoutResult } from "@/lib/payments/checkout";
import { splitDeposit } from "@/lib/payments/deposit";
import { openBankTransfer } from "@/lib/payments/bank-transfer";
import { defineAction } from "@/lib/server/define-action";
import { z } from "zod";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { acceptQuoteSchema, messageSchema } from "@/lib/validation/request";

const payOrderSchema = z.object({ orderId: z.string().min(1).max(64), kind: z.enum(["deposit", "balance"], { error: "Unknown payment kind." }) });
const payByTransferSchema = payOrderSchema;
const deleteFilesSchema = z.object({ requestId: z.string().min(1).max(64), confirm: z.literal("delete") });

/**
 * Accept an issued quote with a PO number and the terms: the order is made and the deposit's
 * Checkout Session opened; the browser goes to its URL. Expired, superseded or stale quotes are refused.
 */
export const acceptQuote = defineAction({ access: "quote:accept", input: acceptQuoteSchema }, async (input, { user, db }): Promise<CheckoutResult & { orderId: string }> => {
  const now = new Date();
  const { quote, request } = await acceptableQuote(db, user, input.quoteId, now);
  // Where it ships decides the freight; a valid tax exemption takes the tax off.
  const ctx = await acceptanceContext(db, { quote, orgId: request.orgId, requestId: request.id, now });
  const option = pickShipTo(ctx, input.shipToId);
  const f = option.figures;
  const split = splitDeposit(quote.totalCents, quote.depositBp);
  const quotedDeposit = quote.depositCents > 0 ? quote.depositCents : split.depositCents;
  const totalCents = f.isChanged ? f.totalCents : quote.totalCents;
  const { payBy } = input;
  // On account: no deposit; the whole is invoiced on the firm's terms when the order ships.
  const onAccount = payBy === "account";
  const terms = onAccount ? await onAccountTerms(db, request.orgId, totalCents, quote.currency) : null;
  const poUpload = await purchaseOrderFile(db, user.id, input.poUploadId);
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
      poNumber: input.poNumber,
      termsVersion,
      totalCents,
      depositCents,
      balanceCents: totalCents - depositCents,
      currency: quote.currency,
      now,
      extra,
    });
    if (!o) throw new AppError("conflict:quote", "This quote changed meanwhile; reload the page.");
    await transitionStage(tx, { requestId: request.id, to: "accepted", actorId: user.id, note: `Quote v${quote.version} accepted, PO ${input.poNumber}, ships to ${option.address.label}`, expectedFrom: "quoted" });
    if (onAccount && terms) {
      await transitionStage(tx, { requestId: request.id, to: "deposit_paid", actorId: user.id, note: `On account (${PAYMENT_TERMS_LABEL[terms.paymentTerms]}), PO ${input.poNumber}: no deposit; invoiced when the order ships`, expectedFrom: "accepted" });
    }
    if (poUpload) {
      await createDocument(tx, { requestId: request.id, orgId: request.orgId, kind: "attachment", title: `Purchase order ${input.poNumber}`, fileKey: poUpload.fileKey, fileName: poUpload.fileName, sizeBytes: poUpload.sizeBytes, contentType: poUpload.contentType, uploadedById: user.id });
    }
    await writeAudit(tx, {
      actorId: user.id, action: "quote.accept", entityType: "quote", entityId: quote.id, orgId: request.orgId,
      after: { poNumber: input.poNumber, payBy, paymentTerms: extra.paymentTerms, poFile: poUpload?.fileName ?? null, totalCents, quotedTotalCents: quote.totalCents, freightCents: f.freightCents, shipTo: option.address.label, freightZone: option.zone?.key ?? null, taxExempt: Boolean(ctx.exemption), termsVersion },
    });
    return o;
  });
  if (onAccount) {
    revalidatePath(`/portal/requests/${request.id}`);
    return { url: null, isComplete: false, orderId: order.id };
  }
  if (payBy === "bank_transfer") {
    // The acceptance stands either way; the order page shows the details, or offers to open them again.
    await openBankTransfer(db, { orderId: order.id, kind: "deposit", userId: user.id }).catch((e: unknown) => console.error("bank transfer after acceptance failed", e));
    revalidatePath(`/portal/requests/${request.id}`);
    return { url: null, isComplete: false, orderId: order.id };
  }
  const checkout = await openCheckout(db, { orderId: order.id, kind: "deposit", userId: user.id, email: user.email, appUrl: env().APP_URL }).catch((e: unknown) => {
    // The acceptance stands; the deposit can be paid from the order page.
    console.error("checkout after acceptance failed", e);
    return { url: null, isComplete: false };
  });
  revalidatePath(`/portal/requests/${request.id}`);
  return { ...checkout, orderId: order.id };
});

/** Open (or reopen) the Checkout Session for an order's deposit or balance. */
export const payOrder = defineAction({ access: "payment:pay", input: payOrderSchema, invalid: "The request was not valid." }, async (input, { user, db }): Promise<CheckoutResult> => {
  const row = await getOrderWithRequest(db, input.orderId);
  assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "order");
  return openCheckout(db, { orderId: row!.order.id, kind: input.kind, userId: user.id, email: user.email, appUrl: env().APP_URL });
});

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
export const postMessage = defineAction(
  { access: "message:post", input: messageSchema, invalid: (error) => new AppError("invalid_input", error.issues[0]?.message ?? "Check the message.", { body: error.issues.map((i) => i.message) }) },
  async (input, { user, db }): Promise<{ id: string }> => {
    const req = await getRequest(db, input.requestId);
    assertCanSee(user, req ? { orgId: req.orgId, createdById: req.createdById } : null, "request");
    if (input.parentId) {
      const parent = await getMessage(db, input.parentId);
      if (!parent || parent.requestId !== req!.id) throw new AppError("not_found:message", "The message you replied to was not found.");
    }
    const msg = await createMessage(db, { requestId: req!.id, orgId: req!.orgId, authorId: user.id, parentId: input.parentId ?? null, isFromStaff: false, body: input.body });
    for (const uploadId of input.uploadIds) {
      const up = await getUploadOwned(db, uploadId, user.id);
      if (!up) continue;
      await createDocument(db, { requestId: req!.id, orgId: req!.orgId, messageId: msg.id, kind: "attachment", title: up.fileName, fileKey: up.fileKey, fileName: up.fileName, sizeBytes: up.sizeBytes, contentType: up.contentType, uploadedById: user.id });
    }
    revalidatePath(`/portal/requests/${req!.id}`);
    return msg;
  },
);

/**
 * A client admin has a closed or cancelled order's model files deleted now, before the bureau's
 * retention period ends. Recorded first (so the daily job finishes it if storage fails now),
 * audited; the order's records and documents stay.
 */
export const deleteOrderFilesNow = defineAction(
  {
    access: "files:delete_early",
    input: deleteFilesSchema,
    invalid: (error) => new AppError(error.issues.some((i) => i.path[0] === "confirm") ? "invalid_input:confirmation" : "invalid_input", error.issues.some((i) => i.path[0] === "confirm") ? "Confirm that the files should be deleted." : "The request was not valid."),
  },
  async (input, { user, db }): Promise<{ deletedCount: number | null }> => {
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
    return { deletedCount };
  },
);
