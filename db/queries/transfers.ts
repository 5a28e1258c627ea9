import { and, desc, eq, inArray, isNull } from "drizzle-orm";
import type { Db } from "../client";
import { orders, organisations, payments, requests, transferFunds, type TransferDetails } from "../schema";
import type { Tx } from "./audit";

type Q = Db | Tx;

/** Bank transfers that arrived, newest first, with the firm and the order they were for. */
export async function listTransferFunds(q: Q, limit = 200) {
  return q
    .select({
      funds: transferFunds,
      firm: organisations.name,
      reference: requests.reference,
      requestId: requests.id,
      paymentKind: payments.kind,
      paymentAmountCents: payments.amountCents,
      paymentReceivedCents: payments.receivedCents,
      paymentStatus: payments.status,
    })
    .from(transferFunds)
    .leftJoin(organisations, eq(organisations.id, transferFunds.orgId))
    .leftJoin(payments, eq(payments.id, transferFunds.paymentId))
    .leftJoin(orders, eq(orders.id, payments.orderId))
    .leftJoin(requests, eq(requests.id, orders.requestId))
    .orderBy(desc(transferFunds.receivedAt))
    .limit(limit);
}

export async function getTransferFunds(q: Q, id: string) {
  const [row] = await q.select().from(transferFunds).where(eq(transferFunds.id, id));
  return row ?? null;
}

/** Settle an arrival (once): what accounts did, and what it applied by hand. False when settled already. */
export async function resolveTransferFunds(tx: Tx, input: { id: string; note: string; byId: string; now: Date; paymentId?: string; appliedCents?: number }) {
  const rows = await tx
    .update(transferFunds)
    .set({ resolution: input.note, resolvedById: input.byId, resolvedAt: input.now, ...(input.paymentId ? { paymentId: input.paymentId, appliedCents: input.appliedCents ?? 0 } : {}) })
    .where(and(eq(transferFunds.id, input.id), isNull(transferFunds.resolvedAt)))
    .returning({ id: transferFunds.id });
  return rows.length === 1;
}

/** Payments still waiting for money (any method), with what has come in, for accounts. */
export async function listOpenPayments(q: Q) {
  return q
    .select({
      id: payments.id,
      kind: payments.kind,
      method: payments.method,
      amountCents: payments.amountCents,
      receivedCents: payments.receivedCents,
      currency: payments.currency,
      transferReference: payments.transferReference,
      createdAt: payments.createdAt,
      firm: organisations.name,
      reference: requests.reference,
      poNumber: orders.poNumber,
      dueAt: orders.dueAt,
    })
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId))
    .where(and(eq(payments.status, "pending"), inArray(requests.stage, ["accepted", "deposit_paid", "scheduled", "printing", "cooling", "machining", "inspection", "finishing", "packed", "shipped", "delivered", "closed"])))
    .orderBy(desc(payments.createdAt));
}

export async function getPaymentByTransferReference(q: Q, reference: string) {
  const [row] = await q.select().from(payments).where(and(eq(payments.transferReference, reference), eq(payments.method, "bank_transfer")));
  return row ?? null;
}

/** The arrival already recorded for this processor transaction, if any (arrivals are applied once). */
export async function getArrivalByProcessorId(q: Q, processorId: string) {
  const [row] = await q.select({ id: transferFunds.id }).from(transferFunds).where(eq(transferFunds.processorId, processorId));
  return row ?? null;
}

/** The firm whose processor customer this is, if any. */
export async function getOrgByProcessorCustomer(q: Q, customerId: string) {
  const [row] = await q.select({ id: organisations.id }).from(organisations).where(eq(organisations.processorCustomerId, customerId));
  return row ?? null;
}

/** A bank-transfer payment by the reference the payer quoted, within the firm when it is known. */
export async function findTransferPayment(q: Q, reference: string, orgId: string | null) {
  const [row] = await q.select().from(payments).where(and(eq(payments.transferReference, reference), eq(payments.method, "bank_transfer"), orgId ? eq(payments.orgId, orgId) : undefined));
  return row ?? null;
}

/** Record money that arrived; its id. */
export async function insertArrival(tx: Tx, values: typeof transferFunds.$inferInsert): Promise<string> {
  const [row] = await tx.insert(transferFunds).values(values).returning({ id: transferFunds.id });
  return row!.id;
}

/** Part of a payment received, still short of the whole. */
export async function setReceivedCents(tx: Tx, paymentId: string, receivedCents: number) {
  await tx.update(payments).set({ receivedCents }).where(eq(payments.id, paymentId));
}

/** A pending payment received in full: paid, with its receipt number. False when it was no longer pending. */
export async function markReceivedPaid(tx: Tx, paymentId: string, fields: { receivedCents: number; paidAt: Date; receiptNumber: string }): Promise<boolean> {
  const rows = await tx
    .update(payments)
    .set({ ...fields, status: "paid", checkoutUrl: null })
    .where(and(eq(payments.id, paymentId), eq(payments.status, "pending")))
    .returning({ id: payments.id });
  return rows.length === 1;
}

/** A firm's name, billing e-mail and processor customer (for opening bank transfers). */
export async function getOrgForProcessor(q: Q, orgId: string) {
  const [row] = await q.select({ id: organisations.id, name: organisations.name, email: organisations.billingEmail, customer: organisations.processorCustomerId }).from(organisations).where(eq(organisations.id, orgId));
  return row ?? null;
}

/** Keep the firm's processor customer; the first write wins (two requests at once made the same customer). Returns the one kept. */
export async function keepProcessorCustomer(q: Q, orgId: string, customerId: string): Promise<string> {
  await q.update(organisations).set({ processorCustomerId: customerId }).where(and(eq(organisations.id, orgId), isNull(organisations.processorCustomerId)));
  const [after] = await q.select({ customer: organisations.processorCustomerId }).from(organisations).where(eq(organisations.id, orgId));
  return after!.customer!;
}

/** The newest pending bank-transfer payment of an order's deposit or balance, if any. */
export async function getOpenTransfer(q: Q, orderId: string, kind: "deposit" | "balance") {
  const [row] = await q
    .select()
    .from(payments)
    .where(and(eq(payments.orderId, orderId), eq(payments.kind, kind), eq(payments.status, "pending"), eq(payments.method, "bank_transfer")))
    .orderBy(desc(payments.createdAt))
    .limit(1);
  return row ?? null;
}

/**
 * The payment a new bank transfer is kept on: a pending payment never sent to a payment page (the
 * balance made at shipping) becomes the transfer, else a new pending one.
 */
export async function takePaymentForTransfer(tx: Tx, input: { orderId: string; orgId: string; kind: "deposit" | "balance"; amountCents: number; currency: string; createdById: string | null }) {
  const [blank] = await tx
    .select()
    .from(payments)
    .where(and(eq(payments.orderId, input.orderId), eq(payments.kind, input.kind), eq(payments.status, "pending"), isNull(payments.checkoutSessionId), eq(payments.receivedCents, 0)))
    .limit(1);
  if (blank) {
    const [p] = await tx.update(payments).set({ method: "bank_transfer" }).where(eq(payments.id, blank.id)).returning();
    return p!;
  }
  const [p] = await tx.insert(payments).values({ ...input, status: "pending", method: "bank_transfer" }).returning();
  return p!;
}

/** The processor's instructions kept on the payment. */
export async function setTransferInstructions(tx: Tx, paymentId: string, fields: { paymentIntentId: string; transferReference: string; transferDetails: TransferDetails }) {
  const [row] = await tx.update(payments).set(fields).where(eq(payments.id, paymentId)).returning();
  return row!;
}

