import { arr, metadataOf, obj, str, type FormObject } from "./form";
import type { StripeObject } from "./store";
import { newId } from "./store";
import { ApiError, invalid, missing, noSuch, now, publicView, throwNoSuch, intParam, type ApiContext, type ApiResult } from "./api-core";

/** The payment service fake: Checkout Sessions (create, expire, line items). */
export function createCheckoutSession(ctx: ApiContext, params: FormObject): ApiResult {
  const mode = str(params.mode);
  if (!mode) throw missing("mode");
  if (mode !== "payment") {
    throw new ApiError(400, "invalid_request_error", `This fake supports mode=payment only, not '${mode}'.`, "parameter_invalid_string", "mode");
  }
  const items = arr(params.line_items);
  if (!items || items.length === 0) throw missing("line_items");
  let total = 0;
  let currency: string | undefined;
  const lineItems: StripeObject[] = [];
  items.forEach((raw, i) => {
    const item = obj(raw) ?? {};
    const price = obj(item.price_data);
    if (!price) throw missing(`line_items[${i}][price_data]`);
    const unit = str(price.unit_amount);
    if (unit === undefined) throw missing(`line_items[${i}][price_data][unit_amount]`);
    if (!/^\d+$/.test(unit)) throw invalid(`line_items[${i}][price_data][unit_amount]`, `Invalid integer: ${unit}`);
    const cur = str(price.currency)?.toLowerCase();
    if (!cur) throw missing(`line_items[${i}][price_data][currency]`);
    if (currency && cur !== currency) {
      throw new ApiError(400, "invalid_request_error", "All line items must use the same currency.", "parameter_invalid_string", `line_items[${i}][price_data][currency]`);
    }
    currency = cur;
    const quantity = Number(str(item.quantity) ?? "1");
    if (!Number.isInteger(quantity) || quantity < 1) throw invalid(`line_items[${i}][quantity]`, "Quantity must be a positive integer.");
    const name = str(obj(price.product_data)?.name);
    if (!name) throw missing(`line_items[${i}][price_data][product_data][name]`);
    const amount = Number(unit) * quantity;
    total += amount;
    lineItems.push({
      id: `li_${newId("secret").slice(0, 24)}`,
      object: "item",
      created: now(),
      amount_subtotal: amount,
      amount_total: amount,
      currency: cur,
      description: name,
      quantity,
      price: { object: "price", unit_amount: Number(unit), currency: cur, product_data: { name } },
    });
  });
  const successUrl = str(params.success_url);
  const cancelUrl = str(params.cancel_url);
  for (const [param, url] of [["success_url", successUrl], ["cancel_url", cancelUrl]] as const) {
    if (url !== undefined && !/^https?:\/\//.test(url)) {
      throw new ApiError(400, "invalid_request_error", "Not a valid URL", "url_invalid", param);
    }
  }
  const pid = obj(params.payment_intent_data) ?? {};
  const created = now();
  const expiresAt = intParam(params, "expires_at") ?? created + 24 * 3600;
  const id = newId("checkout_sessions");
  const session: StripeObject = {
    id,
    object: "checkout.session",
    amount_subtotal: total,
    amount_total: total,
    cancel_url: cancelUrl ?? null,
    client_reference_id: str(params.client_reference_id) ?? null,
    created,
    currency: currency!,
    customer: null,
    customer_details: null,
    customer_email: str(params.customer_email) ?? null,
    expires_at: expiresAt,
    livemode: false,
    metadata: metadataOf(params.metadata),
    mode,
    payment_intent: null,
    payment_method_types: ["card"],
    payment_status: "unpaid",
    status: "open",
    success_url: successUrl ?? null,
    url: `${ctx.publicUrl}/checkout/${id}`,
    // Not part of Stripe's JSON; kept to build the payment intent and the line item list.
    _payment_intent_data: { metadata: metadataOf(pid.metadata), description: str(pid.description) ?? null },
    _line_items: lineItems,
  };
  ctx.store.insert("checkout_sessions", session);
  return { status: 200, body: publicView(session) };
}


export function expireSession(ctx: ApiContext, id: string): ApiResult {
  const session = ctx.store.get("checkout_sessions", id);
  if (!session) throw noSuch("checkout.session", id);
  if (session.status !== "open") {
    throw new ApiError(400, "invalid_request_error", `Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${String(session.status)}".`, "checkout_session_not_open");
  }
  session.status = "expired";
  session.url = null;
  ctx.queue.emit("checkout.session.expired", publicView(session));
  return { status: 200, body: publicView(session) };
}


export function lineItems(ctx: ApiContext, id: string, params: FormObject): ApiResult {
  const session = ctx.store.get("checkout_sessions", id) ?? throwNoSuch("checkout.session", id);
  const data = (session._line_items as StripeObject[] | undefined) ?? [];
  void params;
  return { status: 200, body: { object: "list", data, has_more: false, url: `/v1/checkout/sessions/${id}/line_items` } };
}
