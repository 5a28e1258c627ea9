import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { emailOutbox, orders, payments, quotes, requests } from "../../db/schema";
import { startResendFake, type ResendFake } from "../../mocks/resend/server";
import { resetEnvCache } from "../../lib/env";
import { resetResendClient } from "../../lib/email/send";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { formatDate } from "../../lib/dates";
import { dbRef } from "../support/integration";

vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

let t: TestDb;
let db: Db;
let resend: ResendFake;

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
  resend = await startResendFake({
    port: 0,
    // The app writes what the e-mail API accepted to its own outbox.
    store: () => {},
    log: () => {},
  });
  process.env.RESEND_BASE_URL = resend.url;
  resetEnvCache();
  resetResendClient();
}, 120_000);
afterAll(async () => {
  await resend?.close();
  t?.close();
});

const byProject = async (name: string) => (await db.select().from(requests).where(eq(requests.projectName, name)))[0]!;
const orderOf = async (requestId: string) => (await db.select().from(orders).where(eq(orders.requestId, requestId)))[0]!;
const lastMail = async () => (await db.select().from(emailOutbox)).at(-1)!;
const norm = (s: string | null) => (s ?? "").replace(/\s+/g, " ");

describe("notify", () => {
  it("request received: to the client and to the sales inbox", async () => {
    const n = await import("../../lib/email/notify");
    const r = await byProject("Inlet duct layup tool");
    await n.notifyRequestReceived(r.id);
    const rows = await db.select().from(emailOutbox);
    const client = rows.find((m) => m.subject === `Request ${r.reference} received`);
    const sales = rows.find((m) => m.subject.startsWith(`New request ${r.reference}`));
    expect(client?.toAddresses).toEqual(["engineer@caldrith.example"]);
    expect(sales?.toAddresses).toEqual(["sales@ostrevane.example"]);
    expect(norm(sales!.text)).toContain("flagged controlled");
  });

  it("quote ready, scheduled (with dates), shipped (with tracking), balance due, payment received", async () => {
    const n = await import("../../lib/email/notify");
    const quoted = await byProject("Deck hatch plug");
    const [q] = await db.select().from(quotes).where(eq(quotes.requestId, quoted.id));
    await n.notifyQuoteReady(q!.id);
    expect((await lastMail()).subject).toBe(`Quote 1 for ${quoted.reference} is ready`);

    const scheduled = await byProject("Fairing trim fixture");
    const so = await orderOf(scheduled.id);
    await n.notifyScheduled(so.id);
    const sm = await lastMail();
    expect(sm.subject).toBe(`${scheduled.reference} is scheduled`);
    // Dates in e-mails are the plant's days, in the one format of lib/dates.ts.
    const fmt = (d: Date) => formatDate(d);
    expect(norm(sm.text)).toContain(fmt(so.plannedStart!));
    expect(norm(sm.text)).toContain(fmt(so.plannedShip!));

    const shipped = await byProject("Cockpit liner plug");
    const sh = await orderOf(shipped.id);
    await n.notifyShipped(sh.id);
    const shm = await lastMail();
    expect(norm(shm.text)).toContain(sh.trackingNumber!);
    expect(shm.toAddresses).toContain("buyer@bramblewake.example");

    await n.notifyBalanceDue(sh.id);
    expect((await lastMail()).subject).toBe(`Balance due for ${shipped.reference}`);

    const [paid] = await db.select().from(payments).where(eq(payments.orderId, sh.id));
    await n.notifyDepositReceived(paid!.id);
    const receipt = await lastMail();
    expect(receipt.subject).toMatch(new RegExp(`received for ${shipped.reference}$`));
    // Our receipt number and our receipt page; none of the processor's ids.
    expect(paid!.receiptNumber).toMatch(/^RC-\d{4}-\d{5}$/);
    expect(norm(receipt.text)).toContain(`Receipt ${paid!.receiptNumber}`);
    expect(norm(receipt.text)).toContain(`/portal/payments/${paid!.id}`);
    expect(receipt.text).not.toMatch(/\b(pi|ch|cs_test|re)_/);
  });

  it("throws for an unknown id, so the caller can log it", async () => {
    const n = await import("../../lib/email/notify");
    await expect(n.notifyShipped("no-such-order")).rejects.toThrow(/not found/);
    await expect(n.notifyQuoteReady("no-such-quote")).rejects.toThrow(/not found/);
});
});
