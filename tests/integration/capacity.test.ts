import { and, eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { emailOutbox, maintenanceBlocks, orders, requests, scheduleBlocks, shipDateChanges } from "../../db/schema";
import { startResendFake, type ResendFake } from "../../mocks/resend/server";
import { binaryStl, drillFixture } from "../../mocks/fixtures/meshes";
import { resetEnvCache } from "../../lib/env";
import { resetResendClient } from "../../lib/email/send";
import { formatDate } from "../../lib/dates";
import { analyse } from "../../lib/estimating/analyse";
import { Ledger } from "../../lib/estimating/ledger";
import { workingHoursBetween } from "../../lib/estimating/schedule";
import { plantOf } from "../../lib/estimating/stages/schedule";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { USER_BY_ROLE, userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", async () => (await import("../support/integration")).nextCacheMock);

let t: TestDb;
let db: Db;
let resend: ResendFake;
const now = new Date();

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now });
  db = t.db;
  dbRef.db = db;
  resend = await startResendFake({ port: 0, store: () => {}, log: () => {} });
  process.env.RESEND_BASE_URL = resend.url;
  resetEnvCache();
  resetResendClient();
}, 180_000);
afterAll(async () => {
  await resend?.close();
  t?.close();
});

const as = async (role: "production" | "sales") => (session.current = { user: { id: await userIdOf(db, USER_BY_ROLE[role]) } });
const norm = (s: string | null) => (s ?? "").replace(/\s+/g, " ");

describe("the demo calendar in estimates", () => {
  it("a new estimate on a booked cell waits about the booked hours ahead of it; expedite is earlier or equal and dearer", async () => {
    const { loadCapacityQueue } = await import("../../lib/analysis/capacity-queue");
    const { loadCatalogue } = await import("../../db/queries/catalogue");
    const cat = (await loadCatalogue(db))!;
    const queue = await loadCapacityQueue(db, now, cat.cells.map((c) => c.key));
    // the cell of the demo's scheduled job (it prints in two days)
    const [sched] = await db.select({ cellKey: orders.cellKey }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, "scheduled"));
    const cellKey = sched!.cellKey!;
    expect(queue.booked![cellKey]!.length).toBeGreaterThan(0);
    const bytes = binaryStl(drillFixture());
    const input = { bytes, fileName: "fixture.stl", options: { cellKey, materialKey: "abs-cf" }, catalogue: cat, now };
    const idle = await analyse(input);
    const busy = await analyse({ ...input, queue: queue.hours, booked: queue.booked });
    // booked working hours on the cell between now and where the new job sets up
    const cell = cat.cells.find((c) => c.key === cellKey)!, plant = plantOf(cat.rateCard);
    const tl = new Ledger(queue, now.getTime(), plant).timeline(cellKey, cell.calendar);
    const setup = new Date(busy.schedule.setupStart).getTime();
    const bookedAhead = tl.intervals().filter(([a]) => a < setup).reduce((s, [a, b]) => s + workingHoursBetween(new Date(a), new Date(Math.min(b, setup)), cell.calendar, plant), 0);
    expect(bookedAhead).toBeGreaterThan(0);
    expect(busy.shipDate > idle.shipDate).toBe(true);
    // the wait is the booked hours, plus at most one working day of a gap too short for the job
    const day = cell.calendar.shiftsPerDay * cell.calendar.hoursPerShift;
    expect(busy.schedule.queueHours - idle.schedule.queueHours).toBeGreaterThanOrEqual(bookedAhead - 0.01);
    expect(busy.schedule.queueHours - idle.schedule.queueHours).toBeLessThanOrEqual(bookedAhead + day);
    for (const r of [idle, busy]) {
      const ex = r.leadTimes.find((l) => l.key === "expedite")!;
      expect(ex.shipDate <= r.shipDate).toBe(true);
      expect(ex.totalCents).toBeGreaterThan(r.totalCents);
    }
  }, 60_000);

  it("the demo has a maintenance block on a cell and on the router", async () => {
    const rows = await db.select().from(maintenanceBlocks);
    expect(rows.map((r) => r.resourceKey).sort()).toEqual(["long-bed", "router"]);
  });
});

describe("moving a booked job", () => {
  it("refuses a start in the past and changes nothing", async () => {
    const { moveBookedJob } = await import("../../app/admin/production/orders/[id]/actions");
    await as("production");
    const [o] = await db.select({ id: orders.id, plannedShip: orders.plannedShip }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, "scheduled"));
    const before = await db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, o!.id));
    const r = await moveBookedJob({ orderId: o!.id, start: new Date(now.getTime() - 3 * 86_400_000).toISOString(), reason: "Trying the past" });
    expect(r).toMatchObject({ ok: false, code: "invalid_input:start" });
    expect(r.ok ? "" : r.message).toMatch(/has passed.*Nothing was changed/);
    expect(await db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, o!.id))).toEqual(before);
    expect(await db.select().from(shipDateChanges)).toHaveLength(0);
  });

  it("sales may not move a job", async () => {
    const { moveBookedJob } = await import("../../app/admin/production/orders/[id]/actions");
    await as("sales");
    const [o] = await db.select({ id: orders.id }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, "scheduled"));
    expect(await moveBookedJob({ orderId: o!.id, start: new Date(now.getTime() + 9 * 86_400_000).toISOString(), reason: "Not mine to move" })).toMatchObject({ ok: false, code: "forbidden" });
  });

  it("a delay of a week e-mails the client both dates and the reason, and the timeline records it", async () => {
    const { moveBookedJob } = await import("../../app/admin/production/orders/[id]/actions");
    await as("production");
    const [o] = await db.select({ id: orders.id, plannedShip: orders.plannedShip, reference: requests.reference }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, "scheduled"));
    const [print] = await db.select().from(scheduleBlocks).where(and(eq(scheduleBlocks.orderId, o!.id), eq(scheduleBlocks.kind, "print")));
    const start = new Date(print!.startsAt.getTime() + 7 * 86_400_000);
    const r = await moveBookedJob({ orderId: o!.id, start: start.toISOString(), reason: "The resin lot failed its moisture check; a new lot arrives next week." });
    expect(r.ok).toBe(true);
    const [after] = await db.select({ plannedShip: orders.plannedShip }).from(orders).where(eq(orders.id, o!.id));
    expect(after!.plannedShip!.getTime()).toBeGreaterThan(o!.plannedShip!.getTime());
    const [change] = await db.select().from(shipDateChanges).where(eq(shipDateChanges.orderId, o!.id));
    expect(change).toMatchObject({ isNotified: true, reason: "The resin lot failed its moisture check; a new lot arrives next week." });
    const mail = (await db.select().from(emailOutbox).where(inArray(emailOutbox.subject, [`${o!.reference}: planned ship date now ${formatDate(change!.toDate)}`])))[0];
    expect(mail, "the client's e-mail").toBeTruthy();
    expect(mail!.toAddresses).toEqual(["engineer@caldrith.example"]);
    const text = norm(mail!.text);
    expect(text).toContain(`from ${formatDate(change!.fromDate)} to ${formatDate(change!.toDate)}`);
    expect(text).toContain("resin lot failed its moisture check");
    // sales sees the order whose promised date no longer holds
    const { listBrokenPromises } = await import("../../db/queries/ship-dates");
    const broken = await listBrokenPromises(db);
    expect(broken.map((b) => b.orderId)).toContain(o!.id);
    // the client's timeline carries the change
    const { listShipDateChanges } = await import("../../db/queries/ship-dates");
    expect((await listShipDateChanges(db, o!.id)).map((c) => c.reason)).toEqual([change!.reason]);
  });
});

describe("a step finishing early", () => {
  it("a print that ends early brings the planned ship forward and records the change; an end before the start is refused", async () => {
    const { recordBlockEnd } = await import("../../app/admin/production/orders/[id]/actions");
    await as("production");
    const [o] = await db.select({ id: orders.id }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(eq(requests.stage, "printing"));
    const [print] = await db.select().from(scheduleBlocks).where(and(eq(scheduleBlocks.orderId, o!.id), eq(scheduleBlocks.kind, "print")));
    const before = await db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, o!.id));
    const bad = await recordBlockEnd({ orderId: o!.id, kind: "print", endsAt: new Date(print!.startsAt.getTime() - 3_600_000).toISOString(), reason: "Typo in the time" });
    expect(bad).toMatchObject({ ok: false, code: "invalid_input" });
    expect(bad.ok ? "" : bad.message).toMatch(/before it started.*Nothing was changed/);
    expect(await db.select().from(scheduleBlocks).where(eq(scheduleBlocks.orderId, o!.id))).toEqual(before);
    // the print ends now, earlier than planned (it is half-way through in the demo)
    const endsAt = new Date(Math.max(print!.startsAt.getTime() + 3_600_000, Date.now()));
    const ok = await recordBlockEnd({ orderId: o!.id, kind: "print", endsAt: endsAt.toISOString(), reason: "The last layers went faster than planned." });
    expect(ok.ok).toBe(true);
    const [after] = await db.select().from(scheduleBlocks).where(and(eq(scheduleBlocks.orderId, o!.id), eq(scheduleBlocks.kind, "print")));
    expect(after!.endsAt.getTime()).toBe(endsAt.getTime());
    const [change] = await db.select().from(shipDateChanges).where(eq(shipDateChanges.orderId, o!.id));
    expect(change!.toDate.getTime()).toBeLessThan(change!.fromDate!.getTime());
  });
});

describe("maintenance blocks", () => {
  it("refuse a time a booked job holds the cell, an unknown cell, and an end in the past; a free time is blocked", async () => {
    const { blockResource } = await import("../../app/admin/production/capacity/actions");
    await as("production");
    const before = (await db.select().from(maintenanceBlocks)).length;
    const [held] = await db.select().from(scheduleBlocks).innerJoin(orders, eq(orders.id, scheduleBlocks.orderId)).innerJoin(requests, eq(requests.id, orders.requestId)).where(and(eq(requests.stage, "scheduled"), eq(scheduleBlocks.kind, "print")));
    const clash = await blockResource({ resourceKey: held!.schedule_blocks.cellKey, start: held!.schedule_blocks.startsAt.toISOString(), end: held!.schedule_blocks.endsAt.toISOString(), reason: "Nozzle swap" });
    expect(clash).toMatchObject({ ok: false, code: "conflict:schedule" });
    expect(await blockResource({ resourceKey: "lathe", start: new Date(now.getTime() + 86_400_000).toISOString(), end: new Date(now.getTime() + 2 * 86_400_000).toISOString(), reason: "Nozzle swap" })).toMatchObject({ ok: false, code: "not_found:cell" });
    expect(await blockResource({ resourceKey: "compact", start: new Date(now.getTime() - 3 * 86_400_000).toISOString(), end: new Date(now.getTime() - 2 * 86_400_000).toISOString(), reason: "Nozzle swap" })).toMatchObject({ ok: false, code: "invalid_input:end" });
    expect((await db.select().from(maintenanceBlocks)).length).toBe(before);
    const far = new Date(now.getTime() + 200 * 86_400_000);
    const ok = await blockResource({ resourceKey: "compact", start: far.toISOString(), end: new Date(far.getTime() + 8 * 3_600_000).toISOString(), reason: "Bed levelling" });
    expect(ok.ok).toBe(true);
    expect((await db.select().from(maintenanceBlocks)).length).toBe(before + 1);
  });
});
