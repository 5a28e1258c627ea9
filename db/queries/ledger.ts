import "server-only";
import { and, asc, desc, eq, gte, inArray, lte, or, sql } from "drizzle-orm";
import { containsText } from "./search";
import type { Db } from "../client";
import { orders, organisations, payments, refunds, requests, type PaymentStatus } from "../schema";
import type { Tx } from "./audit";

export const LEDGER_SORTS = ["createdAt", "paidAt", "amountCents", "reference", "status"] as const;

export interface LedgerQuery {
  from?: Date;
  to?: Date;
  status?: PaymentStatus;
  kind?: "deposit" | "balance";
  q?: string;
  sort?: (typeof LEDGER_SORTS)[number];
  dir?: "asc" | "desc";
  page?: number;
  pageSize?: number;
}

const ledgerColumns = {
  id: payments.id,
  orderId: payments.orderId,
  requestId: requests.id,
  reference: requests.reference,
  projectName: requests.projectName,
  firmName: organisations.name,
  kind: payments.kind,
  status: payments.status,
  amountCents: payments.amountCents,
  feeCents: payments.feeCents,
  refundedCents: payments.refundedCents,
  currency: payments.currency,
  paymentIntentId: payments.paymentIntentId,
  chargeId: payments.chargeId,
  receiptNumber: payments.receiptNumber,
  /** Card, bank transfer or recorded by accounts. */
  method: payments.method,
  /** What accounts staff quote to the processor: its id of the payment (the charge, else the intent). */
  processorReference: sql<string | null>`coalesce(${payments.chargeId}, ${payments.paymentIntentId})`,
  createdAt: payments.createdAt,
  paidAt: payments.paidAt,
};

function ledgerWhere(input: LedgerQuery) {
  // A payment belongs to the period when it was paid, or (unpaid) when it was created.
  const when = sql`coalesce(${payments.paidAt}, ${payments.createdAt})`;
  return and(
    input.from ? gte(when, input.from.getTime()) : undefined,
    input.to ? lte(when, input.to.getTime()) : undefined,
    input.status ? eq(payments.status, input.status) : undefined,
    input.kind ? eq(payments.kind, input.kind) : undefined,
    input.q
      ? or(containsText(requests.reference, input.q), containsText(organisations.name, input.q), containsText(payments.paymentIntentId, input.q))
      : undefined,
  );
}

/** The ledger page: server-side filter, sort and page. */
export async function listLedger(db: Db, input: LedgerQuery = {}) {
  const pageSize = Math.min(200, input.pageSize ?? 25);
  const page = Math.max(1, input.page ?? 1);
  const where = ledgerWhere(input);
  const col = { createdAt: payments.createdAt, paidAt: payments.paidAt, amountCents: payments.amountCents, reference: requests.reference, status: payments.status }[input.sort ?? "createdAt"];
  const base = db
    .select(ledgerColumns)
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId));
  const rows = await base.where(where).orderBy(input.dir === "asc" ? asc(col) : desc(col)).limit(pageSize).offset((page - 1) * pageSize);
  const [{ total }] = (await db
    .select({ total: sql<number>`count(*)` })
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId))
    .where(where)) as [{ total: number }];
  return { rows, total, page, pageSize };
}

/** Every payment and refund of a period, unpaged, for reconciliation and the CSV export. */
export async function ledgerForPeriod(db: Db, from: Date, to: Date) {
  const rows = await db
    .select(ledgerColumns)
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId))
    .where(ledgerWhere({ from, to }))
    .orderBy(asc(sql`coalesce(${payments.paidAt}, ${payments.createdAt})`));
  const refundRows = await db
    .select({
      id: refunds.id,
      paymentId: refunds.paymentId,
      amountCents: refunds.amountCents,
      reason: refunds.reason,
      status: refunds.status,
      stripeRefundId: refunds.stripeRefundId,
      receiptNumber: payments.receiptNumber,
      createdAt: refunds.createdAt,
      reference: requests.reference,
      firmName: organisations.name,
      currency: payments.currency,
    })
    .from(refunds)
    .innerJoin(payments, eq(payments.id, refunds.paymentId))
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId))
    .where(and(gte(refunds.createdAt, from), lte(refunds.createdAt, to)))
    .orderBy(asc(refunds.createdAt));
  return { payments: rows, refunds: refundRows };
}

export async function listRefundsForPayments(db: Db | Tx, paymentIds: string[]) {
  if (!paymentIds.length) return [];
  return db.select().from(refunds).where(inArray(refunds.paymentId, paymentIds)).orderBy(desc(refunds.createdAt));
}

export async function getLedgerPayment(db: Db | Tx, paymentId: string) {
  const [row] = await db
    .select(ledgerColumns)
    .from(payments)
    .innerJoin(orders, eq(orders.id, payments.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, payments.orgId))
    .where(eq(payments.id, paymentId));
  return row ?? null;
}
