import { and, desc, eq, inArray, isNull } from "drizzle-orm";
import type { Db } from "../client";
import { orders, organisations, payments, requests, transferFunds } from "../schema";
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
