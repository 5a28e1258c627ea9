import { and, asc, desc, eq, inArray, isNotNull, ne, sql } from "drizzle-orm";
import type { Db } from "../client";
import { issuedDocuments, orders, organisations, payments, requests, type PaymentTerms } from "../schema";
import type { Tx } from "./audit";

type Q = Db | Tx;

const SETTLED = ["paid", "refunded", "partially_refunded"] as const;

/**
 * What a firm owes on account now, cents: every order accepted on net terms and not cancelled
 * (invoiced or not yet), less what has come in against it (settled payments in full, part
 * transfers by what arrived).
 */
export async function openOnAccountCents(q: Q, orgId: string): Promise<number> {
  const [row] = await q
    .select({
      owed: sql<number>`coalesce(sum(${orders.totalCents}), 0)`,
      paid: sql<number>`coalesce(sum((select coalesce(sum(case when ${payments.status} in ('paid','refunded','partially_refunded') then ${payments.amountCents} else ${payments.receivedCents} end), 0) from ${payments} where ${payments.orderId} = ${orders.id})), 0)`,
    })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(and(eq(orders.orgId, orgId), ne(orders.paymentTerms, "prepay"), ne(requests.stage, "cancelled")));
  return Math.max(0, Number(row?.owed ?? 0) - Number(row?.paid ?? 0));
}

/** A firm's terms as accounts set them. */
export async function getFirmTerms(q: Q, orgId: string) {
  const [row] = await q
    .select({ id: organisations.id, name: organisations.name, paymentTerms: organisations.paymentTerms, creditLimitCents: organisations.creditLimitCents, termsApprovedAt: organisations.termsApprovedAt, processorCustomerId: organisations.processorCustomerId })
    .from(organisations)
    .where(eq(organisations.id, orgId));
  return row ?? null;
}

export async function setFirmTerms(tx: Tx, input: { orgId: string; paymentTerms: PaymentTerms; creditLimitCents: number; approvedById: string; now: Date }) {
  const onAccount = input.paymentTerms !== "prepay";
  const rows = await tx
    .update(organisations)
    .set({
      paymentTerms: input.paymentTerms,
      creditLimitCents: onAccount ? input.creditLimitCents : 0,
      termsApprovedById: onAccount ? input.approvedById : null,
      termsApprovedAt: onAccount ? input.now : null,
    })
    .where(eq(organisations.id, input.orgId))
    .returning({ id: organisations.id });
  return rows.length === 1;
}

/** Every client firm with its terms, limit and what it owes on account, for accounts. */
export async function listFirmAccounts(db: Db) {
  const firms = await db
    .select({ id: organisations.id, name: organisations.name, paymentTerms: organisations.paymentTerms, creditLimitCents: organisations.creditLimitCents, termsApprovedAt: organisations.termsApprovedAt })
    .from(organisations)
    .orderBy(asc(organisations.name));
  return Promise.all(firms.map(async (f) => ({ ...f, openCents: await openOnAccountCents(db, f.id) })));
}

/**
 * Invoices on net terms (issued: the order has a due date), with their balance payment's state
 * and the invoice's number, most urgent first. `orgId` scopes to one firm (the portal).
 */
export async function listTermsInvoices(q: Q, scope: { orgId?: string } = {}) {
  const rows = await q
    .select({
      orderId: orders.id,
      orgId: orders.orgId,
      firm: organisations.name,
      requestId: requests.id,
      reference: requests.reference,
      projectName: requests.projectName,
      poNumber: orders.poNumber,
      paymentTerms: orders.paymentTerms,
      totalCents: orders.totalCents,
      balanceCents: orders.balanceCents,
      currency: orders.currency,
      invoicedAt: orders.invoicedAt,
      dueAt: orders.dueAt,
      reminderSentAt: orders.reminderSentAt,
      overdueNoticeAt: orders.overdueNoticeAt,
      invoiceNumber: issuedDocuments.number,
    })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, orders.orgId))
    .leftJoin(issuedDocuments, and(eq(issuedDocuments.kind, "invoice"), eq(issuedDocuments.sourceId, orders.id)))
    .where(and(ne(orders.paymentTerms, "prepay"), isNotNull(orders.dueAt), scope.orgId ? eq(orders.orgId, scope.orgId) : undefined))
    .orderBy(asc(orders.dueAt));
  if (rows.length === 0) return [];
  const pays = await q
    .select({ orderId: payments.orderId, status: payments.status, amountCents: payments.amountCents, receivedCents: payments.receivedCents, paidAt: payments.paidAt, method: payments.method })
    .from(payments)
    .where(and(inArray(payments.orderId, rows.map((r) => r.orderId)), eq(payments.kind, "balance")))
    .orderBy(desc(payments.createdAt));
  return rows.map((r) => {
    const mine = pays.filter((p) => p.orderId === r.orderId);
    const settled = mine.find((p) => (SETTLED as readonly string[]).includes(p.status));
    const receivedCents = settled ? settled.amountCents : mine.reduce((s, p) => s + (p.status === "pending" ? p.receivedCents : 0), 0);
    return { ...r, isPaid: Boolean(settled), paidAt: settled?.paidAt ?? null, receivedCents, owedCents: settled ? 0 : Math.max(0, r.balanceCents - receivedCents) };
  });
}

/** Claim the reminder (or the overdue notice) of an invoice on terms: true for the one process that sets it. */
export async function claimTermsNotice(tx: Q, orderId: string, which: "reminder" | "overdue", now: Date): Promise<boolean> {
  const col = which === "reminder" ? orders.reminderSentAt : orders.overdueNoticeAt;
  const rows = await tx
    .update(orders)
    .set(which === "reminder" ? { reminderSentAt: now } : { overdueNoticeAt: now })
    .where(and(eq(orders.id, orderId), sql`${col} is null`))
    .returning({ id: orders.id });
  return rows.length === 1;
}

export { SETTLED };
