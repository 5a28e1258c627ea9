import "server-only";
import type { Db } from "../../db/client";
import { writeAudit, type Tx } from "../../db/queries/audit";
import { allocateReceiptNumber, expireOtherPendingPayments, getOrderWithRequest } from "../../db/queries/payments";
import { findTransferPayment, getArrivalByProcessorId, getOrgByProcessorCustomer, insertArrival, markReceivedPaid, setReceivedCents } from "../../db/queries/transfers";
import { transitionStage } from "../orders/transition";
import type { Payment } from "../../db/schema";
import { issueDocumentInTx } from "../documents/issue";
import { applyArrival, type ArrivalStatus } from "./terms";

/** The processor's record of money arriving in a firm's cash balance (only what we read). */
export interface FundedTransaction {
  id: string;
  customer: string;
  net_amount: number;
  currency: string;
  created: number;
  type: string;
  funded?: { bank_transfer?: { reference?: string | null } | null } | null;
}

export interface ArrivalResult {
  status: ArrivalStatus | "duplicate";
  fundsId: string | null;
  /** Set when this arrival paid the payment in full: the caller sends the e-mail after commit. */
  paidPaymentId?: string;
}

/**
 * Money that came in by bank transfer, applied once per arrival (the processor's transaction id is
 * unique): matched to our payment by the reference the payer quoted, applied up to what is still
 * owed; the payment is paid (receipt numbered, deposit invoice issued, the order moved on) when
 * it is whole. Short, over, late and unknown-reference arrivals are kept for accounts to settle.
 */
export async function recordTransferArrival(tx: Tx, t: FundedTransaction): Promise<ArrivalResult> {
  const seen = await getArrivalByProcessorId(tx, t.id);
  if (seen) return { status: "duplicate", fundsId: seen.id };
  const receivedAt = new Date(t.created * 1000);
  const reference = t.funded?.bank_transfer?.reference?.trim() || null;
  const org = await getOrgByProcessorCustomer(tx, t.customer);
  const payment = reference ? await findTransferPayment(tx, reference, org?.id ?? null) : null;
  const row = payment ? await getOrderWithRequest(tx, payment.orderId) : null;
  const dueAt = payment?.kind === "balance" ? (row?.order.dueAt ?? null) : null;
  const isOpen = payment?.status === "pending";
  const owed = payment && isOpen ? payment.amountCents - payment.receivedCents : null;
  const outcome = applyArrival({ amountCents: t.net_amount, owedCents: owed, receivedAt, dueAt });
  // Money for a payment already settled is all over; it is not "unknown".
  const status: ArrivalStatus = payment && !isOpen ? "over" : outcome.status;
  const fundsId = await insertArrival(tx, { processorId: t.id, processorCustomerId: t.customer, orgId: org?.id ?? payment?.orgId ?? null, paymentId: payment?.id ?? null, amountCents: t.net_amount, currency: t.currency, reference, appliedCents: outcome.appliedCents, status, receivedAt });
  await writeAudit(tx, { actorId: null, action: "transfer.received", entityType: "transfer_funds", entityId: fundsId, orgId: org?.id ?? payment?.orgId ?? null, after: { amountCents: t.net_amount, reference, status, appliedCents: outcome.appliedCents, paymentId: payment?.id ?? null } });
  if (!payment || !isOpen || outcome.appliedCents === 0) return { status, fundsId };
  const paid = await applyToPayment(tx, payment, outcome.appliedCents, receivedAt, null);
  return { status, fundsId, paidPaymentId: paid ? payment.id : undefined };
}

/**
 * Add money received to a payment; when it is whole, mark it paid with a receipt number and do
 * what a paid payment does (the deposit invoice and the move to deposit paid). True when this
 * made it paid. The caller checked the amount fits.
 */
export async function applyToPayment(tx: Tx, payment: Payment, cents: number, at: Date, actorId: string | null): Promise<boolean> {
  const receivedCents = payment.receivedCents + cents;
  if (receivedCents < payment.amountCents) {
    await setReceivedCents(tx, payment.id, receivedCents);
    return false;
  }
  const receiptNumber = await allocateReceiptNumber(tx, at);
  if (!(await markReceivedPaid(tx, payment.id, { receivedCents, paidAt: at, receiptNumber }))) return false;
  // Another way of paying the same amount opened meanwhile (a payment page) is now moot.
  await expireOtherPendingPayments(tx, payment);
  await writeAudit(tx, { actorId, action: "payment.paid", entityType: "payment", entityId: payment.id, orgId: payment.orgId, after: { kind: payment.kind, amountCents: payment.amountCents, method: payment.method, reference: payment.transferReference ?? payment.externalReference } });
  if (payment.kind === "deposit") {
    await issueDocumentInTx(tx, { kind: "deposit_invoice", sourceId: payment.id, now: at, actorId });
    const row = await getOrderWithRequest(tx, payment.orderId);
    if (row?.request.stage === "accepted") await transitionStage(tx, { requestId: row.request.id, to: "deposit_paid", actorId, note: "Deposit received", expectedFrom: "accepted" });
  }
  return true;
}

/** For callers with no transaction of their own. */
export async function recordTransferArrivalNow(db: Db, t: FundedTransaction): Promise<ArrivalResult> {
  return db.transaction((tx) => recordTransferArrival(tx, t));
}
