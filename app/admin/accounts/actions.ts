"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { createNote } from "@/db/queries/reconciliation-notes";
import { completeRefund, failRefund, getPaymentRow, getRefundByKey, insertPendingRefund, refundedOrPendingCents } from "@/db/queries/refunds";
import { issueDocumentInTx } from "@/lib/documents/issue";
import { notifyRefund } from "@/lib/email/notify";
import { AppError } from "@/lib/errors";
import { PAYMENT_STATE_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { createRefund } from "@/lib/payments/stripe";
import { defineAction } from "@/lib/server/define-action";
import { findingNoteSchema, refundSchema } from "@/lib/validation/admin-accounts";

const REFUNDABLE = new Set(["paid", "partially_refunded"]);

/**
 * Refund part or all of a payment through the processor. Never more than was paid less what is
 * already refunded or on its way; the form's idempotency key makes a double submit a refusal
 * (and the processor sees the same key, so it never refunds twice either).
 */
export const refundPayment = defineAction({ access: "accounts:refund", input: refundSchema }, async (input, { user, db }) => {
  if (input.confirmAmountCents !== input.amountCents) throw new AppError("invalid_input:confirmation", "Confirm the refund's amount first. Nothing was refunded.");
  if (await getRefundByKey(db, input.idempotencyKey)) throw new AppError("conflict:duplicate", "This refund was already submitted; it was not sent again.");
  const payment = await getPaymentRow(db, input.paymentId);
  if (!payment) throw new AppError("not_found:payment", "That payment was not found.");
  if (!REFUNDABLE.has(payment.status) || !payment.paymentIntentId) throw new AppError("conflict:payment", `A payment that is ${PAYMENT_STATE_LABEL[payment.status].toLowerCase()} can not be refunded.`);

  const refundId = await db.transaction(async (tx) => {
    const taken = await refundedOrPendingCents(tx, payment.id);
    const left = payment.amountCents - taken;
    if (input.amountCents > left) {
      throw new AppError("invalid_input:amount", `At most ${formatCents(left, payment.currency)} can be refunded (paid ${formatCents(payment.amountCents, payment.currency)}, already refunded or pending ${formatCents(taken, payment.currency)}).`, {
        amountCents: [`At most ${formatCents(left, payment.currency)}.`],
      });
    }
    let id: string;
    try {
      id = await insertPendingRefund(tx, { paymentId: payment.id, amountCents: input.amountCents, reason: input.reason, idempotencyKey: input.idempotencyKey, createdById: user.id });
    } catch (e) {
      if (String((e as Error).message).includes("UNIQUE")) throw new AppError("conflict:duplicate", "This refund was already submitted; it was not sent again.");
      throw e;
    }
    await writeAudit(tx, { actorId: user.id, action: "refund.request", entityType: "payment", entityId: payment.id, orgId: payment.orgId, after: { refundId: id, amountCents: input.amountCents, reason: input.reason } });
    return id;
  });

  let processorRefund: Awaited<ReturnType<typeof createRefund>>;
  try {
    processorRefund = await createRefund({
      paymentIntentId: payment.paymentIntentId,
      amountCents: input.amountCents,
      reason: "requested_by_customer",
      metadata: { refundId, paymentId: payment.id, orderId: payment.orderId },
      idempotencyKey: `refund/${input.idempotencyKey}`,
    });
  } catch (e) {
    await db.transaction(async (tx) => {
      await failRefund(tx, refundId);
      await writeAudit(tx, { actorId: user.id, action: "refund.failed", entityType: "payment", entityId: payment.id, orgId: payment.orgId, after: { refundId, message: (e as Error).message } });
    });
    throw new AppError("payment_failed:refund", `The processor refused the refund: ${(e as Error).message}`);
  }

  const after = await db.transaction(async (tx) => {
    const p = await completeRefund(tx, refundId, payment.id, processorRefund.id, input.amountCents);
    await issueDocumentInTx(tx, { kind: "credit_note", sourceId: refundId, actorId: user.id });
    await writeAudit(tx, {
      actorId: user.id,
      action: "refund.made",
      entityType: "payment",
      entityId: payment.id,
      orgId: payment.orgId,
      before: { refundedCents: payment.refundedCents, status: payment.status },
      after: { refundId, processorReference: processorRefund.id, refundedCents: p.refundedCents, status: p.status },
    });
    return p;
  });
  // The client hears of it; a failed e-mail does not undo the refund (the outbox shows it).
  await notifyRefund(refundId).catch((e: unknown) => console.error("refund e-mail failed", e));
  revalidatePath("/admin/accounts");
  revalidatePath(`/admin/accounts/payments/${payment.id}`);
  return { refundId, status: after.status };
});

/**
 * A note on a reconciliation finding (what accounts found, what they did), optionally marking it
 * resolved. The finding stays in the list, shown as resolved with its notes.
 */
export const noteFinding = defineAction({ access: "accounts:ledger", input: findingNoteSchema }, async (input, { user, db }) => {
  const id = await db.transaction(async (tx) => {
    const noteId = await createNote(tx, { findingKey: input.findingKey, note: input.note, isResolved: input.resolve, authorId: user.id });
    await writeAudit(tx, { actorId: user.id, action: input.resolve ? "reconciliation.resolve" : "reconciliation.note", entityType: "finding", entityId: input.findingKey, orgId: null, after: { note: input.note } });
    return noteId;
  });
  revalidatePath("/admin/accounts/reconciliation");
  return { id };
});
