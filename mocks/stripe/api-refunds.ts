import { metadataOf, str, type FormObject } from "./form";
import type { StripeObject } from "./store";
import { newId } from "./store";
import { ApiError, missing, noSuch, now, intParam, type ApiContext, type ApiResult } from "./api-core";

/** The payment service fake: refunds. */
export function createRefund(ctx: ApiContext, params: FormObject): ApiResult {
  const { store } = ctx;
  const piId = str(params.payment_intent);
  const chId = str(params.charge);
  if (!piId && !chId) throw missing("charge");
  let charge: StripeObject | undefined;
  if (chId) {
    charge = store.get("charges", chId);
    if (!charge) throw noSuch("charge", chId);
  } else {
    const pi = store.get("payment_intents", piId!);
    if (!pi) throw noSuch("payment_intent", piId!);
    if (pi.status !== "succeeded" || !pi.latest_charge) {
      throw new ApiError(400, "invalid_request_error", `This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, "charge_not_refundable", "payment_intent");
    }
    charge = store.get("charges", String(pi.latest_charge));
  }
  if (!charge || charge.status !== "succeeded") {
    throw new ApiError(400, "invalid_request_error", "This charge cannot be refunded because it has not succeeded.", "charge_not_refundable");
  }
  const chargeAmount = Number(charge.amount);
  const remaining = chargeAmount - Number(charge.amount_refunded);
  // Error texts and codes follow Stripe's answers as remembered, not copied from its docs.
  if (remaining <= 0) {
    throw new ApiError(400, "invalid_request_error", `Charge ${charge.id} has already been refunded.`, "charge_already_refunded");
  }
  const amount = intParam(params, "amount", { min: 1 }) ?? remaining;
  if (amount > remaining) {
    throw new ApiError(400, "invalid_request_error", `Refund amount (${amount}) is greater than unrefunded amount on charge (${remaining}).`, "amount_too_large", "amount");
  }
  const reason = str(params.reason) ?? null;
  if (reason && !["duplicate", "fraudulent", "requested_by_customer"].includes(reason)) {
    throw new ApiError(400, "invalid_request_error", `Invalid reason: must be one of duplicate, fraudulent, or requested_by_customer`, "parameter_invalid_string", "reason");
  }
  const created = now();
  const refundId = newId("refunds");
  const txn: StripeObject = {
    id: newId("balance_transactions"),
    object: "balance_transaction",
    amount: -amount,
    available_on: created,
    created,
    currency: charge.currency,
    description: "REFUND FOR CHARGE",
    fee: 0,
    fee_details: [],
    net: -amount,
    reporting_category: "refund",
    source: refundId,
    status: "available",
    type: "refund",
  };
  store.insert("balance_transactions", txn);
  const refund: StripeObject = {
    id: refundId,
    object: "refund",
    amount,
    balance_transaction: txn.id,
    charge: charge.id,
    created,
    currency: charge.currency,
    metadata: metadataOf(params.metadata),
    payment_intent: charge.payment_intent ?? null,
    reason,
    status: "succeeded",
  };
  store.insert("refunds", refund);
  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
  charge.amount_refunded = Number(charge.amount_refunded) + amount;
  charge.refunded = charge.amount_refunded === chargeAmount;
  ctx.queue.emit("refund.created", refund);
  ctx.queue.emit("charge.refunded", charge, previous);
  return { status: 200, body: refund };
}

// ---------------------------------------------------------------------------------------------
