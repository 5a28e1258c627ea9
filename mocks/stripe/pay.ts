import { publicView, testFeeCents, type ApiContext } from "./api";
import type { StripeObject } from "./store";
import { newId } from "./store";

export type PayOutcome =
  | { outcome: "succeeded"; session: StripeObject; redirectUrl: string | null }
  | { outcome: "declined" | "invalid"; session: StripeObject; message: string }
  | { outcome: "not_open"; session: StripeObject | null; message: string };

/** Test card numbers of the fake page (the trade-wide test numbers). */
export const TEST_CARDS = { success: "4242424242424242", declined: "4000000000000002" } as const;

/**
 * What the fake checkout page does on "Pay": the success card completes the session, creates the
 * payment intent, charge and balance transaction (with the test fee) and queues
 * `checkout.session.completed`; the declined card leaves the session open and payable again.
 */
export function payCheckoutSession(ctx: ApiContext, sessionId: string, cardInput: string): PayOutcome {
  const { store } = ctx;
  const session = store.get("checkout_sessions", sessionId);
  if (!session) return { outcome: "not_open", session: null, message: "This payment page does not exist." };
  if (session.status === "open" && Number(session.expires_at) < Date.now() / 1000) {
    session.status = "expired";
    session.url = null;
    ctx.queue.emit("checkout.session.expired", publicView(session));
    store.save();
  }
  if (session.status !== "open") {
    return { outcome: "not_open", session: publicView(session), message: `This payment is ${session.status === "complete" ? "already complete" : "no longer open"}.` };
  }
  const card = cardInput.replace(/[\s-]/g, "");
  if (card !== TEST_CARDS.success && card !== TEST_CARDS.declined) {
    return { outcome: "invalid", session: publicView(session), message: "Use one of the test card numbers shown on this page." };
  }
  const created = Math.floor(Date.now() / 1000);
  const amount = Number(session.amount_total);
  const currency = String(session.currency);
  const pid = (session._payment_intent_data ?? {}) as { metadata?: Record<string, string>; description?: string | null };

  let pi = session.payment_intent ? store.get("payment_intents", String(session.payment_intent)) : undefined;
  if (!pi) {
    pi = store.insert("payment_intents", {
      id: newId("payment_intents"),
      object: "payment_intent",
      amount,
      amount_received: 0,
      currency,
      created,
      customer: null,
      description: pid.description ?? null,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: pid.metadata ?? {},
      payment_method_types: ["card"],
      receipt_email: session.customer_email ?? null,
      status: "requires_payment_method",
    });
    session.payment_intent = pi.id;
  }

  const succeeded = card === TEST_CARDS.success;
  const chargeId = newId("charges");
  let txnId: string | null = null;
  if (succeeded) {
    const fee = testFeeCents(amount);
    txnId = newId("balance_transactions");
    store.insert("balance_transactions", {
      id: txnId,
      object: "balance_transaction",
      amount,
      available_on: created + 2 * 86400,
      created,
      currency,
      description: pi.description ?? null,
      fee,
      fee_details: [{ amount: fee, currency, description: "Processing fee (test figure)", type: "stripe_fee" }],
      net: amount - fee,
      reporting_category: "charge",
      source: chargeId,
      status: "pending",
      type: "charge",
    });
  }
  store.insert("charges", {
    id: chargeId,
    object: "charge",
    amount,
    amount_captured: succeeded ? amount : 0,
    amount_refunded: 0,
    balance_transaction: txnId,
    billing_details: { email: session.customer_email ?? null },
    captured: succeeded,
    created,
    currency,
    description: pi.description ?? null,
    failure_code: succeeded ? null : "card_declined",
    failure_message: succeeded ? null : "Your card was declined.",
    livemode: false,
    metadata: pi.metadata ?? {},
    outcome: succeeded
      ? { network_status: "approved_by_network", type: "authorized", seller_message: "Payment complete." }
      : { network_status: "declined_by_network", reason: "generic_decline", type: "issuer_declined", seller_message: "The bank did not return any further details with this decline." },
    paid: succeeded,
    payment_intent: pi.id,
    payment_method_details: { type: "card", card: { brand: "test", last4: card.slice(-4) } },
    refunded: false,
    status: succeeded ? "succeeded" : "failed",
  });
  pi.latest_charge = chargeId;

  if (!succeeded) {
    pi.status = "requires_payment_method";
    pi.last_payment_error = { type: "card_error", code: "card_declined", decline_code: "generic_decline", message: "Your card was declined." };
    store.save();
    return { outcome: "declined", session: publicView(session), message: "Your card was declined." };
  }
  pi.status = "succeeded";
  pi.amount_received = amount;
  pi.last_payment_error = null;
  session.status = "complete";
  session.payment_status = "paid";
  session.customer_details = { email: session.customer_email ?? null };
  session.url = null;
  ctx.queue.emit("checkout.session.completed", publicView(session));
  store.save();
  const success = session.success_url ? String(session.success_url).replaceAll("{CHECKOUT_SESSION_ID}", session.id) : null;
  return { outcome: "succeeded", session: publicView(session), redirectUrl: success };
}
