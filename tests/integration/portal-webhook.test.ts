import Stripe from "stripe";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { emailOutbox, orders, payments, requests, stageEvents, webhookEvents } from "../../db/schema";
import { startResendFake, type ResendFake } from "../../mocks/resend/server";
import { resetEnvCache } from "../../lib/env";
import { resetResendClient } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef } from "../support/integration";

vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
// The webhook's door takes no session (its access is the signature); the sign-in module stays out.
vi.mock("@/lib/auth/config", () => ({ auth: async () => null }));

const SECRET = "whsec_layerwright_local";
let t: TestDb;
let db: Db;
let resend: ResendFake;
let POST: (req: Request) => Promise<Response>;
let orderId: string;
let requestId: string;
let paymentId: string;
let amount: number;
let n = 0;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  db = t.db;
  dbRef.db = db;
  resend = await startResendFake({
    port: 0,
    // The app writes what the e-mail API accepted to its own outbox.
    store: () => {},
    log: () => {},
  });
  process.env.RESEND_BASE_URL = resend.url;
  process.env.STRIPE_WEBHOOK_SECRET = SECRET;
  resetEnvCache();
  resetResendClient();
  ({ POST } = await import("../../app/api/webhooks/stripe/route"));
}, 120_000);
afterAll(async () => {
  await resend?.close();
  t?.close();
});

/** The seeded order that waits for its deposit, with a fresh pending payment and session. */
beforeEach(async () => {
  const [row] = await db
    .select({ orderId: orders.id, requestId: requests.id, deposit: orders.depositCents, orgId: orders.orgId })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .where(eq(requests.stage, "accepted"));
  if (!row) {
    // A previous case moved it on: put it back for the next case.
    const [moved] = await db.select({ id: requests.id }).from(requests).where(eq(requests.projectName, "Composite coupon drill fixture"));
    await db.update(requests).set({ stage: "accepted" }).where(eq(requests.id, moved!.id));
    return;
  }
  ({ orderId, requestId } = row);
  amount = row.deposit;
  await db.delete(payments).where(eq(payments.orderId, orderId));
  const [p] = await db
    .insert(payments)
    .values({ orderId, orgId: row.orgId, kind: "deposit", status: "pending", amountCents: amount, checkoutSessionId: `cs_test_case_${++n}` })
    .returning({ id: payments.id });
  paymentId = p!.id;
});

async function resetCase() {
  await db.update(requests).set({ stage: "accepted" }).where(eq(requests.id, requestId));
  await db.delete(payments).where(eq(payments.orderId, orderId));
  const [o] = await db.select({ orgId: orders.orgId }).from(orders).where(eq(orders.id, orderId));
  const [p] = await db
    .insert(payments)
    .values({ orderId, orgId: o!.orgId, kind: "deposit", status: "pending", amountCents: amount, checkoutSessionId: `cs_test_case_${++n}` })
    .returning({ id: payments.id });
  paymentId = p!.id;
}

function sessionEvent(type: string, over: Partial<Record<string, unknown>> = {}, eventId = `evt_${Math.random().toString(36).slice(2)}`) {
  return {
    id: eventId,
    object: "event",
    api_version: "2025-01-01",
    created: Math.floor(Date.now() / 1000),
    type,
    data: {
      object: {
        id: `cs_test_case_${n}`,
        object: "checkout.session",
        amount_total: amount,
        currency: "usd",
        payment_status: type === "checkout.session.expired" ? "unpaid" : "paid",
        status: type === "checkout.session.expired" ? "expired" : "complete",
        payment_intent: `pi_case_${n}`,
        client_reference_id: paymentId,
        metadata: { paymentId, orderId },
        ...over,
      },
    },
  };
}

async function deliver(event: object, secret = SECRET, tamper?: (s: string) => string) {
  const payload = JSON.stringify(event);
  const header = Stripe.webhooks.generateTestHeaderString({ payload, secret });
  const res = await POST(new Request("http://localhost/api/webhooks/stripe", { method: "POST", body: tamper ? tamper(payload) : payload, headers: { "stripe-signature": header, "content-type": "application/json" } }));
  return { status: res.status, body: (await res.json()) as { outcome?: string } };
}

const paymentRow = async () => (await db.select().from(payments).where(eq(payments.id, paymentId)))[0]!;
const stageOf = async () => (await db.select({ s: requests.stage }).from(requests).where(eq(requests.id, requestId)))[0]!.s;
const depositEvents = async () => (await db.select().from(stageEvents).where(and(eq(stageEvents.requestId, requestId), eq(stageEvents.toStage, "deposit_paid")))).length;

describe("Stripe webhook", () => {
  it("records a completed deposit once, moves the order to deposit_paid and e-mails the client", async () => {
    await resetCase();
    const ev = sessionEvent("checkout.session.completed");
    const first = await deliver(ev);
    expect(first).toEqual({ status: 200, body: expect.objectContaining({ outcome: "paid_stage_moved" }) });
    const p = await paymentRow();
    expect(p.status).toBe("paid");
    expect(p.paymentIntentId).toBe(`pi_case_${n}`);
    expect(await stageOf()).toBe("deposit_paid");
    expect(await depositEvents()).toBe(1);
    const mail = await db.select().from(emailOutbox).where(eq(emailOutbox.subject, `Deposit received for ${(await db.select({ r: requests.reference }).from(requests).where(eq(requests.id, requestId)))[0]!.r}`));
    expect(mail).toHaveLength(1);

    // Replay of the same event id: nothing changes.
    const replay = await deliver(ev);
    expect(replay.body.outcome).toBe("duplicate");
    // Another event id for the same session (Stripe may send both completed and async_succeeded).
    const again = await deliver(sessionEvent("checkout.session.async_payment_succeeded"));
    expect(again.body.outcome).toBe("already_paid");
    expect(await depositEvents()).toBe(1);
    expect((await db.select().from(payments).where(eq(payments.orderId, orderId))).filter((x) => x.status === "paid")).toHaveLength(1);
  });

  it("answers 400 to a forged or tampered event and writes nothing", async () => {
    await resetCase();
    const ev = sessionEvent("checkout.session.completed");
    const forged = await deliver(ev, "whsec_someone_else");
    expect(forged.status).toBe(400);
    const tampered = await deliver(ev, SECRET, (s) => s.replace(`"amount_total":${amount}`, `"amount_total":1`));
    expect(tampered.status).toBe(400);
    const noHeader = await POST(new Request("http://localhost/api/webhooks/stripe", { method: "POST", body: JSON.stringify(ev) }));
    expect(noHeader.status).toBe(400);
    expect((await paymentRow()).status).toBe("pending");
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, ev.id))).toHaveLength(0);
    expect(await stageOf()).toBe("accepted");
  });

  it("logs an unknown session and an unknown type with 200 and no write", async () => {
    await resetCase();
    const unknown = sessionEvent("checkout.session.completed", { id: "cs_test_nobody", client_reference_id: null, metadata: {} });
    const r = await deliver(unknown);
    expect(r).toEqual({ status: 200, body: expect.objectContaining({ outcome: "unknown_session" }) });
    expect(await db.select().from(webhookEvents).where(eq(webhookEvents.id, unknown.id))).toHaveLength(0);
    const other = await deliver({ ...sessionEvent("customer.created"), data: { object: { id: "cus_1", object: "customer" } } });
    expect(other).toEqual({ status: 200, body: expect.objectContaining({ outcome: "ignored_type" }) });
    expect((await paymentRow()).status).toBe("pending");
  });

  it("handles events out of order: a late expiry leaves a paid deposit paid", async () => {
    await resetCase();
    expect((await deliver(sessionEvent("checkout.session.completed"))).body.outcome).toBe("paid_stage_moved");
    expect((await deliver(sessionEvent("checkout.session.expired"))).body.outcome).toBe("expired_noop");
    expect((await paymentRow()).status).toBe("paid");
    expect(await stageOf()).toBe("deposit_paid");
  });

  it("handles a completion that arrives before the session id was stored (matched by metadata)", async () => {
    await resetCase();
    await db.update(payments).set({ checkoutSessionId: null }).where(eq(payments.id, paymentId));
    expect((await deliver(sessionEvent("checkout.session.completed"))).body.outcome).toBe("paid_stage_moved");
    expect((await paymentRow()).checkoutSessionId).toBe(`cs_test_case_${n}`);
  });

  it("an expired (abandoned) session leaves the order payable again", async () => {
    await resetCase();
    expect((await deliver(sessionEvent("checkout.session.expired"))).body.outcome).toBe("expired");
    expect((await paymentRow()).status).toBe("expired");
    expect(await stageOf()).toBe("accepted");
    // A completion for a session that had been marked expired (delivered late) still records the money.
    expect((await deliver(sessionEvent("checkout.session.completed"))).body.outcome).toBe("paid_stage_moved");
  });

  it("refuses to record a payment whose amount does not match", async () => {
    await resetCase();
    const r = await deliver(sessionEvent("checkout.session.completed", { amount_total: amount - 1 }));
    expect(r.body.outcome).toBe("amount_mismatch");
    expect((await paymentRow()).status).toBe("pending");
    expect(await stageOf()).toBe("accepted");
  });

  it("ten parallel deliveries of one event: all answered 200, taken once", async () => {
    await resetCase();
    const movesBefore = await depositEvents();
    const ev = sessionEvent("checkout.session.completed");
    const answers = await Promise.all(Array.from({ length: 10 }, () => deliver(ev)));
    expect(answers.map((a) => a.status)).toEqual(Array(10).fill(200));
    expect(answers.filter((a) => a.body.outcome === "paid_stage_moved")).toHaveLength(1);
    expect(answers.filter((a) => a.body.outcome === "duplicate")).toHaveLength(9);
    // Earlier cases moved the same order too: only this event's move is new.
    expect((await depositEvents()) - movesBefore).toBe(1);
    expect((await db.select().from(webhookEvents).where(eq(webhookEvents.id, ev.id))).length).toBe(1);
  });
});
