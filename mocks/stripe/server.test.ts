import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { createCheckoutSession, createRefund, listProcessorRecords } from "../../lib/payments/stripe";
import { startWebhookSink } from "../test-support/webhook-sink";
import { startStripeFake, type StripeFake } from "./server";

const SECRET = "whsec_test_fake_suite";

function sdkFor(fake: StripeFake): Stripe {
  const u = new URL(fake.url);
  return new Stripe("sk_test_suite", { host: u.hostname, port: Number(u.port), protocol: "http", maxNetworkRetries: 0 });
}

const baseSession = {
  paymentId: "pay_1",
  orderId: "ord_1",
  amountCents: 125_000,
  currency: "usd",
  description: "Deposit for order ord_1 (layup mold)",
  customerEmail: "buyer@caldrith.example",
  successUrl: "http://127.0.0.1:3999/orders/ord_1?paid={CHECKOUT_SESSION_ID}",
  cancelUrl: "http://127.0.0.1:3999/orders/ord_1",
};

async function post(url: string, body: unknown) {
  const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}

describe("Stripe fake with the real SDK", () => {
  let dir: string;
  let sink: Awaited<ReturnType<typeof startWebhookSink>>;
  let fake: StripeFake;
  let stripe: Stripe;
  let sinkStatus: (n: number) => number = () => 200;

  beforeAll(async () => {
    sink = await startWebhookSink((n) => sinkStatus(n));
  });
  afterAll(async () => sink.close());
  beforeEach(async () => {
    dir = mkdtempSync(path.join(tmpdir(), "lw-stripe-"));
    sink.received.length = 0;
    sinkStatus = () => 200;
    fake = await startStripeFake({ port: 0, dataDir: dir, webhookUrl: sink.url, webhookSecret: SECRET, retryBaseMs: 40, maxRetryDelayMs: 200, log: () => {} });
    stripe = sdkFor(fake);
  });
  afterEach(async () => {
    await fake.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it("creates a checkout session shaped like Stripe's, and retrieves and lists it", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-create-1" }, stripe);
    expect(s.id).toMatch(/^cs_test_[A-Za-z0-9]{20,}$/);
    expect(s).toMatchObject({
      object: "checkout.session",
      status: "open",
      payment_status: "unpaid",
      amount_total: 125_000,
      currency: "usd",
      client_reference_id: "pay_1",
      metadata: { paymentId: "pay_1", orderId: "ord_1" },
      livemode: false,
    });
    expect(s.url).toBe(`${fake.url}/checkout/${s.id}`);
    const again = await stripe.checkout.sessions.retrieve(s.id);
    expect(again.id).toBe(s.id);
    expect(again).not.toHaveProperty("_line_items");
    const listed = await stripe.checkout.sessions.list({ limit: 5 });
    expect(listed.object).toBe("list");
    expect(listed.has_more).toBe(false);
    expect(listed.data.map((x) => x.id)).toEqual([s.id]);
    const items = await stripe.checkout.sessions.listLineItems(s.id);
    expect(items.data[0]).toMatchObject({ amount_total: 125_000, quantity: 1, description: baseSession.description });
  });

  it("honours Idempotency-Key: same key → same session; same key with other params → idempotency_error", async () => {
    const a = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-same" }, stripe);
    const b = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-same" }, stripe);
    expect(b.id).toBe(a.id);
    expect((await stripe.checkout.sessions.list()).data).toHaveLength(1);
    const err = await createCheckoutSession({ ...baseSession, amountCents: 1, idempotencyKey: "k-same" }, stripe).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });

  it("answers errors in Stripe's shape: missing key 401, unknown id 404 resource_missing, bad params 400", async () => {
    const res = await fetch(`${fake.url}/v1/charges`);
    expect(res.status).toBe(401);
    expect(((await res.json()) as { error: { type: string } }).error.type).toBe("invalid_request_error");
    const missing = await stripe.checkout.sessions.retrieve("cs_test_nope").catch((e: unknown) => e as Stripe.errors.StripeError);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: "resource_missing" });
    const bad = await stripe.checkout.sessions.create({ mode: "payment", success_url: "http://x.test/" }).catch((e: unknown) => e as Stripe.errors.StripeError);
    expect(bad).toMatchObject({ statusCode: 400, code: "parameter_missing", param: "line_items" });
  });

  it("pays with 4242: session complete, intent succeeded, charge with fee; signed webhook verifies with the SDK", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-pay" }, stripe);
    const paid = await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4242 4242 4242 4242" });
    expect(paid.status).toBe(200);
    expect(paid.json.redirectUrl).toBe(`http://127.0.0.1:3999/orders/ord_1?paid=${s.id}`);

    await sink.waitFor(1);
    const hook = sink.received[0]!;
    const event = stripe.webhooks.constructEvent(hook.body, String(hook.headers["stripe-signature"]), SECRET);
    expect(event.type).toBe("checkout.session.completed");
    expect(event.id).toMatch(/^evt_/);
    const session = event.data.object as Stripe.Checkout.Session;
    expect(session).toMatchObject({ id: s.id, status: "complete", payment_status: "paid", metadata: { orderId: "ord_1" } });
    // A forged body with the same header fails verification.
    expect(() => stripe.webhooks.constructEvent(hook.body.replace("ord_1", "ord_2"), String(hook.headers["stripe-signature"]), SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );

    const pi = await stripe.paymentIntents.retrieve(String(session.payment_intent), { expand: ["latest_charge.balance_transaction"] });
    expect(pi).toMatchObject({ status: "succeeded", amount: 125_000, amount_received: 125_000, metadata: { paymentId: "pay_1" } });
    const charge = pi.latest_charge as Stripe.Charge;
    expect(charge).toMatchObject({ object: "charge", status: "succeeded", paid: true, amount: 125_000, payment_intent: pi.id });
    const txn = charge.balance_transaction as Stripe.BalanceTransaction;
    // Test fee: 2.9 % + 30¢ of $1,250.00 = 3625 + 30 cents.
    expect(txn).toMatchObject({ object: "balance_transaction", type: "charge", fee: 3655, net: 125_000 - 3655, source: charge.id });

    const again = await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4242424242424242" });
    expect(again.status).toBe(409);
  });

  it("declines 4000 0000 0000 0002 and leaves the session open and payable again", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-decline" }, stripe);
    const declined = await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4000 0000 0000 0002" });
    expect(declined.status).toBe(402);
    expect(declined.json.message).toBe("Your card was declined.");
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("open");
    const failed = await stripe.charges.list();
    expect(failed.data[0]).toMatchObject({ status: "failed", failure_code: "card_declined", balance_transaction: null });
    const ok = await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4242424242424242" });
    expect(ok.status).toBe(200);
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("complete");
    await sink.waitFor(1);
    expect(sink.received.map((h) => (JSON.parse(h.body) as { type: string }).type)).toEqual(["checkout.session.completed"]);
  });

  it("serves a marked test page: decline message, cancel link, redirect to success_url on 4242", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-page" }, stripe);
    const page = await (await fetch(s.url!)).text();
    expect(page).toContain("LOCAL TEST PAYMENT PAGE");
    expect(page).toContain("$1,250.00");
    expect(page).toContain(`href="${baseSession.cancelUrl}"`);
    const form = (card: string) =>
      fetch(`${fake.url}/checkout/${s.id}/pay`, { method: "POST", body: new URLSearchParams({ card }), redirect: "manual" });
    const declined = await form("4000000000000002");
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain("Your card was declined");
    const ok = await form("4242 4242 4242 4242");
    expect(ok.status).toBe(303);
    expect(ok.headers.get("location")).toBe(`http://127.0.0.1:3999/orders/ord_1?paid=${s.id}`);
  });

  it("expires an open session and sends checkout.session.expired", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-exp" }, stripe);
    const expired = await stripe.checkout.sessions.expire(s.id);
    expect(expired.status).toBe("expired");
    await sink.waitFor(1);
    expect(JSON.parse(sink.received[0]!.body)).toMatchObject({ type: "checkout.session.expired", data: { object: { id: s.id } } });
    await expect(stripe.checkout.sessions.expire(s.id)).rejects.toMatchObject({ statusCode: 400 });
  });

  it("refunds within the paid amount only, idempotently, with charge.refunded and refund.created events", async () => {
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-ref" }, stripe);
    await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4242424242424242" });
    const piId = String((await stripe.checkout.sessions.retrieve(s.id)).payment_intent);

    const r1 = await createRefund({ paymentIntentId: piId, amountCents: 25_000, reason: "requested_by_customer", idempotencyKey: "r-1" }, stripe);
    expect(r1).toMatchObject({ object: "refund", amount: 25_000, status: "succeeded", payment_intent: piId, reason: "requested_by_customer" });
    expect(r1.id).toMatch(/^re_/);
    const replay = await createRefund({ paymentIntentId: piId, amountCents: 25_000, reason: "requested_by_customer", idempotencyKey: "r-1" }, stripe);
    expect(replay.id).toBe(r1.id);

    const tooMuch = await createRefund({ paymentIntentId: piId, amountCents: 100_001, idempotencyKey: "r-2" }, stripe).catch((e: unknown) => e);
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(tooMuch).toMatchObject({ statusCode: 400, code: "amount_too_large", param: "amount" });

    const rest = await createRefund({ paymentIntentId: piId, idempotencyKey: "r-3" }, stripe);
    expect(rest.amount).toBe(100_000);
    const charge = await stripe.charges.retrieve(String(rest.charge));
    expect(charge).toMatchObject({ amount_refunded: 125_000, refunded: true });
    const more = await createRefund({ paymentIntentId: piId, amountCents: 1, idempotencyKey: "r-4" }, stripe).catch((e: unknown) => e);
    expect(more).toMatchObject({ statusCode: 400, code: "charge_already_refunded" });

    const refunds = await stripe.refunds.list({ payment_intent: piId });
    expect(refunds.data.map((r) => r.amount)).toEqual([100_000, 25_000]);
    expect((await stripe.refunds.retrieve(r1.id)).amount).toBe(25_000);
    const txns = await stripe.balanceTransactions.list({ type: "refund" });
    expect(txns.data.map((t) => t.amount).sort()).toEqual([-100_000, -25_000]);

    await sink.waitFor(5);
    const types = sink.received.map((h) => (JSON.parse(h.body) as { type: string }).type);
    expect(types).toEqual(["checkout.session.completed", "refund.created", "charge.refunded", "refund.created", "charge.refunded"]);
  });

  it("filters lists by created[gte]/[lte] and pages through has_more (listProcessorRecords)", async () => {
    const day = 86_400;
    const t0 = 1_780_000_000;
    const charges = Array.from({ length: 250 }, (_, i) => ({
      amount: 1000 + i,
      currency: "usd",
      status: "succeeded",
      created: t0 + (i % 5) * day,
      amount_refunded: 0,
    }));
    const injected = await post(`${fake.url}/_fake/objects`, {
      charges,
      payment_intents: [{ amount: 5000, currency: "usd", status: "succeeded", created: t0 + day }],
      balance_transactions: [{ amount: 5000, fee: 175, net: 4825, currency: "usd", type: "charge", created: t0 + 3 * day }],
    });
    expect(injected.status).toBe(200);

    const page = await stripe.charges.list({ created: { gte: t0 + day, lte: t0 + 2 * day }, limit: 100 });
    expect(page.has_more).toBe(false);
    expect(page.data).toHaveLength(100); // days 1 and 2, 50 each
    expect(page.data.every((c) => c.created >= t0 + day && c.created <= t0 + 2 * day)).toBe(true);
    const first = await stripe.charges.list({ limit: 100 });
    expect(first.has_more).toBe(true);
    expect(first.data[0]!.created).toBeGreaterThanOrEqual(first.data[99]!.created);

    const records = await listProcessorRecords({ from: new Date(t0 * 1000), to: new Date((t0 + 3 * day) * 1000) }, stripe);
    expect(records.charges).toHaveLength(200);
    expect(new Set(records.charges.map((c) => c.id)).size).toBe(200);
    expect(records.paymentIntents).toHaveLength(1);
    expect(records.balanceTransactions).toMatchObject([{ fee: 175 }]);
    const all = await listProcessorRecords({ from: new Date(t0 * 1000), to: new Date((t0 + 4 * day) * 1000) }, stripe);
    expect(all.charges).toHaveLength(250);
  });

  it("retries a delivery the app answered 500, and resends after a restart what was never acknowledged", async () => {
    sinkStatus = (n) => (n === 1 ? 500 : 200);
    const s = await createCheckoutSession({ ...baseSession, idempotencyKey: "k-retry" }, stripe);
    await post(`${fake.url}/_fake/pay/${s.id}`, { card: "4242424242424242" });
    await sink.waitFor(2);
    const [first, second] = sink.received;
    expect(JSON.parse(first!.body).id).toBe(JSON.parse(second!.body).id);
    stripe.webhooks.constructEvent(second!.body, String(second!.headers["stripe-signature"]), SECRET);
    const events = (await (await fetch(`${fake.url}/_fake/events`)).json()) as { data: { delivery: { attempts: number; deliveredAt: number | null } }[] };
    expect(events.data[0]!.delivery).toMatchObject({ attempts: 2 });
    expect(events.data[0]!.delivery.deliveredAt).not.toBeNull();

    // The app is "down": every delivery fails; the fake is stopped with the event unacknowledged.
    sinkStatus = () => 503;
    await stripe.checkout.sessions.expire((await createCheckoutSession({ ...baseSession, idempotencyKey: "k-retry-2" }, stripe)).id);
    await sink.waitFor(3);
    await fake.close();
    const persisted = JSON.parse(readFileSync(path.join(dir, "stripe-fake.json"), "utf8")) as { deliveries: { deliveredAt: number | null }[] };
    expect(persisted.deliveries.filter((d) => d.deliveredAt === null)).toHaveLength(1);

    sinkStatus = () => 200;
    const before = sink.received.length;
    fake = await startStripeFake({ port: 0, dataDir: dir, webhookUrl: sink.url, webhookSecret: SECRET, retryBaseMs: 40, log: () => {} });
    await sink.waitFor(before + 1);
    expect(JSON.parse(sink.received.at(-1)!.body).type).toBe("checkout.session.expired");

    // Manual redelivery of one acknowledged event by id.
    const firstId = JSON.parse(first!.body).id as string;
    const redo = await post(`${fake.url}/_fake/redeliver`, { id: firstId });
    expect(redo.json).toMatchObject({ ok: true, queued: 1 });
    await sink.waitFor(before + 2);
    expect(JSON.parse(sink.received.at(-1)!.body).id).toBe(firstId);
  });
});
