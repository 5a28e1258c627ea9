import { notifyDepositReceived } from "@/lib/email/notify";
import { AppError } from "@/lib/errors";
import { rootLogger } from "@/lib/observability/log";
import { recordProcessorFee } from "@/lib/payments/fees";
import { constructWebhookEvent, WebhookSignatureError } from "@/lib/payments/stripe";
import { handleStripeEvent } from "@/lib/payments/webhooks";
import { defineRoute } from "@/lib/server/define-route";

export const runtime = "nodejs";

/**
 * Payment processor webhooks: raw body → signature check with the SDK (400 on failure) → the
 * handler, which skips an event id already recorded and applies the rest once → 200. The e-mail
 * goes after the write has committed, and a failed e-mail does not make the processor resend the
 * event. Anything else failing answers 500 (the door's table), so the processor retries later;
 * nothing was recorded, so the retry applies it once.
 */
export const POST = defineRoute({ access: "signature" }, async ({ req, db }) => {
  const raw = await req.text();
  let event;
  try {
    event = constructWebhookEvent(raw, req.headers.get("stripe-signature"));
  } catch (e) {
    if (e instanceof WebhookSignatureError) {
      rootLogger().warn({ event: "webhook.refused", reason: e.message }, "webhook signature did not verify");
      throw new AppError("invalid_input:webhook_signature", "Signature did not verify.");
    }
    throw e;
  }
  const result = await handleStripeEvent(db, event);
  rootLogger().info({ event: "webhook.applied", id: event.id, type: event.type, outcome: result.outcome }, "webhook event");
  if (result.paidPaymentId) {
    // The session carries no fee: ask the processor for the charge and its fee, so the ledger
    // agrees with it. A failure here leaves the fee unrecorded (reconciliation shows it).
    if (!result.isTransfer) await recordProcessorFee(db, result.paidPaymentId).catch((e: unknown) => rootLogger().error({ event: "webhook.fee", err: String(e) }, "recording the processing fee failed"));
    await notifyDepositReceived(result.paidPaymentId).catch((e: unknown) => rootLogger().error({ event: "webhook.notice", err: String(e) }, "payment e-mail failed"));
  }
  return { received: true, outcome: result.outcome };
});
