import "server-only";
import type Stripe from "stripe";
import type { Db } from "../../db/client";
import { writeAudit, type Tx } from "../../db/queries/audit";
import { expireOtherPendingPayments, getOrderWithRequest, getPayment, getPaymentBySession, markPaymentExpired, markPaymentPaid, recordWebhookEvent, isWebhookEventRecorded } from "../../db/queries/payments";
import { transitionStage } from "../orders/transition";
import { issueDocumentInTx } from "../documents/issue";
import { recordTransferArrival, type FundedTransaction } from "./transfers";

/** What happened to one event; written to webhook_events.outcome and the log. */
export type WebhookOutcome =
  | "duplicate"
  | "ignored_type"
  | "unknown_session"
  | "not_paid_yet"
  | "amount_mismatch"
  | "paid"
  | "paid_stage_moved"
  | "already_paid"
  | "expired"
  | "expired_noop"
  | "transfer_applied"
  | "transfer_short"
  | "transfer_over"
  | "transfer_late"
  | "transfer_unmatched"
  | "transfer_duplicate"
  | "transfer_other";

export interface WebhookResult {
  outcome: WebhookOutcome;
  /** Set when this event newly recorded a payment: the caller sends the e-mail after commit. */
  paidPaymentId?: string;
  /** The payment came by bank transfer: no card fee to look up. */
  isTransfer?: boolean;
}

const HANDLED = new Set(["checkout.session.completed", "checkout.session.async_payment_succeeded", "checkout.session.expired", "customer_cash_balance_transaction.created"]);

/** A cash-balance movement: only money arriving (`funded`) is ours to record; applications follow from it. */
async function onCashBalance(tx: Tx, t: FundedTransaction): Promise<WebhookResult> {
  if (t.type !== "funded") return { outcome: "transfer_other" };
  const r = await recordTransferArrival(tx, t);
  return { outcome: `transfer_${r.status === "duplicate" ? "duplicate" : r.status === "applied" ? "applied" : r.status}` as WebhookOutcome, paidPaymentId: r.paidPaymentId, isTransfer: true };
}

class DuplicateEvent extends Error {}

/** Our payment for a session: by session id, else by the ids we put in its metadata. */
async function findPaymentForSession(tx: Db | Tx, session: Stripe.Checkout.Session) {
  const bySession = await getPaymentBySession(tx, session.id);
  if (bySession) return bySession;
  // The session's webhook can arrive before the app stored the session id on the payment.
  const pid = session.metadata?.paymentId ?? session.client_reference_id ?? null;
  if (!pid) return null;
  const p = await getPayment(tx, pid);
  if (!p) return null;
  if (p.checkoutSessionId && p.checkoutSessionId !== session.id) return null;
  return p;
}

async function onCompleted(tx: Tx, session: Stripe.Checkout.Session, now: Date): Promise<WebhookResult> {
  const payment = await findPaymentForSession(tx, session);
  if (!payment) return { outcome: "unknown_session" };
  if (session.payment_status !== "paid") return { outcome: "not_paid_yet" };
  if (session.amount_total !== payment.amountCents || (session.currency ?? "").toLowerCase() !== payment.currency.toLowerCase()) {
    await writeAudit(tx, {
      actorId: null,
      action: "payment.amount_mismatch",
      entityType: "payment",
      entityId: payment.id,
      orgId: payment.orgId,
      before: { amountCents: payment.amountCents, currency: payment.currency },
      after: { amountTotal: session.amount_total, currency: session.currency, session: session.id },
    });
    return { outcome: "amount_mismatch" };
  }
  const paymentIntentId = typeof session.payment_intent === "string" ? session.payment_intent : (session.payment_intent?.id ?? null);
  const changed = await markPaymentPaid(tx, payment.id, { checkoutSessionId: session.id, paymentIntentId, paidAt: now });
  if (!changed) return { outcome: "already_paid" };
  // A newer checkout opened for the same amount (after this one seemed abandoned) is now moot.
  await expireOtherPendingPayments(tx, payment);
  await writeAudit(tx, {
    actorId: null,
    action: "payment.paid",
    entityType: "payment",
    entityId: payment.id,
    orgId: payment.orgId,
    after: { kind: payment.kind, amountCents: payment.amountCents, session: session.id, paymentIntentId },
  });
  if (payment.kind === "deposit") {
    // The deposit invoice is numbered in the same transaction that records the money.
    await issueDocumentInTx(tx, { kind: "deposit_invoice", sourceId: payment.id, now });
    const row = await getOrderWithRequest(tx, payment.orderId);
    if (row && row.request.stage === "accepted") {
      await transitionStage(tx, { requestId: row.request.id, to: "deposit_paid", actorId: null, note: "Deposit received", expectedFrom: "accepted" });
      return { outcome: "paid_stage_moved", paidPaymentId: payment.id };
    }
  }
  return { outcome: "paid", paidPaymentId: payment.id };
}

async function onExpired(tx: Tx, session: Stripe.Checkout.Session): Promise<WebhookResult> {
  const payment = await findPaymentForSession(tx, session);
  if (!payment) return { outcome: "unknown_session" };
  // Guarded: a payment already paid (a completed event came first) stays paid.
  return { outcome: (await markPaymentExpired(tx, payment.id)) ? "expired" : "expired_noop" };
}

/**
 * Apply one verified Stripe event, at most once: the handler's writes and the event id commit
 * in one transaction, so a replay (same event id) or a second event for the same session changes
 * nothing. Unknown types and unknown sessions write nothing and are answered 200 by the route.
 */
export async function handleStripeEvent(db: Db, event: Stripe.Event, now: Date = new Date()): Promise<WebhookResult> {
  if (!HANDLED.has(event.type)) return { outcome: "ignored_type" };
  if (await isWebhookEventRecorded(db, event.id)) return { outcome: "duplicate" };
  try {
    return await db.transaction(async (tx) => {
      const session = event.data.object as Stripe.Checkout.Session;
      const result =
        event.type === "customer_cash_balance_transaction.created"
          ? await onCashBalance(tx, event.data.object as unknown as FundedTransaction)
          : event.type === "checkout.session.expired"
            ? await onExpired(tx, session)
            : await onCompleted(tx, session, now);
      if (result.outcome === "unknown_session") {
        // No write at all: roll back (nothing was written) and tell the route.
        return result;
      }
      if (!(await recordWebhookEvent(tx, { id: event.id, type: event.type, outcome: result.outcome }))) throw new DuplicateEvent();
      return result;
    });
  } catch (e) {
    if (e instanceof DuplicateEvent) return { outcome: "duplicate" };
    throw e;
  }
}
