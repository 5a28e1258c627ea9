/* No server-only marker: the seed issues credit notes under plain Node (lib/documents/build.ts reads refunds here). */
import { and, eq, inArray, sql } from "drizzle-orm";
import type { Db } from "../client";
import { payments, refunds } from "../schema";
import type { Tx } from "./audit";

export async function getRefundByKey(db: Db | Tx, idempotencyKey: string) {
  const [r] = await db.select().from(refunds).where(eq(refunds.idempotencyKey, idempotencyKey));
  return r ?? null;
}

/** Money already refunded or on its way back for a payment (pending + succeeded refunds), cents. */
export async function refundedOrPendingCents(db: Db | Tx, paymentId: string): Promise<number> {
  const [row] = await db
    .select({ sum: sql<number>`coalesce(sum(${refunds.amountCents}), 0)` })
    .from(refunds)
    .where(and(eq(refunds.paymentId, paymentId), inArray(refunds.status, ["pending", "succeeded"])));
  return Number(row?.sum ?? 0);
}

export async function insertPendingRefund(tx: Tx, input: { paymentId: string; amountCents: number; reason: string; idempotencyKey: string; createdById: string }) {
  const [r] = await tx.insert(refunds).values({ ...input, status: "pending" }).returning({ id: refunds.id });
  return r!.id;
}

/** The processor confirmed: mark the refund and add it to the payment's refunded amount. */
export async function completeRefund(tx: Tx, refundId: string, paymentId: string, stripeRefundId: string, amountCents: number) {
  await tx.update(refunds).set({ status: "succeeded", stripeRefundId }).where(eq(refunds.id, refundId));
  const [p] = await tx
    .update(payments)
    .set({ refundedCents: sql`${payments.refundedCents} + ${amountCents}` })
    .where(eq(payments.id, paymentId))
    .returning({ amountCents: payments.amountCents, refundedCents: payments.refundedCents });
  const status: "refunded" | "partially_refunded" = p!.refundedCents >= p!.amountCents ? "refunded" : "partially_refunded";
  await tx.update(payments).set({ status }).where(eq(payments.id, paymentId));
  return { ...p!, status };
}

export async function failRefund(db: Db | Tx, refundId: string) {
  await db.update(refunds).set({ status: "failed" }).where(eq(refunds.id, refundId));
}

export async function getPaymentRow(db: Db | Tx, paymentId: string) {
  const [p] = await db.select().from(payments).where(eq(payments.id, paymentId));
  return p ?? null;
}

/** A refund with the payment it returns money from. */
export async function getRefundWithPayment(db: Db | Tx, refundId: string) {
  const [row] = await db.select({ refund: refunds, payment: payments }).from(refunds).innerJoin(payments, eq(payments.id, refunds.paymentId)).where(eq(refunds.id, refundId));
  return row ?? null;
}
