import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { notifyDepositReceived } from "@/lib/email/notify";
import { recordProcessorFee } from "@/lib/payments/fees";
import { constructWebhookEvent, WebhookSignatureError } from "@/lib/payments/stripe";
import { handleStripeEvent } from "@/lib/payments/webhooks";

export const runtime = "nodejs";

/**
 * Stripe webhooks: raw body → signature check with the SDK (400 on failure) → the handler, which
 * skips an event id already recorded and applies the rest once → 200. The e-mail goes after the
 * write has committed, and a failed e-mail does not make Stripe resend the event.
 */
export async function POST(req: Request) {
  const raw = await req.text();
  let event;
  try {
    event = constructWebhookEvent(raw, req.headers.get("stripe-signature"));
  } catch (e) {
    if (e instanceof WebhookSignatureError) {
      console.warn("stripe webhook refused:", e.message);
      return NextResponse.json({ error: { code: "webhook:signature", message: "Signature did not verify." } }, { status: 400 });
    }
    throw e;
  }
  try {
    const result = await handleStripeEvent(getDb(), event);
    console.info(`stripe webhook ${event.id} ${event.type}: ${result.outcome}`);
    if (result.paidPaymentId) {
      // The session carries no fee: ask the processor for the charge and its fee, so the ledger
      // agrees with it. A failure here leaves the fee unrecorded (reconciliation shows it).
      await recordProcessorFee(getDb(), result.paidPaymentId).catch((e: unknown) => console.error("recording the processing fee failed", e));
      await notifyDepositReceived(result.paidPaymentId).catch((e: unknown) => console.error("payment e-mail failed", e));
    }
    return NextResponse.json({ received: true, outcome: result.outcome });
  } catch (e) {
    console.error("stripe webhook failed", event.id, e);
    // 500 makes Stripe retry later; nothing was recorded, so the retry applies it once.
    return NextResponse.json({ error: { code: "internal", message: "Could not process the event." } }, { status: 500 });
  }
}
