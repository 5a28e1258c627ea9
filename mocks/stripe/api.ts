import { createHash } from "node:crypto";
import type { FormObject } from "./form";
import { ApiError, byField, list, retrieve, type ApiContext, type ApiResult } from "./api-core";
import { createCheckoutSession, expireSession, lineItems } from "./api-checkout";
import { createRefund } from "./api-refunds";
import { createCustomer, createPaymentIntent, fundCashBalance, listCashBalanceTransactions, retrieveCustomer } from "./cash-balance";

export { ApiError, publicView, testFeeCents, type ApiContext, type ApiResult } from "./api-core";

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
