"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { getCurrentRateCard } from "@/db/queries/catalogue";
import { createDraftQuote, getQuote, hasOrder, markIssued, updateDraftQuote } from "@/db/queries/quotes";
import { createStaffMessage } from "@/db/queries/messages";
import { getRequestForSales } from "@/db/queries/sales-requests";
import { transitionStage } from "@/lib/orders/transition";
import { label } from "@/lib/orders/stages";
import { retryAnalysis } from "@/lib/analysis/run";
import { currentRequestId } from "@/lib/observability/request-id";
import { getCurrentTerms } from "@/db/queries/issued-documents";
import { issueDocumentInTx } from "@/lib/documents/issue";
import { notifyQuoteReady, notifyStaffMessage } from "@/lib/email/notify";
import { AppError } from "@/lib/errors";
import { checkLines, quoteTotals, validUntil } from "@/lib/quoting/lines";
import { defineAction } from "@/lib/server/define-action";
import { saveQuoteSchema, staffMessageSchema } from "@/lib/validation/admin-quotes";
import { fieldErrorsByRow } from "@/lib/validation/form";
import { z } from "zod";

const QUOTABLE = new Set(["submitted", "quoted"]);

/**
 * Save a quote draft (a new version, or the draft being edited) and, with `issue`, issue it:
 * the earlier versions become superseded, the request moves to quoted and the client is e-mailed.
 * Issuing is refused when a part's analysis is newer than the lines (a new file revision).
 */
/** A bad line is named ("Line 2: …") and its errors kept under "lines.1", so the editor marks that row. */
function lineRefusal(error: z.ZodError): AppError {
  const first = error.issues[0];
  const where = first && first.path[0] === "lines" && typeof first.path[1] === "number" ? `Line ${first.path[1] + 1}: ` : "";
  return new AppError("invalid_input", `${where}${first?.message ?? "Check the highlighted fields."}`, fieldErrorsByRow(error));
}

export const saveQuote = defineAction({ access: "quote:manage", input: saveQuoteSchema, invalid: lineRefusal }, async (input, { user, db }) => {
    const sales = await getRequestForSales(db, input.requestId);
    if (!sales) throw new AppError("not_found:request", "That request was not found.");
    if (!QUOTABLE.has(sales.request.stage)) throw new AppError("conflict:stage", `The request is at ${label(sales.request.stage)}; it can not be quoted now.`);
    if (await hasOrder(db, input.requestId)) throw new AppError("conflict:order", "This request already has an order; it can not be re-quoted.");

    const problems = checkLines(input.lines);
    if (problems.length) {
      const fieldErrors: Record<string, string[]> = {};
      for (const p of problems) (fieldErrors[p.index < 0 ? "lines" : `lines.${p.index}`] ??= []).push(p.message);
      const first = problems[0]!;
      throw new AppError("invalid_input", first.index < 0 ? first.message : `Line ${first.index + 1}: ${first.message}`, fieldErrors);
    }
    const totals = quoteTotals(input.lines, { marginBp: input.marginBp, taxBp: input.taxBp, depositBp: input.depositBp });

    const draft = input.quoteId ? await getQuote(db, input.quoteId) : null;
    if (input.quoteId && (!draft || draft.requestId !== input.requestId)) throw new AppError("not_found:quote", "That quote was not found.");
    if (draft && draft.status !== "draft") throw new AppError("conflict:quote", `Version ${draft.version} is already ${draft.status}; start a new version.`);

    if (input.issue) {
      if (draft?.isStale) throw new AppError("conflict:stale", "A part has a new file revision since this draft was made; start a new version from the fresh analysis.");
      for (const part of sales.parts) {
        const a = part.analysis;
        if (!a || a.status !== "done") throw new AppError("conflict:analysis", `The analysis of “${part.name}” is not finished; a quote can not be issued on it yet.`);
        const newer = !input.basisAnalysisIds.includes(a.id) || (draft !== null && a.createdAt > draft.createdAt);
        if (newer) throw new AppError("conflict:stale", `“${part.name}” has a newer analysis than this quote's lines; reload the editor to quote the current revision.`);
      }
    }

    const rateCard = await getCurrentRateCard(db);
    const now = new Date();
    const write = {
      lines: input.lines,
      totals: { subtotalCents: totals.subtotalCents, marginCents: totals.marginCents, taxCents: totals.taxCents, totalCents: totals.totalCents, depositCents: totals.depositCents },
      marginBp: input.marginBp,
      taxBp: input.taxBp,
      depositBp: input.depositBp,
      validityDays: input.validityDays,
      terms: input.terms,
      notes: input.notes,
      shipDate: input.shipDate ? new Date(`${input.shipDate}T00:00:00Z`) : null,
      leadTime: input.leadTime,
      rateCardId: draft?.rateCardId ?? rateCard?.id ?? null,
    };

    const result = await db.transaction(async (tx) => {
      const q = draft ? { id: draft.id, version: draft.version } : await createDraftQuote(tx, input.requestId, user.id, write);
      if (draft) await updateDraftQuote(tx, draft.id, write);
      await writeAudit(tx, {
        actorId: user.id,
        action: draft ? "quote.update" : "quote.create",
        entityType: "quote",
        entityId: q.id,
        orgId: sales.request.orgId,
        after: { version: q.version, ...write.totals, lines: input.lines.length, edited: input.lines.filter((l) => l.editReason).map((l) => ({ description: l.description, reason: l.editReason })) },
      });
      if (!input.issue) return { quoteId: q.id, version: q.version, status: "draft" as const };
      const terms = await getCurrentTerms(tx);
      const ok = await markIssued(tx, q.id, input.requestId, user.id, now, validUntil(now, input.validityDays), terms?.version ?? null);
      if (!ok) throw new AppError("conflict:quote", "This version was issued meanwhile; reload.");
      // The quotation PDF is numbered and frozen with the issue itself.
      await issueDocumentInTx(tx, { kind: "quote", sourceId: q.id, actorId: user.id, now });
      await transitionStage(tx, { requestId: input.requestId, to: "quoted", actorId: user.id, note: `Quote version ${q.version} issued` });
      await writeAudit(tx, { actorId: user.id, action: "quote.issue", entityType: "quote", entityId: q.id, orgId: sales.request.orgId, after: { version: q.version, totalCents: totals.totalCents, validityDays: input.validityDays } });
      return { quoteId: q.id, version: q.version, status: "issued" as const };
    });

    if (result.status === "issued") {
      // The quote stands even if the e-mail fails; the outbox shows what went out.
      await notifyQuoteReady(result.quoteId).catch((e: unknown) => console.error("quote-ready e-mail failed", e));
    }
    revalidatePath(`/admin/sales/requests/${input.requestId}`);
    revalidatePath("/admin/sales");
    return result;
});

/** A staff message to the client on a request. */
export const postStaffMessage = defineAction({ access: "quote:manage", input: staffMessageSchema, invalid: "Write a message." }, async (input, { user, db }) => {
    const sales = await getRequestForSales(db, input.requestId);
    if (!sales) throw new AppError("not_found:request", "That request was not found.");
    const m = await db.transaction(async (tx) => {
      const row = await createStaffMessage(tx, { requestId: input.requestId, orgId: sales.request.orgId, authorId: user.id, body: input.body });
      await writeAudit(tx, { actorId: user.id, action: "message.post", entityType: "request", entityId: input.requestId, orgId: sales.request.orgId, after: { messageId: row.id, length: input.body.length } });
      return row;
    });
    // The clients on the thread hear of it by e-mail; a failed send does not undo the message.
    await notifyStaffMessage(m.id).catch((e: unknown) => console.error("staff message e-mail failed", e));
    revalidatePath(`/admin/sales/requests/${input.requestId}`);
    return { id: m.id };
});

/** Run a failed analysis again (staff's retry of a durable job whose attempts ran out); audited. */
export const retryFailedAnalysis = defineAction({ access: "sales:inbox", input: z.object({ analysisId: z.string().min(1).max(64) }) }, async (input, { user, db }) => {
  const { retried } = await retryAnalysis(db, input.analysisId, { requestId: await currentRequestId() });
  if (!retried) throw new AppError("conflict:analysis", "That analysis has not failed (it may be running again already).");
  await writeAudit(db, { actorId: user.id, action: "analysis.retry", entityType: "analysis", entityId: input.analysisId });
  revalidatePath("/admin/sales");
  return { analysisId: input.analysisId };
});
