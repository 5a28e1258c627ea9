import { and, asc, desc, eq, inArray, isNotNull, isNull, like, ne, or, sql } from "drizzle-orm";
import type { Db } from "../client";
import { orders, payments, requests, webhookEvents, type PaymentStatus } from "../schema";
import { RECEIPT_SERIES, nextReceiptNumber, receiptYear } from "@/db/receipt-number";
import type { Tx } from "./audit";

export type PaymentKind = "deposit" | "balance";

export async function getOrder(db: Db | Tx, orderId: string) {
  const [row] = await db.select().from(orders).where(eq(orders.id, orderId));
  return row ?? null;
}

export async function getOrderByRequest(db: Db | Tx, requestId: string) {
  const [row] = await db.select().from(orders).where(eq(orders.requestId, requestId));
  return row ?? null;
}

/** An order with its request's scope fields, for the policy and the e-mails. */
export async function getOrderWithRequest(db: Db | Tx, orderId: string) {
  const [row] = await db
    .select({ order: orders, request: requests })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(eq(orders.id, orderId));
  return row ?? null;
}

const paymentColumns = {
  id: payments.id,
  orderId: payments.orderId,
  orgId: payments.orgId,
  kind: payments.kind,
  status: payments.status,
  amountCents: payments.amountCents,
  refundedCents: payments.refundedCents,
  currency: payments.currency,
  checkoutSessionId: payments.checkoutSessionId,
  checkoutUrl: payments.checkoutUrl,
  receiptUrl: payments.receiptUrl,
  receiptNumber: payments.receiptNumber,
  method: payments.method,
  transferReference: payments.transferReference,
  transferDetails: payments.transferDetails,
  receivedCents: payments.receivedCents,
  externalReference: payments.externalReference,
  createdAt: payments.createdAt,
  paidAt: payments.paidAt,
};

export async function getPayment(db: Db | Tx, paymentId: string) {
  const [row] = await db.select().from(payments).where(eq(payments.id, paymentId));
  return row ?? null;
}

export async function getPaymentBySession(db: Db | Tx, sessionId: string) {
  const [row] = await db.select().from(payments).where(eq(payments.checkoutSessionId, sessionId));
  return row ?? null;
}

/** Payments of one order, newest first (the client sees these with their receipts). */
export async function listPaymentsForOrder(db: Db | Tx, orderId: string) {
  return db.select(paymentColumns).from(payments).where(eq(payments.orderId, orderId)).orderBy(desc(payments.createdAt));
}

/** Every payment of a firm (client_admin), or of one member's requests (client). */
export async function listPaymentsForOrg(db: Db, orgId: string, createdById?: string) {
  return db
    .select({ ...paymentColumns, reference: requests.reference, projectName: requests.projectName, requestId: requests.id })
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(createdById ? and(eq(payments.orgId, orgId), eq(requests.createdById, createdById)) : eq(payments.orgId, orgId))
    .orderBy(desc(payments.createdAt));
}

/**
 * The payment the client pays next for (order, kind): the open (pending) one if any, else a new
 * pending row. Run inside a write transaction so two clicks at once find the same row.
 */
export async function getOrCreatePendingPayment(
  tx: Db | Tx,
  input: { orderId: string; orgId: string; kind: PaymentKind; amountCents: number; currency: string; createdById: string },
) {
  const [open] = await tx
    .select()
    .from(payments)
    // A bank transfer waiting for its money stays itself: the card gets its own payment.
    .where(and(eq(payments.orderId, input.orderId), eq(payments.kind, input.kind), eq(payments.status, "pending"), eq(payments.method, "card")))
    .orderBy(desc(payments.createdAt))
    .limit(1);
  if (open) return { payment: open, created: false };
  const [row] = await tx
    .insert(payments)
    .values({ ...input, status: "pending" })
    .returning();
  return { payment: row!, created: true };
}

/** Is this (order, kind) already paid? */
export async function hasPaid(db: Db | Tx, orderId: string, kind: PaymentKind) {
  const rows = await db
    .select({ id: payments.id })
    .from(payments)
    .where(and(eq(payments.orderId, orderId), eq(payments.kind, kind), inArray(payments.status, ["paid", "partially_refunded", "refunded"])))
    .limit(1);
  return rows.length > 0;
}

/** Remember the Checkout Session of a pending payment; only if none was set yet. */
export async function setPaymentSession(db: Db | Tx, paymentId: string, sessionId: string, url: string | null) {
  await db
    .update(payments)
    .set({ checkoutSessionId: sessionId, checkoutUrl: url })
    .where(and(eq(payments.id, paymentId), or(isNull(payments.checkoutSessionId), eq(payments.checkoutSessionId, sessionId))));
}

/**
 * Mark a payment paid. Guarded in the WHERE: a payment already paid (or refunded) is left alone,
 * so a replayed event changes nothing. Returns whether this call made the change.
 */
export async function markPaymentPaid(
  tx: Db | Tx,
  paymentId: string,
  fields: { checkoutSessionId: string; paymentIntentId: string | null; chargeId?: string | null; receiptUrl?: string | null; paidAt: Date },
) {
  const done: PaymentStatus[] = ["paid", "refunded", "partially_refunded"];
  // Numbered in this transaction: the unique index refuses a number given twice, and a payment
  // already paid (the guard below) keeps the one it has.
  const receiptNumber = await allocateReceiptNumber(tx, fields.paidAt);
  const rows = await tx
    .update(payments)
    .set({ status: "paid", checkoutUrl: null, ...fields, receiptNumber })
    .where(and(eq(payments.id, paymentId), ...done.map((s) => ne(payments.status, s))))
    .returning({ id: payments.id });
  return rows.length === 1;
}

/** The next receipt number of the year `paidAt` falls in; call it inside the writing transaction. */
export async function allocateReceiptNumber(tx: Db | Tx, paidAt: Date): Promise<string> {
  const year = receiptYear(paidAt);
  const [last] = await tx
    .select({ n: payments.receiptNumber })
    .from(payments)
    .where(like(payments.receiptNumber, `${RECEIPT_SERIES}-${year}-%`))
    .orderBy(desc(sql`length(${payments.receiptNumber})`), desc(payments.receiptNumber))
    .limit(1);
  return nextReceiptNumber(year, last?.n ?? null);
}

/** Give a receipt number to every received payment that has none, in the order they were paid. */
export async function numberUnnumberedReceipts(tx: Db | Tx): Promise<number> {
  const done: PaymentStatus[] = ["paid", "refunded", "partially_refunded"];
  const rows = await tx
    .select({ id: payments.id, paidAt: payments.paidAt })
    .from(payments)
    .where(and(isNull(payments.receiptNumber), isNotNull(payments.paidAt), inArray(payments.status, done)))
    .orderBy(asc(payments.paidAt), asc(payments.id));
  for (const r of rows) {
    await tx.update(payments).set({ receiptNumber: await allocateReceiptNumber(tx, r.paidAt!) }).where(eq(payments.id, r.id));
  }
  return rows.length;
}

/** A session that expired (or was abandoned): the payment is closed; the next "pay" opens a new one. */
export async function markPaymentExpired(tx: Db | Tx, paymentId: string) {
  const rows = await tx
    .update(payments)
    .set({ status: "expired", checkoutUrl: null })
    .where(and(eq(payments.id, paymentId), eq(payments.status, "pending")))
    .returning({ id: payments.id });
  return rows.length === 1;
}

/** Record a processed webhook event id; false when it was already recorded (a replay). */
export async function recordWebhookEvent(tx: Db | Tx, event: { id: string; type: string; outcome: string }) {
  const rows = await tx.insert(webhookEvents).values(event).onConflictDoNothing().returning({ id: webhookEvents.id });
  return rows.length === 1;
}

export async function isWebhookEventRecorded(db: Db | Tx, eventId: string) {
  const [row] = await db.select({ id: webhookEvents.id }).from(webhookEvents).where(eq(webhookEvents.id, eventId));
  return Boolean(row);
}

/** A paid payment's other pending checkouts of the same kind are moot: expired, their links dropped. */
export async function expireOtherPendingPayments(tx: Db | Tx, payment: { id: string; orderId: string; kind: PaymentKind }) {
  await tx
    .update(payments)
    .set({ status: "expired", checkoutUrl: null })
    .where(and(eq(payments.orderId, payment.orderId), eq(payments.kind, payment.kind), eq(payments.status, "pending"), ne(payments.id, payment.id)));
}

/** The payment intent of a payment whose processing fee is not recorded yet (null otherwise). */
export async function getIntentWithoutFee(db: Db | Tx, paymentId: string): Promise<string | null> {
  const [p] = await db.select({ intent: payments.paymentIntentId, fee: payments.feeCents }).from(payments).where(eq(payments.id, paymentId));
  return p?.intent && p.fee === null ? p.intent : null;
}

/** Record the processor's charge and fee where the fee is still unrecorded (safe to repeat). */
export async function setProcessorFee(db: Db | Tx, paymentId: string, fee: { chargeId: string; feeCents: number }) {
  await db.update(payments).set({ chargeId: fee.chargeId, feeCents: fee.feeCents }).where(and(eq(payments.id, paymentId), isNull(payments.feeCents)));
}

/** An order's deposit payments that money came in for (paid, or refunded since). */
export async function listReceivedDeposits(db: Db | Tx, orderId: string) {
  return db.select().from(payments).where(and(eq(payments.orderId, orderId), eq(payments.kind, "deposit"), inArray(payments.status, ["paid", "partially_refunded", "refunded"])));
}

/** The newest bank transfer opened for an order's balance (its reference and account details), if any. */
export async function getLatestBalanceTransfer(db: Db | Tx, orderId: string) {
  const [row] = await db
    .select()
    .from(payments)
    .where(and(eq(payments.orderId, orderId), eq(payments.kind, "balance"), eq(payments.method, "bank_transfer"), isNotNull(payments.transferReference)))
    .orderBy(desc(payments.createdAt))
    .limit(1);
  return row ?? null;
}

