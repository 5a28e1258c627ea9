import { randomInt } from "node:crypto";
import { ApiError, type ApiContext, type ApiResult } from "./api";
import { arr, metadataOf, obj, str, type FormObject } from "./form";
import { newId, type StripeObject } from "./store";

/**
 * The processor's bank-transfer method in test mode, as far as the app uses it: customers, a
 * PaymentIntent paid from the customer's cash balance (`customer_balance`, funding type
 * `bank_transfer`) with the account details and a reference to quote, and the test helper that
 * makes a transfer arrive. An arrival funds the customer's balance; when its reference names an
 * open PaymentIntent of that customer the money is applied to it up to what is still owed
 * (short: the intent stays open; over: the rest stays in the balance). Unknown references stay in
 * the balance. The account details are invented test values.
 */

const nowS = () => Math.floor(Date.now() / 1000);

const TEST_BANK = { bank_name: "Test Clearing Bank (test mode)", routing_number: "110000000", account_holder_name: "Ostrevane Additive Works" };

function referenceCode(): string {
  const alphabet = "ABCDEFGHJKLMNPQRSTUVWXYZ23456789";
  let s = "";
  for (let i = 0; i < 10; i++) s += alphabet[randomInt(alphabet.length)];
  return s;
}

export function createCustomer(ctx: ApiContext, params: FormObject): ApiResult {
  const customer: StripeObject = {
    id: newId("customers"),
    object: "customer",
    created: nowS(),
    email: str(params.email) ?? null,
    name: str(params.name) ?? null,
    metadata: metadataOf(params.metadata),
    livemode: false,
    // Per customer, as the processor gives one virtual account per customer.
    _account_number: String(randomInt(100_000_000, 999_999_999)) + String(randomInt(100, 999)),
    _cash_balance: 0,
  };
  ctx.store.insert("customers", customer);
  return { status: 200, body: view(customer) };
}

export function view(o: StripeObject): StripeObject {
  return JSON.parse(JSON.stringify(o, (k: string, v: unknown) => (k.startsWith("_") ? undefined : v))) as StripeObject;
}

function customerOr404(ctx: ApiContext, id: string): StripeObject {
  const c = ctx.store.get("customers", id);
  if (!c) throw new ApiError(404, "invalid_request_error", `No such customer: '${id}'`, "resource_missing", "customer");
  return c;
}

export function retrieveCustomer(ctx: ApiContext, id: string): ApiResult {
  const c = customerOr404(ctx, id);
  return { status: 200, body: { ...view(c), cash_balance: { object: "cash_balance", available: { usd: c._cash_balance }, customer: c.id } } };
}

/** POST /v1/payment_intents for the bank-transfer method only (cards go through checkout sessions). */
export function createPaymentIntent(ctx: ApiContext, params: FormObject): ApiResult {
  const amount = Number(str(params.amount));
  if (!Number.isInteger(amount) || amount < 1) throw new ApiError(400, "invalid_request_error", "Missing or invalid amount.", "parameter_missing", "amount");
  const currency = str(params.currency)?.toLowerCase();
  if (!currency) throw new ApiError(400, "invalid_request_error", "Missing required param: currency.", "parameter_missing", "currency");
  // The SDK sends `allowed_payment_method_types` (older versions `payment_method_types`).
  const types = (arr(params.allowed_payment_method_types) ?? arr(params.payment_method_types) ?? []).map((t) => String(t));
  if (!types.includes("customer_balance")) {
    throw new ApiError(400, "invalid_request_error", "This fake creates PaymentIntents for allowed_payment_method_types[]=customer_balance only.", "parameter_invalid_string", "payment_method_types");
  }
  const customerId = str(params.customer);
  if (!customerId) throw new ApiError(400, "invalid_request_error", "A customer is required to pay from a cash balance.", "parameter_missing", "customer");
  const customer = customerOr404(ctx, customerId);
  const cb = obj(obj(params.payment_method_options)?.customer_balance) ?? {};
  if (str(cb.funding_type) !== "bank_transfer") throw new ApiError(400, "invalid_request_error", "payment_method_options[customer_balance][funding_type] must be bank_transfer.", "parameter_invalid_string", "funding_type");
  const transferType = str(obj(cb.bank_transfer)?.type) ?? "us_bank_transfer";
  const confirm = str(params.confirm) === "true";
  const reference = referenceCode();
  const pi: StripeObject = {
    id: newId("payment_intents"),
    object: "payment_intent",
    created: nowS(),
    amount,
    amount_received: 0,
    currency,
    customer: customer.id,
    description: str(params.description) ?? null,
    metadata: metadataOf(params.metadata),
    livemode: false,
    payment_method_types: ["customer_balance"],
    status: confirm ? "requires_action" : "requires_confirmation",
    latest_charge: null,
    next_action: confirm
      ? {
          type: "display_bank_transfer_instructions",
          display_bank_transfer_instructions: {
            type: transferType,
            amount_remaining: amount,
            currency,
            reference,
            hosted_instructions_url: `${ctx.publicUrl}/transfer-instructions/${reference}`,
            financial_addresses: [{ type: "aba", supported_networks: ["ach", "domestic_wire_us"], aba: { account_number: customer._account_number, bank_name: TEST_BANK.bank_name, routing_number: TEST_BANK.routing_number } }],
          },
        }
      : null,
    _reference: reference,
  };
  ctx.store.insert("payment_intents", pi);
  ctx.queue.emit("payment_intent.created", view(pi));
  if (confirm) ctx.queue.emit("payment_intent.requires_action", view(pi));
  return { status: 200, body: view(pi) };
}

function balanceTxn(ctx: ApiContext, customer: StripeObject, fields: Record<string, unknown>, created: number): StripeObject {
  const t: StripeObject = { id: newId("cash_balance_transactions"), object: "customer_cash_balance_transaction", created, customer: customer.id, livemode: false, ...fields };
  ctx.store.insert("cash_balance_transactions", t);
  ctx.queue.emit("customer_cash_balance_transaction.created", t);
  return t;
}

/**
 * A bank transfer arrives for a customer (the test helper). `created` (seconds) lets the fake
 * date an arrival, to simulate funds that arrive late.
 */
export function fundCashBalance(ctx: ApiContext, customerId: string, params: FormObject, created: number = nowS()): ApiResult {
  const customer = customerOr404(ctx, customerId);
  const amount = Number(str(params.amount));
  if (!Number.isInteger(amount) || amount < 1) throw new ApiError(400, "invalid_request_error", "Missing or invalid amount.", "parameter_missing", "amount");
  const currency = (str(params.currency) ?? "usd").toLowerCase();
  const reference = str(params.reference) ?? null;
  customer._cash_balance = Number(customer._cash_balance) + amount;
  const funded = balanceTxn(ctx, customer, { type: "funded", currency, net_amount: amount, ending_balance: customer._cash_balance, funded: { bank_transfer: { type: "us_bank_transfer", reference } } }, created);
  const pi = reference
    ? ctx.store.state.objects.payment_intents.find((p) => p.customer === customer.id && p._reference === reference && p.status === "requires_action")
    : undefined;
  if (pi) {
    const instructions = (pi.next_action as { display_bank_transfer_instructions: { amount_remaining: number } }).display_bank_transfer_instructions;
    const applied = Math.min(amount, instructions.amount_remaining);
    customer._cash_balance = Number(customer._cash_balance) - applied;
    instructions.amount_remaining -= applied;
    pi.amount_received = Number(pi.amount_received) + applied;
    balanceTxn(ctx, customer, { type: "applied_to_payment", currency, net_amount: -applied, ending_balance: customer._cash_balance, applied_to_payment: { payment_intent: pi.id } }, created);
    if (instructions.amount_remaining === 0) {
      pi.status = "succeeded";
      pi.next_action = null;
      ctx.queue.emit("payment_intent.succeeded", view(pi));
    } else {
      ctx.queue.emit("payment_intent.partially_funded", view(pi));
    }
  }
  ctx.store.save();
  return { status: 200, body: funded };
}

export function listCashBalanceTransactions(ctx: ApiContext, customerId: string): ApiResult {
  customerOr404(ctx, customerId);
  const data = ctx.store.state.objects.cash_balance_transactions.filter((t) => t.customer === customerId).slice().reverse();
  return { status: 200, body: { object: "list", data, has_more: false, url: `/v1/customers/${customerId}/cash_balance_transactions` } };
}
