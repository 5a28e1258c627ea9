import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { createClientFirmWithAdmin, isEmailTaken } from "../../db/queries/organisations";
import { transitionStage } from "../../lib/orders/transition";
import { memberships, organisations, requests, stageEvents, users, auditLog } from "../../db/schema";
import { FLOW } from "../../lib/orders/stages";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

// The guard reads the session through Auth.js; here the session is whatever the test says.
vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

let t: TestDb;
let db: Db;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  db = t.db;
  dbRef.db = db;
});
afterAll(() => t?.close());

async function userId(email: string) {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  return u!.id;
}

describe("seeded demo", () => {
  it("has one request in every stage of the order's life, on hold and cancelled too", async () => {
    const rows = await db.select({ stage: requests.stage }).from(requests);
    const stages = new Set(rows.map((r) => r.stage));
    for (const stage of [...FLOW, "on_hold", "cancelled"] as const) expect(stages.has(stage), stage).toBe(true);
  });
  it("stores passwords only as bcrypt hashes", async () => {
    const rows = await db.select({ h: users.passwordHash }).from(users);
    for (const r of rows) expect(r.h).toMatch(/^\$2[aby]\$10\$/);
  });
});

describe("sign-up", () => {
  it("creates a firm whose first user is its client_admin, in one transaction", async () => {
    const r = await createClientFirmWithAdmin(db, { name: "Rowan Tilly", firmName: "Peat Moss Marine", email: "rowan@peatmoss.example", passwordHash: "x", unitsPref: "in" });
    const [u] = await db.select().from(users).where(eq(users.id, r.userId));
    expect(u?.role).toBe("client_admin");
    const [m] = await db.select().from(memberships).where(eq(memberships.userId, r.userId));
    expect(m?.orgId).toBe(r.orgId);
    expect(await isEmailTaken(db, "ROWAN@peatmoss.example")).toBe(true);
  });
  it("gives a second firm of the same name its own slug", async () => {
    const a = await createClientFirmWithAdmin(db, { name: "A", firmName: "Same Name", email: "a@same.example", passwordHash: "x", unitsPref: "mm" });
    const b = await createClientFirmWithAdmin(db, { name: "B", firmName: "Same Name", email: "b@same.example", passwordHash: "x", unitsPref: "mm" });
    const slugs = await db.select({ slug: organisations.slug }).from(organisations).where(eq(organisations.name, "Same Name"));
    expect(new Set(slugs.map((s) => s.slug)).size).toBe(2);
    expect(a.orgId).not.toBe(b.orgId);
  });
});

describe("the guard", () => {
  it("loads the signed-in user fresh from the database, with the firm", async () => {
    const { getCurrentUser } = await import("../../lib/auth/guard");
    session.current = { user: { id: await userId("engineer@caldrith.example") } };
    const u = await getCurrentUser();
    expect(u?.role).toBe("client");
    expect(u?.orgId).toBeTruthy();
  });
  it("treats a disabled account as signed out", async () => {
    const { getCurrentUser } = await import("../../lib/auth/guard");
    const id = await userId("lab@tarnavel.example");
    await db.update(users).set({ disabledAt: new Date() }).where(eq(users.id, id));
    session.current = { user: { id } };
    expect(await getCurrentUser()).toBeNull();
    await db.update(users).set({ disabledAt: null }).where(eq(users.id, id));
  });
  it("answers another firm's record with not_found, never forbidden", async () => {
    const { assertCanSee } = await import("../../lib/auth/guard");
    const me = { id: "u", role: "client_admin" as const, orgId: "org-a", isControlledCleared: false };
    expect(() => assertCanSee(me, { orgId: "org-b" }, "order")).toThrowError(expect.objectContaining({ code: "not_found:order" }));
    expect(() => assertCanSee(me, { orgId: "org-a" }, "order")).not.toThrow();
  });
  it("requireRole refuses other roles with forbidden", async () => {
    const { requireRole } = await import("../../lib/auth/guard");
    session.current = { user: { id: await userId("sales@ostrevane.example") } };
    await expect(requireRole("accounts")).rejects.toMatchObject({ code: "forbidden" });
    await expect(requireRole("sales", "admin")).resolves.toMatchObject({ role: "sales" });
    session.current = null;
    await expect(requireRole("sales")).rejects.toMatchObject({ code: "unauthenticated" });
  });
});

describe("stage transitions in the database", () => {
  it("records an allowed move with who and when, and refuses a skip with the reason, writing nothing", async () => {
    const [draft] = await db.select({ id: requests.id }).from(requests).where(eq(requests.stage, "draft")).limit(1);
    const actor = await userId("engineer@caldrith.example");
    const before = (await db.select().from(stageEvents).where(eq(stageEvents.requestId, draft!.id))).length;
    await expect(transitionStage(db, { requestId: draft!.id, to: "printing", actorId: actor })).rejects.toMatchObject({ code: "conflict:stage" });
    expect((await db.select().from(stageEvents).where(eq(stageEvents.requestId, draft!.id))).length).toBe(before);

    await transitionStage(db, { requestId: draft!.id, to: "submitted", actorId: actor });
    const [row] = await db.select().from(requests).where(eq(requests.id, draft!.id));
    expect(row?.stage).toBe("submitted");
    expect(row?.submittedAt).toBeInstanceOf(Date);
    const events = await db.select().from(stageEvents).where(eq(stageEvents.requestId, draft!.id));
    expect(events.at(-1)).toMatchObject({ fromStage: "draft", toStage: "submitted", actorId: actor });
    const audit = await db.select().from(auditLog).where(eq(auditLog.entityId, draft!.id));
    expect(audit.some((a) => a.action === "stage.change")).toBe(true);
  });
  it("lets only one of two racing moves from the same stage win", async () => {
    const [row] = await db.select({ id: requests.id }).from(requests).where(eq(requests.stage, "packed")).limit(1);
    const results = await Promise.allSettled([
      transitionStage(db, { requestId: row!.id, to: "shipped", actorId: null, expectedFrom: "packed" }),
      transitionStage(db, { requestId: row!.id, to: "shipped", actorId: null, expectedFrom: "packed" }),
    ]);
    expect(results.filter((r) => r.status === "fulfilled")).toHaveLength(1);
  });
  it("returns a held order to the stage it was held from, and nowhere else", async () => {
    const [held] = await db.select({ id: requests.id, from: requests.heldFromStage }).from(requests).where(eq(requests.stage, "on_hold")).limit(1);
    await expect(transitionStage(db, { requestId: held!.id, to: "printing", actorId: null })).rejects.toMatchObject({ code: "conflict:stage" });
    await transitionStage(db, { requestId: held!.id, to: held!.from!, actorId: null });
    const [after] = await db.select({ stage: requests.stage }).from(requests).where(eq(requests.id, held!.id));
    expect(after?.stage).toBe(held!.from);
  });
});
