import "server-only";
import type Stripe from "stripe";
import type { Db } from "../../db/client";
import { getOrCreatePendingPayment, getOrderWithRequest, hasPaid, markPaymentExpired, setPaymentSession, type PaymentKind } from "../../db/queries/payments";
import { AppError } from "../errors";
import { formatCents } from "../money";
import { createCheckoutSession, getStripe } from "./stripe";

export interface CheckoutResult {
  url: string | null;
  /** The processor already shows this payment complete; the webhook will record it. */
  isComplete: boolean;
}

const PAYABLE: Record<PaymentKind, readonly string[]> = {
  deposit: ["accepted"],
  balance: ["shipped", "delivered"],
};

/**
 * The Checkout Session to pay an order's deposit or balance. The open payment is reused and its
 * session created with the payment's id as idempotency key, so a double-clicked "pay" makes ONE
 * session; a session that expired (abandoned) is closed and a fresh one opened, so the order is
 * payable again. The caller has checked that the user may see the order.
 */
export async function openCheckout(
  db: Db,
  input: { orderId: string; kind: PaymentKind; userId: string; email: string; appUrl: string },
  stripe: Stripe = getStripe(),
): Promise<CheckoutResult> {
  const row = await getOrderWithRequest(db, input.orderId);
  if (!row) throw new AppError("not_found:order", "That order was not found.");
  const { order, request } = row;
  if (!PAYABLE[input.kind].includes(request.stage)) {
    throw new AppError("conflict:stage", input.kind === "deposit" ? "The deposit is not due: the order is not waiting for it." : "The balance falls due when the order ships.");
  }
  if (await hasPaid(db, order.id, input.kind)) throw new AppError("conflict:paid", `The ${input.kind} is already paid.`);
  const amountCents = input.kind === "deposit" ? order.depositCents : order.balanceCents;
  if (amountCents <= 0) throw new AppError("conflict:amount", `Nothing is due for the ${input.kind}.`);

  for (let attempt = 0; attempt < 3; attempt++) {
    // libsql opens write transactions with BEGIN IMMEDIATE: two clicks at once find one row.
    const { payment } = await db.transaction((tx) =>
      getOrCreatePendingPayment(tx, { orderId: order.id, orgId: order.orgId, kind: input.kind, amountCents, currency: order.currency, createdById: input.userId }),
    );
    if (payment.checkoutSessionId) {
      const session = await stripe.checkout.sessions.retrieve(payment.checkoutSessionId).catch((e: { statusCode?: number }) => {
        if (e.statusCode === 404) return null;
        throw e;
      });
      if (session?.status === "open" && session.url) return { url: session.url, isComplete: false };
      if (session?.status === "complete") return { url: null, isComplete: true };
      await markPaymentExpired(db, payment.id);
      continue;
    }
    const base = `${input.appUrl}/portal/requests/${request.id}`;
    const session = await createCheckoutSession(
      {
        paymentId: payment.id,
        orderId: order.id,
        amountCents,
        currency: order.currency,
        description: `${input.kind === "deposit" ? "Deposit" : "Balance"} for ${request.reference} (${formatCents(order.totalCents, order.currency)} order, PO ${order.poNumber})`,
        customerEmail: input.email,
        successUrl: `${base}?checkout=success&session_id={CHECKOUT_SESSION_ID}`,
        cancelUrl: `${base}?checkout=cancelled`,
        idempotencyKey: `checkout/${payment.id}`,
      },
      stripe,
    );
    await setPaymentSession(db, payment.id, session.id, session.url);
    return { url: session.url, isComplete: false };
  }
  throw new AppError("unavailable", "The payment page could not be opened; try again in a moment.");
}
