/**
 * Back-office rules people met in the browser: the quote editor's prefill and its errors, the
 * stage form never stepping back unasked, a shipped job freeing its cell, the processing fee
 * recorded so paid deposits reconcile, findings that can be annotated and resolved, and refunds
 * that need their amount confirmed and tell the client.
 */
import Stripe from "stripe";
import { and, eq } from "drizzle-orm";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { openDb, type Db } from "../../db/client";
import { seed } from "@/lib/seed/seed";
import { processorObjectsFor } from "@/lib/seed/processor";
import { orders, payments, refunds, requests, scheduleBlocks, stageEvents } from "../../db/schema";
import type { Stage } from "../../db/schema/common";
import { resetEnvCache } from "../../lib/env";
import { resetStripeClient } from "../../lib/payments/stripe";
import { migrateDatabase } from "../../lib/scripts/migrate";
import { startStripeFake, type StripeFake } from "../../mocks/stripe/server";
import { USER_BY_ROLE, userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
const notify = vi.hoisted(() => ({
  notifyQuoteReady: vi.fn(async (_id: string) => undefined),
  notifyScheduled: vi.fn(async (_id: string) => undefined),
  notifyShipped: vi.fn(async (_id: string) => undefined),
  notifyBalanceDue: vi.fn(async (_id: string) => undefined),
  notifyStaffMessage: vi.fn(async (_id: string) => undefined),
  notifyDepositReceived: vi.fn(async (_id: string) => undefined),
  notifyRefund: vi.fn(async (_id: string) => undefined),
}));
vi.mock("@/lib/email/notify", () => notify);

const SECRET = "whsec_layerwright_local";
let db: Db;
let close: () => void;
let fake: StripeFake;
let dataDir: string;
const uid = {} as Record<"sales" | "production" | "accounts" | "admin", string>;
const as = (role: keyof typeof uid) => (session.current = { user: { id: uid[role] } });

beforeAll(async () => {
  dataDir = mkdtempSync(path.join(os.tmpdir(), "layerwright-rules-"));
  const url = `file:${path.join(dataDir, "t.db")}`;
  await migrateDatabase(url);
  const opened = openDb(url);
  db = opened.db;
  dbRef.db = db;
  close = () => opened.client.close();
  const seeded = await seed(db, { dataDir, quiet: true, fileBaseUrl: "http://127.0.0.1:1/f" });
  for (const r of ["sales", "production", "accounts", "admin"] as const) uid[r] = await userIdOf(db, USER_BY_ROLE[r]);
  fake = await startStripeFake({ port: 0, dataDir: null, log: () => undefined, webhookUrl: "http://127.0.0.1:1/none" });
  Object.assign(process.env, { STRIPE_API_HOST: "127.0.0.1", STRIPE_API_PORT: String(fake.port), STRIPE_API_PROTOCOL: "http", STRIPE_WEBHOOK_SECRET: SECRET });
  resetEnvCache();
  resetStripeClient();
  const res = await fetch(`${fake.url}/_fake/objects`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(processorObjectsFor(seeded.processorRecords)) });
  expect(res.status).toBe(200);
}, 180_000);
afterAll(async () => {
  await fake?.close();
  close?.();
  rmSync(dataDir, { recursive: true, force: true });
});

async function orderIn(stage: Stage) {
  const [o] = await db.select({ id: orders.id, requestId: orders.requestId, orgId: orders.orgId }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, stage));
  return o!;
}
const stageOf = async (requestId: string) => (await db.select({ s: requests.stage }).from(requests).where(eq(requests.id, requestId)))[0]!.s;
const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const period = `from=${day(-360)}&to=${day(1)}`;

describe("quote editor", () => {
  it("leaves estimate lines priced at nothing out of the prefill, so the prefilled quote issues as it is", async () => {
    const { linesFromEstimates } = await import("@/lib/quoting/lines");
    const { saveQuote } = await import("@/app/admin/sales/actions");
    const { getRequestForSales } = await import("@/db/queries/sales-requests");
    as("sales");
    const [r] = await db.select({ id: requests.id }).from(requests).where(eq(requests.stage, "submitted"));
    const s = (await getRequestForSales(db, r!.id))!;
    const estimates = s.parts.map((p) => {
      const lines = (p.analysis!.result as { lines: { key: string; label: string; quantity: number; unit: string; unitCents: number; amountCents: number }[] }).lines;
      // What the estimate gives a part that needs no dwell: a 0 h line.
      return { partId: p.id, partName: p.name, lines: [...lines.filter((l) => l.key !== "dwell"), { key: "dwell", label: "Cooling dwell between layers", quantity: 0, unit: "h", unitCents: 6_500, amountCents: 0 }] };
    });
    const lines = linesFromEstimates(estimates);
    expect(lines.some((l) => l.quantity === 0)).toBe(false);
    const base = { requestId: r!.id, basisAnalysisIds: s.parts.map((p) => p.analysis!.id), marginBp: 2_000, taxBp: 0, depositBp: 5_000, validityDays: 30 };
    expect(await saveQuote({ ...base, lines, issue: false })).toMatchObject({ ok: true, data: { status: "draft" } });
  });

  it("names and marks the line at fault when a line is invalid", async () => {
    const { saveQuote } = await import("@/app/admin/sales/actions");
    as("sales");
    const [r] = await db.select({ id: requests.id }).from(requests).where(eq(requests.stage, "submitted"));
    const good = { partId: null, kind: "freight" as const, description: "Freight", quantity: 1, unitCents: 10_000, amountCents: 10_000, estimatedCents: null, editReason: "Wide load" };
    const res = await saveQuote({ requestId: r!.id, basisAnalysisIds: [], lines: [good, { ...good, description: "Escort", quantity: 0, amountCents: 0 }], marginBp: 0, taxBp: 0, depositBp: 5_000, validityDays: 30 });
    expect(res.ok).toBe(false);
    if (res.ok) return;
    expect(res.message).toBe("Line 2: Quantity must be above zero.");
    expect(res.fieldErrors?.["lines.1"]).toEqual(["Quantity must be above zero."]);
  });
});

describe("stage moves", () => {
  it("a step back along the flow needs confirming and a reason; nothing changes without them", async () => {
    const { moveStage } = await import("@/app/admin/production/actions");
    as("production");
    const o = await orderIn("inspection");
    const events = async () => (await db.select().from(stageEvents).where(eq(stageEvents.requestId, o.requestId))).length;
    const before = await events();
    expect(await moveStage({ orderId: o.id, to: "machining" })).toMatchObject({ ok: false, code: "invalid_input:confirmation" });
    expect(await moveStage({ orderId: o.id, to: "machining", confirm: "machining" })).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { note: [expect.stringMatching(/why/)] } });
    expect(await stageOf(o.requestId)).toBe("inspection");
    expect(await events()).toBe(before);
    expect(await moveStage({ orderId: o.id, to: "machining", confirm: "machining", note: "Flange face out of flatness; re-cut" })).toMatchObject({ ok: true, data: { to: "machining" } });
    // Forward moves need no confirmation.
    expect(await moveStage({ orderId: o.id, to: "inspection" })).toMatchObject({ ok: true, data: { to: "inspection" } });
  });

  it("the form lists the next forward stage first, then steps back, then hold and cancel", async () => {
    const { orderMoves } = await import("@/lib/orders/stages");
    const moves = (from: Stage, to: Stage[]) => orderMoves(from, to.map((stage) => ({ stage }))).map((m) => m.stage);
    expect(moves("inspection", ["machining", "finishing", "on_hold"])).toEqual(["finishing", "machining", "on_hold"]);
    expect(moves("scheduled", ["on_hold", "cancelled", "printing"])).toEqual(["printing", "on_hold", "cancelled"]);
    expect(moves("deposit_paid", ["cancelled", "on_hold"])).toEqual(["on_hold", "cancelled"]);
  });
});

describe("the cell calendar", () => {
  it("a shipped job frees its remaining planned time, and a shipped job's blocks never refuse a booking", async () => {
    const { moveStage, scheduleOrder } = await import("@/app/admin/production/actions");
    as("production");
    const packed = await orderIn("packed");
    await db.update(orders).set({ carrier: "Tidewater Haulage", trackingNumber: "TW-9001" }).where(eq(orders.id, packed.id));
    const soon = Date.now() + 40 * 86_400_000;
    const later = { orderId: packed.id, cellKey: "compact", kind: "finishing" as const, startsAt: new Date(soon), endsAt: new Date(soon + 86_400_000) };
    await db.insert(scheduleBlocks).values(later);
    expect(await moveStage({ orderId: packed.id, to: "shipped" })).toMatchObject({ ok: true });
    const left = await db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, packed.id));
    expect(left.every((b) => b.endsAt.getTime() <= Date.now())).toBe(true);

    // A shipped job whose plan was never trimmed (older data) does not hold the cell either.
    const shipped = await orderIn("shipped");
    const at = new Date(Date.UTC(2032, 0, 5, 12));
    await db.insert(scheduleBlocks).values({ orderId: shipped.id, cellKey: "compact", kind: "print", startsAt: at, endsAt: new Date(at.getTime() + 30 * 86_400_000) });
    const paid = await orderIn("deposit_paid");
    expect(await scheduleOrder({ orderId: paid.id, cellKey: "compact", start: "2032-01-06T06:00" })).toMatchObject({ ok: true });
  });

  it("reads the typed print start as the plant's wall-clock time", async () => {
    const { PLANT_TIME_ZONE, fromPlantInput } = await import("@/lib/dates");
    const o = await orderIn("scheduled");
    const [row] = await db.select({ start: orders.plannedStart }).from(orders).where(eq(orders.id, o.id));
    expect(PLANT_TIME_ZONE).toMatch(/^[A-Za-z_]+\/[A-Za-z_]+$/);
    const { scheduleOrder } = await import("@/app/admin/production/actions");
    as("production");
    const res = await scheduleOrder({ orderId: o.id, cellKey: "tall-frame", start: "2033-02-07T06:00" });
    expect(res).toMatchObject({ ok: true });
    const [after] = await db.select({ start: orders.plannedStart }).from(orders).where(eq(orders.id, o.id));
    expect(after!.start?.toISOString()).toBe(fromPlantInput("2033-02-07T06:00")!.toISOString());
    expect(after!.start?.toISOString()).not.toBe(row!.start?.toISOString());
  });
});

describe("payments reconcile", () => {
  it("a deposit paid in the app records the processor's fee and reconciles as matched", async () => {
    const { openCheckout } = await import("@/lib/payments/checkout");
    const { POST } = await import("@/app/api/webhooks/stripe/route");
    const { GET } = await import("@/app/api/admin/reconciliation/route");
    const o = await orderIn("accepted");
    const checkout = await openCheckout(db, { orderId: o.id, kind: "deposit", userId: uid.admin, email: "buyer@firm.example", appUrl: "http://localhost:3000" });
    const sessionId = /\/(cs_[A-Za-z0-9_]+)/.exec(checkout.url ?? "")?.[1];
    expect(sessionId).toBeTruthy();
    const paid = await fetch(`${fake.url}/_fake/pay/${sessionId}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ card: "4242 4242 4242 4242" }) });
    expect(paid.status).toBe(200);
    const events = (await (await fetch(`${fake.url}/_fake/events`)).json()) as { data: { id: string; type: string; data: { object: { id: string } } }[] };
    const event = events.data.find((e) => e.type === "checkout.session.completed" && e.data.object.id === sessionId)!;
    const { delivery: _d, ...plain } = event as typeof event & { delivery?: unknown };
    const payload = JSON.stringify(plain);
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: SECRET });
    const res = await POST(new Request("http://t/api/webhooks/stripe", { method: "POST", headers: { "stripe-signature": signature }, body: payload }));
    expect(res.status).toBe(200);

    const [p] = await db.select().from(payments).where(and(eq(payments.orderId, o.id), eq(payments.kind, "deposit"), eq(payments.status, "paid")));
    // The fake's test fee: 2.9 % + 30 ¢ (mocks/stripe/api.ts), rounded to the cent.
    expect(p!.feeCents).toBe(Math.round(p!.amountCents * 0.029) + 30);
    expect(p!.chargeId).toMatch(/^ch_/);

    as("accounts");
    const rec = (await (await GET(new Request(`http://t/api/admin/reconciliation?${period}`))).json()) as { findings: { kind: string; paymentId: string | null; subject: string }[] };
    expect(rec.findings.filter((f) => f.paymentId === p!.id && f.subject === "payment").map((f) => f.kind)).toEqual(["matched"]);
  });

  it("a finding can be annotated and resolved; the note stays with it", async () => {
    const { noteFinding } = await import("@/app/admin/accounts/actions");
    const { GET } = await import("@/app/api/admin/reconciliation/route");
    as("accounts");
    type F = { kind: string; findingKey: string; isResolved: boolean; notes: { note: string; author: string | null }[] };
    const list = async () => ((await (await GET(new Request(`http://t/api/admin/reconciliation?${period}`))).json()) as { findings: F[] }).findings;
    const mismatch = (await list()).find((f) => f.kind === "amount_mismatch")!;
    expect(mismatch.isResolved).toBe(false);
    expect(await noteFinding({ findingKey: mismatch.findingKey, note: "x" })).toMatchObject({ ok: false, code: "invalid_input" });
    expect(await noteFinding({ findingKey: mismatch.findingKey, note: "Asked the processor; a chargeback fee, booked by hand", resolve: true })).toMatchObject({ ok: true });
    const again = (await list()).find((f) => f.findingKey === mismatch.findingKey)!;
    expect(again).toMatchObject({ kind: "amount_mismatch", isResolved: true, notes: [{ note: "Asked the processor; a chargeback fee, booked by hand" }] });
    as("sales");
    expect(await noteFinding({ findingKey: mismatch.findingKey, note: "not mine to write" })).toMatchObject({ ok: false, code: "forbidden" });
  });
});

describe("refunds", () => {
  it("move no money until the amount is confirmed, then e-mail the client", async () => {
    const { refundPayment } = await import("@/app/admin/accounts/actions");
    as("accounts");
    // The deposit paid through the processor above (the seeded set holds deliberate mismatches).
    const [p] = await db.select().from(payments).where(and(eq(payments.status, "paid"), eq(payments.orderId, (await orderIn("deposit_paid")).id)));
    const before = (await db.select().from(refunds)).length;
    const ask = { paymentId: p!.id, amountCents: 5_000, reason: "Crate damaged in the yard", idempotencyKey: "refund-confirm-0001" };
    expect(await refundPayment(ask)).toMatchObject({ ok: false, code: "invalid_input:confirmation" });
    expect(await refundPayment({ ...ask, confirmAmountCents: 4_000 })).toMatchObject({ ok: false, code: "invalid_input:confirmation" });
    expect((await db.select().from(refunds)).length).toBe(before);
    expect(notify.notifyRefund).not.toHaveBeenCalled();
    const done = await refundPayment({ ...ask, confirmAmountCents: 5_000 });
    expect(done, JSON.stringify(done)).toMatchObject({ ok: true });
    expect(notify.notifyRefund).toHaveBeenCalledWith(done.ok ? done.data.refundId : "");
  });
});

describe("inspection reports", () => {
  it("are filed with the order as soon as they are uploaded, once, and reach the client's order page", async () => {
    const { fileInspectionReport } = await import("@/app/admin/production/actions");
    const { listDocuments } = await import("@/db/queries/documents");
    const { recordUpload } = await import("@/db/queries/files");
    const { uploads, documents } = await import("../../db/schema");
    const o = await orderIn("inspection");
    const up = await recordUpload(db, { fileKey: "report-key-1", fileName: "cmm-report.pdf", sizeBytes: 2_048, url: "http://127.0.0.1:1/f/report-key-1", contentType: "application/pdf", userId: uid.production, orgId: null, purpose: "inspection_report" });
    as("production");
    const first = await fileInspectionReport({ orderId: o.id, uploadId: up.id });
    expect(first).toMatchObject({ ok: true, data: { fileName: "cmm-report.pdf" } });
    // A second click (or a retried request) files nothing new.
    const again = await fileInspectionReport({ orderId: o.id, uploadId: up.id });
    expect(again.ok && first.ok && again.data.documentId === first.data.documentId).toBe(true);
    const clientSees = (await listDocuments(db, o.requestId)).filter((d) => d.kind === "inspection_report");
    expect(clientSees.map((d) => d.fileName)).toEqual(["cmm-report.pdf"]);
    expect(clientSees[0]!.hasFile).toBeTruthy();

    // Another kind of upload, or one that does not exist, is refused and files nothing.
    const model = await recordUpload(db, { fileKey: "model-key-1", fileName: "tool.stl", sizeBytes: 84, url: "http://127.0.0.1:1/f/model-key-1", contentType: null, userId: uid.production, orgId: null, purpose: "model" });
    expect(await fileInspectionReport({ orderId: o.id, uploadId: model.id })).toMatchObject({ ok: false, code: "not_found:upload" });
    expect(await fileInspectionReport({ orderId: o.id, uploadId: "no-such-upload" })).toMatchObject({ ok: false, code: "not_found:upload" });
    expect((await db.select().from(documents).where(and(eq(documents.requestId, o.requestId), eq(documents.kind, "inspection_report")))).length).toBe(1);
    expect((await db.select().from(uploads).where(eq(uploads.id, model.id))).length).toBe(1);

    // Sales may not file reports (production:record).
    as("sales");
    expect(await fileInspectionReport({ orderId: o.id, uploadId: up.id })).toMatchObject({ ok: false, code: "forbidden" });
  });
});
