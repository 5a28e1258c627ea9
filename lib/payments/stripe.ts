import Stripe from "stripe";
import { env, type Env } from "../env";

/**
 * The one place the Stripe SDK is configured. With `STRIPE_API_HOST` set the SDK sends its
 * requests there (the local fake in mocks/stripe); without it, to Stripe itself. The code paths
 * are the same either way.
 */
export function stripeClientOptions(e: Env): Stripe.StripeConfig {
  if (!e.STRIPE_API_HOST) return {};
  const protocol = e.STRIPE_API_PROTOCOL ?? "http";
  return {
    host: e.STRIPE_API_HOST,
    port: e.STRIPE_API_PORT ?? (protocol === "https" ? 443 : 80),
    protocol,
    // The fake answers at once; retries would only hide its errors in tests.
    maxNetworkRetries: 0,
  };
}

let client: Stripe | undefined;

/** The process-wide Stripe client, built from the validated environment. */
export function getStripe(): Stripe {
  if (!client) {
    const e = env();
    client = new Stripe(e.STRIPE_SECRET_KEY, stripeClientOptions(e));
  }
  return client;
}

/** For tests that change the environment between cases. */
export function resetStripeClient(): void {
  client = undefined;
}

export interface CheckoutSessionInput {
  paymentId: string;
  orderId: string;
  amountCents: number;
  currency: string;
  description: string;
  customerEmail?: string | null;
  /** May contain `{CHECKOUT_SESSION_ID}`, which Stripe replaces on redirect. */
  successUrl: string;
  cancelUrl: string;
  /** Same key → the same session (a double-clicked "pay" makes one session). */
  idempotencyKey: string;
}

/**
 * Create a Checkout Session for one payment (deposit or balance). Our payment and order ids go in
 * `client_reference_id` and the metadata of both the session and its payment intent, so webhooks
 * and the processor's records can be matched back to the ledger.
 */
export async function createCheckoutSession(input: CheckoutSessionInput, stripe: Stripe = getStripe()): Promise<Stripe.Checkout.Session> {
  if (!Number.isInteger(input.amountCents) || input.amountCents <= 0) {
    throw new RangeError(`amountCents must be a positive integer, got ${input.amountCents}`);
  }
  if (!/^[a-z]{3}$/i.test(input.currency)) throw new RangeError(`currency must be a 3-letter ISO code, got ${input.currency}`);
  if (!input.idempotencyKey) throw new RangeError("idempotencyKey is required for a checkout session");
  const metadata = { paymentId: input.paymentId, orderId: input.orderId };
  return stripe.checkout.sessions.create(
    {
      mode: "payment",
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: input.currency.toLowerCase(),
            unit_amount: input.amountCents,
            product_data: { name: input.description },
          },
        },
      ],
      customer_email: input.customerEmail ?? undefined,
      client_reference_id: input.paymentId,
      success_url: input.successUrl,
      cancel_url: input.cancelUrl,
      metadata,
      payment_intent_data: { metadata, description: input.description },
    },
    { idempotencyKey: input.idempotencyKey },
  );
}

/** A webhook whose signature does not verify; the route answers 400. */
export class WebhookSignatureError extends Error {
  readonly code = "webhook:signature";
}

/**
 * Verify a webhook's `Stripe-Signature` over the raw body (as received, not re-serialised) with
 * `STRIPE_WEBHOOK_SECRET`, and return the event. Throws `WebhookSignatureError` when it fails.
 */
export function constructWebhookEvent(rawBody: string | Buffer, signature: string | null | undefined, stripe: Stripe = getStripe()): Stripe.Event {
  if (!signature) throw new WebhookSignatureError("Missing Stripe-Signature header");
  try {
    return stripe.webhooks.constructEvent(rawBody, signature, env().STRIPE_WEBHOOK_SECRET);
  } catch (e) {
    throw new WebhookSignatureError(`Webhook signature did not verify: ${(e as Error).message}`);
  }
}

/**
 * The charge behind a paid payment intent and the processor's fee on it (from the charge's
 * balance transaction), or null while the processor has not settled the charge yet.
 */
export async function retrieveChargeFee(paymentIntentId: string, stripe: Stripe = getStripe()): Promise<{ chargeId: string; feeCents: number } | null> {
  const pi = await stripe.paymentIntents.retrieve(paymentIntentId, { expand: ["latest_charge.balance_transaction"] });
  const charge = pi.latest_charge;
  if (!charge || typeof charge === "string") return null;
  const txn = charge.balance_transaction;
  if (!txn || typeof txn === "string") return null;
  return { chargeId: charge.id, feeCents: txn.fee };
}

export interface RefundInput {
  paymentIntentId: string;
  /** Omit for the whole remaining amount. */
  amountCents?: number;
  reason?: "duplicate" | "fraudulent" | "requested_by_customer";
  metadata?: Record<string, string>;
  idempotencyKey: string;
}

/**
 * Refund part or all of a payment. Stripe refuses more than the unrefunded amount (HTTP 400,
 * surfaced as `Stripe.errors.StripeInvalidRequestError`); the same key never refunds twice.
 */
export async function createRefund(input: RefundInput, stripe: Stripe = getStripe()): Promise<Stripe.Refund> {
  if (input.amountCents !== undefined && (!Number.isInteger(input.amountCents) || input.amountCents <= 0)) {
    throw new RangeError(`amountCents must be a positive integer, got ${input.amountCents}`);
  }
  if (!input.idempotencyKey) throw new RangeError("idempotencyKey is required for a refund");
  return stripe.refunds.create(
    {
      payment_intent: input.paymentIntentId,
      amount: input.amountCents,
      reason: input.reason,
      metadata: input.metadata,
    },
    { idempotencyKey: input.idempotencyKey },
  );
}

export interface ProcessorRecords {
  charges: Stripe.Charge[];
  paymentIntents: Stripe.PaymentIntent[];
  balanceTransactions: Stripe.BalanceTransaction[];
  refunds: Stripe.Refund[];
}

type Page<T> = { data: T[]; has_more: boolean };

async function pageThrough<T extends { id: string }>(fetchPage: (startingAfter?: string) => Promise<Page<T>>, maxRecords: number, what: string): Promise<T[]> {
  const out: T[] = [];
  let after: string | undefined;
  for (;;) {
    const page = await fetchPage(after);
    out.push(...page.data);
    if (out.length > maxRecords) {
      throw new RangeError(`More than ${maxRecords} ${what} in the period; narrow the dates`);
    }
    const last = page.data.at(-1);
    if (!page.has_more || !last) return out;
    after = last.id;
  }
}

/**
 * Every charge, payment intent, balance transaction (with its fee) and refund the processor
 * created in [from, to] (inclusive, second resolution), paging through `has_more`.
 */
export async function listProcessorRecords(
  range: { from: Date; to: Date },
  stripe: Stripe = getStripe(),
  maxRecords = 10_000,
): Promise<ProcessorRecords> {
  const created = { gte: Math.floor(range.from.getTime() / 1000), lte: Math.floor(range.to.getTime() / 1000) };
  if (created.lte < created.gte) throw new RangeError("The period ends before it starts");
  const limit = 100;
  const [charges, paymentIntents, balanceTransactions, refunds] = await Promise.all([
    pageThrough((a) => stripe.charges.list({ created, limit, starting_after: a }), maxRecords, "charges"),
    pageThrough((a) => stripe.paymentIntents.list({ created, limit, starting_after: a }), maxRecords, "payment intents"),
    pageThrough((a) => stripe.balanceTransactions.list({ created, limit, starting_after: a }), maxRecords, "balance transactions"),
    pageThrough((a) => stripe.refunds.list({ created, limit, starting_after: a }), maxRecords, "refunds"),
  ]);
  return { charges, paymentIntents, balanceTransactions, refunds };
}
