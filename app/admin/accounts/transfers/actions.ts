"use server";

import { eq } from "drizzle-orm";
import { revalidatePath } from "next/cache";
import { payments } from "@/db/schema";
import { writeAudit } from "@/db/queries/audit";
import { getPayment } from "@/db/queries/payments";
import { getPaymentByTransferReference, getTransferFunds, resolveTransferFunds } from "@/db/queries/transfers";
import { AppError } from "@/lib/errors";
import { formatCents } from "@/lib/money";
import { applyToPayment } from "@/lib/payments/transfers";
import { defineAction } from "@/lib/server/define-action";
import { manualPaymentSchema, resolveTransferSchema } from "@/lib/validation/account-terms";
import { notifyDepositReceived } from "@/lib/email/notify";

/**
 * Money that arrived outside the payment service (a cheque, a transfer to another account):
 * accounts records it on the payment it is for, with the bank's or cheque's reference. Never more
 * than is still owed; the amount is confirmed first. Whole, the payment is paid with a receipt.
 */
export const recordManualPayment = defineAction({ access: "accounts:refund", input: manualPaymentSchema }, async (input, { user, db }) => {
  if (input.confirmAmountCents !== input.amountCents) throw new AppError("invalid_input:confirmation", "Confirm the amount first. Nothing was recorded.");
  const payment = await getPayment(db, input.paymentId);
  if (!payment) throw new AppError("not_found:payment", "That payment was not found.");
  const now = new Date();
  const paid = await db.transaction(async (tx) => {
    const fresh = (await getPayment(tx, payment.id))!;
    if (fresh.status !== "pending") throw new AppError("conflict:payment", "This payment is not waiting for money any more.");
    const owed = fresh.amountCents - fresh.receivedCents;
    if (input.amountCents > owed) {
      throw new AppError("invalid_input:amount", `At most ${formatCents(owed, fresh.currency)} is still owed on this payment; record the rest against another or return it. Nothing was recorded.`, { amountCents: [`At most ${formatCents(owed, fresh.currency)}.`] });
    }
    const note = [input.note, `received ${formatCents(input.amountCents, fresh.currency)}, reference ${input.reference}`].filter(Boolean).join("; ");
    await writeAudit(tx, { actorId: user.id, action: "payment.manual", entityType: "payment", entityId: fresh.id, orgId: fresh.orgId, after: { amountCents: input.amountCents, reference: input.reference, note: input.note || null } });
    // The payment is now accounts' record; its reference is the one the money came with.
    await tx.update(payments).set({ method: fresh.method === "card" ? "manual" : fresh.method, externalReference: input.reference, note }).where(eq(payments.id, fresh.id));
    return applyToPayment(tx, { ...fresh, externalReference: input.reference }, input.amountCents, now, user.id);
  });
  if (paid) await notifyDepositReceived(payment.id).catch((e: unknown) => console.error("payment e-mail failed", e));
  revalidatePath("/admin/accounts/transfers");
  return { isPaid: paid };
});

/**
 * Settle a bank transfer that did not apply cleanly. An unknown reference can be applied to the
 * payment whose reference accounts found (up to what it still owes); short, over and late
 * arrivals are settled with a note of what was done (asked for the rest, returned the excess…).
 */
export const resolveTransfer = defineAction({ access: "accounts:refund", input: resolveTransferSchema }, async (input, { user, db }) => {
  const funds = await getTransferFunds(db, input.fundsId);
  if (!funds) throw new AppError("not_found:transfer", "That transfer was not found.");
  if (funds.resolvedAt) throw new AppError("conflict:resolved", "This transfer is already settled.");
  const now = new Date();
  let paidId: string | null = null;
  await db.transaction(async (tx) => {
    if (input.applyToReference) {
      if (funds.status !== "unmatched") throw new AppError("invalid_input", "Only a transfer with an unknown reference is applied by hand.", { applyToReference: ["This transfer already went to a payment."] });
      const payment = await getPaymentByTransferReference(tx, input.applyToReference);
      if (!payment || payment.status !== "pending") {
        throw new AppError("not_found:reference", `No open bank transfer has the reference ${input.applyToReference}. Nothing was applied.`, { applyToReference: ["No open payment has this reference."] });
      }
      const applied = Math.min(funds.amountCents, payment.amountCents - payment.receivedCents);
      if (!(await resolveTransferFunds(tx, { id: funds.id, note: input.note, byId: user.id, now, paymentId: payment.id, appliedCents: applied }))) throw new AppError("conflict:resolved", "This transfer is already settled.");
      if (await applyToPayment(tx, payment, applied, now, user.id)) paidId = payment.id;
    } else if (!(await resolveTransferFunds(tx, { id: funds.id, note: input.note, byId: user.id, now }))) {
      throw new AppError("conflict:resolved", "This transfer is already settled.");
    }
    await writeAudit(tx, { actorId: user.id, action: "transfer.resolved", entityType: "transfer_funds", entityId: funds.id, orgId: funds.orgId, after: { note: input.note, appliedTo: input.applyToReference ?? null } });
  });
  if (paidId) await notifyDepositReceived(paidId).catch((e: unknown) => console.error("payment e-mail failed", e));
  revalidatePath("/admin/accounts/transfers");
  return { resolved: true };
});
