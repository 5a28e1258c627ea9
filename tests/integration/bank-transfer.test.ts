import { and, eq } from "drizzle-orm";
import type Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { issuedDocuments, orders, organisations, payments, quotes, requests, transferFunds, users } from "../../db/schema";
import { resetEnvCache } from "../../lib/env";
import { resetStripeClient } from "../../lib/payments/stripe";
import { startStripeFake, type StripeFake } from "../../mocks/stripe/server";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", async () => (await import("../support/integration")).nextCacheMock);
const mails = vi.hoisted(() => ({ paid: [] as string[] }));
vi.mock("@/lib/email/notify", () => ({ notifyDepositReceived: async (id: string) => void mails.paid.push(id), notifyRequestReceived: async () => {}, notifyShipped: async () => {}, notifyBalanceDue: async () => {} }));

let t: TestDb;
let db: Db;
let fake: StripeFake;
let seen = 0;
const paidByWebhook: string[] = [];

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date() });
  db = t.db;
  dbRef.db = db;
  fake = await startStripeFake({ port: 0, dataDir: null, log: () => undefined, webhookUrl: "http://127.0.0.1:1/none", retryBaseMs: 3_600_000 });
  Object.assign(process.env, { STRIPE_API_HOST: "127.0.0.1", STRIPE_API_PORT: String(fake.port), STRIPE_API_PROTOCOL: "http" });
  resetEnvCache();
  resetStripeClient();
}, 180_000);
afterAll(async () => {
  await fake?.close();
  t?.close();
});

const as = async (email: string) => {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  session.current = { user: { id: u!.id } };
  return u!.id;
};

/** The fake's events since the last call, applied by the app's webhook handler in order (as delivery would). */
async function deliver(): Promise<string[]> {
  const { handleStripeEvent } = await import("../../lib/payments/webhooks");
  const events = fake.store.state.objects.events.slice(seen);
  seen += events.length;
  const out: string[] = [];
  for (const e of events) {
    const r = await handleStripeEvent(db, e as unknown as Stripe.Event);
    if (r.outcome !== "ignored_type" && r.outcome !== "transfer_other") out.push(r.outcome);
    // The route e-mails the client for each payment made whole, after the commit.
    if (r.paidPaymentId) paidByWebhook.push(r.paidPaymentId);
  }
  return out;
}

/** A transfer arriving at the processor for a firm, through the test helper (or dated, through the fake's control route). */
async function arrive(orgId: string, amountCents: number, reference: string, arrivedAt?: Date) {
  const [org] = await db.select().from(organisations).where(eq(organisations.id, orgId));
  const customer = org!.processorCustomerId!;
  const res = arrivedAt
    ? await fetch(`${fake.url}/_fake/transfers/${customer}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ amount: amountCents, reference, arrivedAt: arrivedAt.toISOString() }) })
    : await fetch(`${fake.url}/v1/test_helpers/customers/${customer}/fund_cash_balance`, { method: "POST", headers: { authorization: "Bearer sk_test_local", "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ amount: String(amountCents), currency: "usd", reference }).toString() });
  expect(res.status).toBe(200);
  return deliver();
}

const paymentOf = async (id: string) => (await db.select().from(payments).where(eq(payments.id, id)))[0]!;
const fundsBy = async (ref: string) => db.select().from(transferFunds).where(eq(transferFunds.reference, ref));

describe("paying by bank transfer", () => {
  let depositId: string;
  let reference: string;
  let orgId: string;
  let requestId: string;

  it("accepting with bank transfer opens the processor's bank-transfer method and keeps the details and the reference", async () => {
    const [r] = await db.select().from(requests).where(eq(requests.projectName, "Deck hatch plug"));
    const [q] = await db.select().from(quotes).where(eq(quotes.requestId, r!.id));
    requestId = r!.id;
    orgId = r!.orgId;
    await as("buyer@bramblewake.example");
    const { acceptQuote } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const res = await acceptQuote({ quoteId: q!.id, poNumber: "BW-TR-1", acceptTerms: true, payBy: "bank_transfer" });
    expect(res.ok, res.ok ? "" : res.message).toBe(true);
    if (res.ok) expect(res.data.url).toBeNull();
    const [order] = await db.select().from(orders).where(eq(orders.requestId, r!.id));
    const [p] = await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "deposit")));
    expect(p).toMatchObject({ method: "bank_transfer", status: "pending", amountCents: order!.depositCents, receivedCents: 0 });
    expect(p!.transferReference).toMatch(/^[A-Z2-9]{10}$/);
    expect(p!.transferDetails).toMatchObject({ accountHolder: "Ostrevane Additive Works", routingNumber: "110000000" });
    expect(p!.paymentIntentId).toMatch(/^pi_/);
    const [org] = await db.select().from(organisations).where(eq(organisations.id, orgId));
    expect(org!.processorCustomerId).toMatch(/^cus_/);
    depositId = p!.id;
    reference = p!.transferReference!;
    // Asking again shows the same transfer, not a second one.
    const { payByTransfer } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const again = await payByTransfer({ orderId: order!.id, kind: "deposit" });
    expect(again).toMatchObject({ ok: true, data: { reference } });
    expect(await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "deposit")))).toHaveLength(1);
    // Choosing the card after all opens its own payment page; the transfer stays as it was.
    const { payOrder } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const card = await payOrder({ orderId: order!.id, kind: "deposit" });
    expect(card.ok && card.data.url).toMatch(/\/checkout\//);
    const both = await db.select().from(payments).where(and(eq(payments.orderId, order!.id), eq(payments.kind, "deposit")));
    expect(both.map((p) => p.method).sort()).toEqual(["bank_transfer", "card"]);
    expect(both.find((p) => p.method === "bank_transfer")).toMatchObject({ transferReference: reference, checkoutSessionId: null });
    await deliver();
  });

  it("another firm can not open a transfer on this order", async () => {
    await as("lab@tarnavel.example");
    const [order] = await db.select().from(orders).where(eq(orders.requestId, requestId));
    const { payByTransfer } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    expect(await payByTransfer({ orderId: order!.id, kind: "deposit" })).toMatchObject({ ok: false, code: "not_found:order" });
  });

  it("money that arrives short is applied and kept open; the rest completes it: paid, receipt, deposit invoice with the reference, order moves on", async () => {
    const p = await paymentOf(depositId);
    expect(await arrive(orgId, p.amountCents - 10_000, reference)).toEqual(["transfer_short"]);
    const short = await paymentOf(depositId);
    expect(short).toMatchObject({ status: "pending", receivedCents: p.amountCents - 10_000, receiptNumber: null });
    expect((await db.select().from(requests).where(eq(requests.id, requestId)))[0]!.stage).toBe("accepted");
    expect((await fundsBy(reference)).map((f) => [f.status, f.appliedCents])).toEqual([["short", p.amountCents - 10_000]]);

    expect(await arrive(orgId, 10_000, reference)).toEqual(["transfer_applied"]);
    const paid = await paymentOf(depositId);
    expect(paid).toMatchObject({ status: "paid", receivedCents: p.amountCents });
    expect(paid.receiptNumber).toMatch(/^RC-\d{4}-\d{5}$/);
    expect((await db.select().from(requests).where(eq(requests.id, requestId)))[0]!.stage).toBe("deposit_paid");
    const [inv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, depositId), eq(issuedDocuments.kind, "deposit_invoice")));
    expect(inv!.data).toMatchObject({ paymentReference: reference, paidBy: "bank transfer" });
    expect(paidByWebhook).toEqual([depositId]);
    // The card page opened meanwhile is moot now.
    const [cardPay] = await db.select().from(payments).where(and(eq(payments.kind, "deposit"), eq(payments.method, "card"), eq(payments.orderId, paid.orderId)));
    expect(cardPay!.status).toBe("expired");
    // The processor's own record agrees: its intent is whole.
    const pi = fake.store.get("payment_intents", paid.paymentIntentId!)!;
    expect(pi).toMatchObject({ status: "succeeded", amount_received: p.amountCents });
  });

  it("money over what is owed pays it and keeps the excess for accounts, who settle it with a note", async () => {
    await as("lab@tarnavel.example");
    const [o] = await db.select({ id: orders.id, orgId: orders.orgId, deposit: orders.depositCents }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Composite coupon drill fixture"));
    const { payByTransfer } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const opened = await payByTransfer({ orderId: o!.id, kind: "deposit" });
    expect(opened.ok, opened.ok ? "" : opened.message).toBe(true);
    if (!opened.ok) return;
    await deliver();
    expect(await arrive(o!.orgId, o!.deposit + 5_000, opened.data.reference)).toEqual(["transfer_over"]);
    const [f] = await fundsBy(opened.data.reference);
    expect(f).toMatchObject({ status: "over", amountCents: o!.deposit + 5_000, appliedCents: o!.deposit, resolvedAt: null });
    const [pay] = await db.select().from(payments).where(eq(payments.transferReference, opened.data.reference));
    expect(pay).toMatchObject({ status: "paid", receivedCents: o!.deposit });
    const { resolveTransfer } = await import("../../app/admin/accounts/transfers/actions");
    await as("sales@ostrevane.example");
    expect(await resolveTransfer({ fundsId: f!.id, note: "Returned the excess" })).toMatchObject({ ok: false, code: "forbidden" });
    await as("accounts@ostrevane.example");
    expect(await resolveTransfer({ fundsId: f!.id, note: "Returned $50.00 to the lab's account" })).toMatchObject({ ok: true });
    expect((await fundsBy(opened.data.reference))[0]).toMatchObject({ resolution: "Returned $50.00 to the lab's account" });
    expect(await resolveTransfer({ fundsId: f!.id, note: "Again" })).toMatchObject({ ok: false, code: "conflict:resolved" });
  });

  it("a transfer with an unknown reference applies to nothing and waits for accounts; a wrong reference is refused, the right one applies it", async () => {
    const [o] = await db.select({ id: orders.id, orgId: orders.orgId, balance: orders.balanceCents }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Cockpit liner plug"));
    await as("buyer@bramblewake.example");
    const { payByTransfer } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const opened = await payByTransfer({ orderId: o!.id, kind: "balance" });
    expect(opened.ok, opened.ok ? "" : opened.message).toBe(true);
    if (!opened.ok) return;
    await deliver();
    const before = await db.select().from(payments).where(eq(payments.orgId, o!.orgId));
    expect(await arrive(o!.orgId, 12_345, "NOT-A-REF")).toEqual(["transfer_unmatched"]);
    expect(await db.select().from(payments).where(eq(payments.orgId, o!.orgId))).toEqual(before);
    const [f] = await fundsBy("NOT-A-REF");
    expect(f).toMatchObject({ status: "unmatched", appliedCents: 0, paymentId: null, orgId: o!.orgId });
    await as("accounts@ostrevane.example");
    const { resolveTransfer } = await import("../../app/admin/accounts/transfers/actions");
    const wrong = await resolveTransfer({ fundsId: f!.id, note: "Payer typo", applyToReference: "ZZZZZZZZZZ" });
    expect(wrong).toMatchObject({ ok: false, code: "not_found:reference" });
    expect((await fundsBy("NOT-A-REF"))[0]!.resolvedAt).toBeNull();
    const ok = await resolveTransfer({ fundsId: f!.id, note: "Payer typed the PO number; matched by amount and firm", applyToReference: opened.data.reference });
    expect(ok.ok, ok.ok ? "" : ok.message).toBe(true);
    const [pay] = await db.select().from(payments).where(eq(payments.transferReference, opened.data.reference));
    expect(pay).toMatchObject({ status: "pending", receivedCents: 12_345 });
    expect((await fundsBy("NOT-A-REF"))[0]).toMatchObject({ paymentId: pay!.id, appliedCents: 12_345 });
  });

  it("a transfer that settles an invoice on terms after its due date is marked late", async () => {
    const [o] = await db.select({ id: orders.id, orgId: orders.orgId, balance: orders.balanceCents }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Tensile coupon layup plate"));
    const due = new Date(Date.now() - 10 * 86_400_000);
    await db.update(orders).set({ paymentTerms: "net30", invoicedAt: new Date(due.getTime() - 30 * 86_400_000), dueAt: due }).where(eq(orders.id, o!.id));
    const [bal] = await db.select().from(payments).where(and(eq(payments.orderId, o!.id), eq(payments.kind, "balance")));
    // The seeded balance may already be paid; make it the open invoice this case needs.
    await db.update(payments).set({ status: "pending", paidAt: null, receiptNumber: null, checkoutSessionId: null, paymentIntentId: null, receivedCents: 0 }).where(eq(payments.id, bal!.id));
    await as("lab@tarnavel.example");
    const { payByTransfer } = await import("../../app/(portal)/portal/(member)/requests/[id]/actions");
    const opened = await payByTransfer({ orderId: o!.id, kind: "balance" });
    expect(opened.ok, opened.ok ? "" : opened.message).toBe(true);
    if (!opened.ok) return;
    await deliver();
    expect(await arrive(o!.orgId, bal!.amountCents, opened.data.reference, new Date(due.getTime() + 3 * 86_400_000))).toEqual(["transfer_late"]);
    expect((await paymentOf(bal!.id)).status).toBe("paid");
  });
});

describe("an invoice on terms", () => {
  it("carries the bank-transfer details and reference opened for it when the order ships", async () => {
    const [o] = await db.select({ id: orders.id, requestId: orders.requestId, total: orders.totalCents }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Stiffener drill jig"));
    await db.update(orders).set({ carrier: "Ridgeline Freight", trackingNumber: "RF-22" }).where(eq(orders.id, o!.id));
    await as("production@ostrevane.example");
    const { moveStage } = await import("../../app/admin/production/actions");
    const moved = await moveStage({ orderId: o!.id, to: "shipped" });
    expect(moved.ok, moved.ok ? "" : moved.message).toBe(true);
    const [bal] = await db.select().from(payments).where(and(eq(payments.orderId, o!.id), eq(payments.kind, "balance")));
    expect(bal).toMatchObject({ method: "bank_transfer", status: "pending", amountCents: o!.total });
    const [inv] = await db.select().from(issuedDocuments).where(and(eq(issuedDocuments.sourceId, o!.id), eq(issuedDocuments.kind, "invoice")));
    expect(inv!.data).toMatchObject({ paymentTerms: "Net 30", transfer: { reference: bal!.transferReference, routingNumber: "110000000" } });
    expect((inv!.data as { dueText: string }).dueText).toMatch(/^Due by .+ \(Net 30: 30 days from the invoice date\)/);
  });
});

describe("a payment recorded by accounts", () => {
  it("needs the amount confirmed, never more than is owed, accounts' role; then pays it with the reference", async () => {
    const [o] = await db.select({ id: orders.id }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.projectName, "Cockpit liner plug"));
    const [pay] = await db.select().from(payments).where(and(eq(payments.orderId, o!.id), eq(payments.kind, "balance"), eq(payments.status, "pending")));
    const owed = pay!.amountCents - pay!.receivedCents;
    const { recordManualPayment } = await import("../../app/admin/accounts/transfers/actions");
    await as("production@ostrevane.example");
    expect(await recordManualPayment({ paymentId: pay!.id, amountCents: owed, reference: "CHQ-1001", confirmAmountCents: owed })).toMatchObject({ ok: false, code: "forbidden" });
    await as("accounts@ostrevane.example");
    expect(await recordManualPayment({ paymentId: pay!.id, amountCents: owed, reference: "CHQ-1001" })).toMatchObject({ ok: false, code: "invalid_input:confirmation" });
    const over = await recordManualPayment({ paymentId: pay!.id, amountCents: owed + 1, reference: "CHQ-1001", confirmAmountCents: owed + 1 });
    expect(over).toMatchObject({ ok: false, code: "invalid_input:amount" });
    expect(await recordManualPayment({ paymentId: pay!.id, amountCents: owed, reference: "x", confirmAmountCents: owed })).toMatchObject({ ok: false, code: "invalid_input" });
    expect(await paymentOf(pay!.id)).toEqual(pay);
    const ok = await recordManualPayment({ paymentId: pay!.id, amountCents: owed, reference: "CHQ-1001", confirmAmountCents: owed });
    expect(ok).toMatchObject({ ok: true, data: { isPaid: true } });
    const after = await paymentOf(pay!.id);
    expect(after).toMatchObject({ status: "paid", receivedCents: pay!.amountCents, externalReference: "CHQ-1001" });
    expect(after.receiptNumber).toMatch(/^RC-/);
    expect(await recordManualPayment({ paymentId: pay!.id, amountCents: 100, reference: "CHQ-1002", confirmAmountCents: 100 })).toMatchObject({ ok: false, code: "conflict:payment" });
  });
});
