import { createHash } from "node:crypto";
import type { WebhookQueue } from "./delivery";
import { arr, metadataOf, obj, str, type FormObject } from "./form";
import type { Collection, Store, StripeObject } from "./store";
import { collectionForId, newId } from "./store";
import { createCustomer, createPaymentIntent, fundCashBalance, listCashBalanceTransactions, retrieveCustomer } from "./cash-balance";

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly code?: string,
    readonly param?: string,
  ) {
    super(message);
  }
  toJSON() {
    return {
      error: {
        type: this.type,
        message: this.message,
        ...(this.code ? { code: this.code } : {}),
        ...(this.param ? { param: this.param } : {}),
      },
    };
  }
}

export interface ApiContext {
  store: Store;
  queue: WebhookQueue;
  publicUrl: string;
}

export interface ApiResult {
  status: number;
  body: unknown;
  headers?: Record<string, string>;
}

const now = () => Math.floor(Date.now() / 1000);

/** Test-mode processing fee: 2.9 % + 30¢ of each charge. A made-up test figure, not a price list. */
export function testFeeCents(amountCents: number): number {
  return Math.round(amountCents * 0.029) + 30;
}

const missing = (param: string) =>
  new ApiError(400, "invalid_request_error", `Missing required param: ${param}.`, "parameter_missing", param);
const invalid = (param: string, message: string) =>
  new ApiError(400, "invalid_request_error", message, "parameter_invalid_integer", param);

function noSuch(kind: string, id: string): ApiError {
  return new ApiError(404, "invalid_request_error", `No such ${kind}: '${id}'`, "resource_missing", "id");
}

function intParam(params: FormObject, name: string, opts: { min?: number } = {}): number | undefined {
  const raw = str(params[name]);
  if (raw === undefined) return undefined;
  if (!/^-?\d+$/.test(raw)) throw invalid(name, `Invalid integer: ${raw}`);
  const n = Number(raw);
  if (opts.min !== undefined && n < opts.min) {
    throw new ApiError(400, "invalid_request_error", `This value must be greater than or equal to ${opts.min}.`, "parameter_invalid_integer", name);
  }
  return n;
}

// ---------------------------------------------------------------------------------------------
// Expansion and lists

function expandPaths(params: FormObject): string[] {
  const e = params.expand;
  if (typeof e === "string") return [e];
  return (arr(e) ?? []).filter((x): x is string => typeof x === "string");
}

/** Replace id strings at dotted paths (`payment_intent`, `latest_charge.balance_transaction`) by the objects. */
function expand(store: Store, object: StripeObject, paths: string[]): StripeObject {
  const copy = structuredClone(object) as Record<string, unknown>;
  for (const p of paths) expandAt(store, copy, p.split("."));
  // Fields with a leading underscore are the fake's own bookkeeping, never sent.
  return JSON.parse(JSON.stringify(copy, (k: string, v: unknown) => (k.startsWith("_") ? undefined : v))) as StripeObject;
}

function expandAt(store: Store, node: Record<string, unknown>, parts: string[]): void {
  const [head, ...rest] = parts;
  if (!head) return;
  let value = node[head];
  if (typeof value === "string" && collectionForId(value)) {
    const found = store.find(value);
    if (found) node[head] = value = structuredClone(found);
  }
  if (rest.length > 0 && value && typeof value === "object") expandAt(store, value as Record<string, unknown>, rest);
}

function createdFilter(params: FormObject): (created: number) => boolean {
  const c = params.created;
  if (typeof c === "string") {
    const exact = Number(c);
    return (t) => t === exact;
  }
  const o = obj(c) ?? {};
  const bound = (k: string) => {
    const v = str(o[k]);
    if (v === undefined) return undefined;
    if (!/^\d+$/.test(v)) throw invalid(`created[${k}]`, `Invalid integer: ${v}`);
    return Number(v);
  };
  const gte = bound("gte");
  const gt = bound("gt");
  const lte = bound("lte");
  const lt = bound("lt");
  return (t) =>
    (gte === undefined || t >= gte) && (gt === undefined || t > gt) && (lte === undefined || t <= lte) && (lt === undefined || t < lt);
}

/** A Stripe list: newest first, `limit` (1–100, default 10), cursors `starting_after`/`ending_before`. */
function list(
  ctx: ApiContext,
  collection: Collection,
  url: string,
  params: FormObject,
  filter: (o: StripeObject) => boolean = () => true,
): ApiResult {
  const limit = intParam(params, "limit", { min: 1 }) ?? 10;
  if (limit > 100) throw new ApiError(400, "invalid_request_error", "This value must be less than or equal to 100.", "parameter_invalid_integer", "limit");
  const inRange = createdFilter(params);
  const all = ctx.store.state.objects[collection]
    .map((o, i) => ({ o, i }))
    .filter(({ o }) => inRange(o.created) && filter(o))
    .sort((a, b) => b.o.created - a.o.created || b.i - a.i)
    .map(({ o }) => o);
  let start = 0;
  let end = all.length;
  const after = str(params.starting_after);
  const before = str(params.ending_before);
  if (after) {
    const idx = all.findIndex((o) => o.id === after);
    if (idx === -1) throw noSuch(collection.replace(/s$/, ""), after);
    start = idx + 1;
    end = Math.min(all.length, start + limit);
  } else if (before) {
    const idx = all.findIndex((o) => o.id === before);
    if (idx === -1) throw noSuch(collection.replace(/s$/, ""), before);
    end = idx;
    start = Math.max(0, end - limit);
  } else {
    end = Math.min(all.length, limit);
  }
  const page = all.slice(start, end);
  const hasMore = before ? start > 0 : end < all.length;
  const paths = expandPaths(params)
    .filter((p) => p.startsWith("data."))
    .map((p) => p.slice(5));
  return {
    status: 200,
    body: { object: "list", data: page.map((o) => expand(ctx.store, o, paths)), has_more: hasMore, url },
  };
}

function retrieve(ctx: ApiContext, collection: Collection, kind: string, id: string, params: FormObject): ApiResult {
  const found = ctx.store.get(collection, id);
  if (!found) throw noSuch(kind, id);
  return { status: 200, body: expand(ctx.store, found, expandPaths(params)) };
}

// ---------------------------------------------------------------------------------------------
// Checkout sessions

function createCheckoutSession(ctx: ApiContext, params: FormObject): ApiResult {
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

/** Strip the fake's private fields (leading underscore) before answering. */
export function publicView(o: StripeObject): StripeObject {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(o)) if (!k.startsWith("_")) out[k] = v;
  return out as StripeObject;
}

function expireSession(ctx: ApiContext, id: string): ApiResult {
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

// ---------------------------------------------------------------------------------------------
// Refunds

function createRefund(ctx: ApiContext, params: FormObject): ApiResult {
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
// Routing

type Handler = (ctx: ApiContext, params: FormObject, match: RegExpMatchArray) => ApiResult;

const routes: { method: string; pattern: RegExp; handler: Handler; creates?: boolean }[] = [
  { method: "POST", pattern: /^\/v1\/checkout\/sessions$/, handler: (c, p) => createCheckoutSession(c, p), creates: true },
  { method: "GET", pattern: /^\/v1\/checkout\/sessions$/, handler: (c, p) => list(c, "checkout_sessions", "/v1/checkout/sessions", p, byField(p, ["payment_intent", "status", "customer_email", "client_reference_id"])) },
  { method: "GET", pattern: /^\/v1\/checkout\/sessions\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "checkout_sessions", "checkout.session", m[1]!, p) },
  { method: "GET", pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/, handler: (c, p, m) => lineItems(c, m[1]!, p) },
  { method: "POST", pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/, handler: (c, _p, m) => expireSession(c, m[1]!), creates: true },
  { method: "POST", pattern: /^\/v1\/customers$/, handler: (c, p) => createCustomer(c, p), creates: true },
  { method: "GET", pattern: /^\/v1\/customers\/([^/]+)$/, handler: (c, _p, m) => retrieveCustomer(c, m[1]!) },
  { method: "GET", pattern: /^\/v1\/customers\/([^/]+)\/cash_balance_transactions$/, handler: (c, _p, m) => listCashBalanceTransactions(c, m[1]!) },
  { method: "POST", pattern: /^\/v1\/test_helpers\/customers\/([^/]+)\/fund_cash_balance$/, handler: (c, p, m) => fundCashBalance(c, m[1]!, p), creates: true },
  { method: "POST", pattern: /^\/v1\/payment_intents$/, handler: (c, p) => createPaymentIntent(c, p), creates: true },
  { method: "GET", pattern: /^\/v1\/payment_intents$/, handler: (c, p) => list(c, "payment_intents", "/v1/payment_intents", p, byField(p, ["customer"])) },
  { method: "GET", pattern: /^\/v1\/payment_intents\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "payment_intents", "payment_intent", m[1]!, p) },
  { method: "GET", pattern: /^\/v1\/charges$/, handler: (c, p) => list(c, "charges", "/v1/charges", p, byField(p, ["payment_intent", "customer"])) },
  { method: "GET", pattern: /^\/v1\/charges\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "charges", "charge", m[1]!, p) },
  { method: "GET", pattern: /^\/v1\/balance_transactions$/, handler: (c, p) => list(c, "balance_transactions", "/v1/balance_transactions", p, byField(p, ["type", "source", "currency"])) },
  { method: "GET", pattern: /^\/v1\/balance_transactions\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "balance_transactions", "balance_transaction", m[1]!, p) },
  { method: "POST", pattern: /^\/v1\/refunds$/, handler: (c, p) => createRefund(c, p), creates: true },
  { method: "GET", pattern: /^\/v1\/refunds$/, handler: (c, p) => list(c, "refunds", "/v1/refunds", p, byField(p, ["charge", "payment_intent"])) },
  { method: "GET", pattern: /^\/v1\/refunds\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "refunds", "refund", m[1]!, p) },
  { method: "GET", pattern: /^\/v1\/events$/, handler: (c, p) => list(c, "events", "/v1/events", p, byField(p, ["type"])) },
  { method: "GET", pattern: /^\/v1\/events\/([^/]+)$/, handler: (c, p, m) => retrieve(c, "events", "event", m[1]!, p) },
];

function throwNoSuch(kind: string, id: string): never {
  throw noSuch(kind, id);
}

function byField(params: FormObject, fields: string[]): (o: StripeObject) => boolean {
  const wanted = fields.map((f) => [f, str(params[f])] as const).filter(([, v]) => v !== undefined);
  return (o) => wanted.every(([f, v]) => String(o[f]) === v);
}

function lineItems(ctx: ApiContext, id: string, params: FormObject): ApiResult {
  const session = ctx.store.get("checkout_sessions", id) ?? throwNoSuch("checkout.session", id);
  const data = (session._line_items as StripeObject[] | undefined) ?? [];
  void params;
  return { status: 200, body: { object: "list", data, has_more: false, url: `/v1/checkout/sessions/${id}/line_items` } };
}

/**
 * Answer one Stripe API request. `Idempotency-Key` on a POST replays the first answer for the
 * same key and parameters, and refuses the key with other parameters, as Stripe does.
 */
export function handleApi(
  ctx: ApiContext,
  req: { method: string; path: string; params: FormObject; idempotencyKey?: string; rawParams: string },
): ApiResult {
  const route = routes.find((r) => r.method === req.method && r.pattern.test(req.path));
  if (!route) {
    const known = routes.some((r) => r.pattern.test(req.path));
    throw new ApiError(404, "invalid_request_error", known ? `Unrecognized request method ${req.method} for ${req.path}` : `Unrecognized request URL (${req.method}: ${req.path}).`);
  }
  const match = req.path.match(route.pattern)!;
  const key = route.creates ? req.idempotencyKey : undefined;
  const { store } = ctx;
  if (key) {
    const hash = createHash("sha256").update(req.rawParams).digest("hex");
    const prior = store.state.idempotency.find((e) => e.key === key);
    if (prior) {
      if (prior.route !== `${req.method} ${req.path}` || prior.paramsHash !== hash) {
        throw new ApiError(400, "idempotency_error", `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`);
      }
      return { status: prior.status, body: prior.body, headers: { "idempotent-replayed": "true" } };
    }
    let result: ApiResult;
    try {
      result = route.handler(ctx, req.params, match);
    } catch (e) {
      // Stripe also stores 4xx answers against the key (not 5xx); do the same.
      if (e instanceof ApiError && e.status < 500) {
        store.state.idempotency.push({ key, route: `${req.method} ${req.path}`, paramsHash: hash, status: e.status, body: e.toJSON() });
        store.save();
      }
      throw e;
    }
    store.state.idempotency.push({ key, route: `${req.method} ${req.path}`, paramsHash: hash, status: result.status, body: result.body });
    store.save();
    return result;
  }
  const result = route.handler(ctx, req.params, match);
  if (req.method === "POST") store.save();
  return result;
}
