import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { memberships, requests, users } from "../../db/schema";
import type * as ListRoute from "../../app/api/portal/requests/route";
import type * as MeRoute from "../../app/api/portal/me/route";
import type * as RequestQueries from "../../db/queries/requests";
import { growOrders } from "../../lib/scripts/grow-orders";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
// The list's query, counted, so a reused answer can be told from one built again.
vi.mock("@/db/queries/requests", async (importOriginal) => {
  const real = await importOriginal<typeof RequestQueries>();
  return { ...real, listRequestsForScope: vi.fn(real.listRequestsForScope) };
});

interface Answer { total: number; nextCursor: string | null; rows: Record<string, unknown>[] }

let t: TestDb;
let db: Db;
let route: typeof ListRoute;
let meRoute: typeof MeRoute;
let lead: { id: string; orgId: string };
let engineer: { id: string; orgId: string };

async function member(email: string) {
  const [row] = await db.select({ id: users.id, orgId: memberships.orgId }).from(users).innerJoin(memberships, eq(memberships.userId, users.id)).where(eq(users.email, email));
  return row!;
}

async function list(as: { id: string }, query = ""): Promise<{ status: number; requestId: string | null; body: Answer }> {
  session.current = { user: { id: as.id } };
  const res = await route.GET(new Request(`http://localhost/api/portal/requests${query}`));
  return { status: res.status, requestId: res.headers.get("x-request-id"), body: (await res.json()) as Answer };
}

/** The count straight from the table, to check the answer's total against. */
async function counted(orgId: string, extra = sql`1 = 1`): Promise<number> {
  const [row] = await db.all<{ n: number }>(sql`select count(*) as n from requests where org_id = ${orgId} and ${extra}`);
  return Number(row!.n);
}

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date() });
  db = t.db;
  dbRef.db = db;
  await growOrders(t.url, 300);
  lead = await member("lead@caldrith.example");
  engineer = await member("engineer@caldrith.example");
  route = await import("../../app/api/portal/requests/route");
  meRoute = await import("../../app/api/portal/me/route");
}, 120_000);
afterAll(() => t?.close());

describe("GET /api/portal/requests (the route)", () => {
  it("answers { total, nextCursor, rows } with the row fields the table reads, and its request id", async () => {
    const { status, requestId, body } = await list(lead, "?limit=5");
    expect(status).toBe(200);
    expect(requestId).toMatch(/^[0-9a-f-]{36}$/);
    expect(Object.keys(body).sort()).toEqual(["nextCursor", "rows", "total"]);
    expect(body.total).toBe(await counted(lead.orgId));
    expect(body.rows).toHaveLength(5);
    expect(Object.keys(body.rows[0]!).sort()).toEqual(["createdByName", "hasOrder", "id", "isControlled", "neededBy", "partCount", "projectName", "reference", "stage", "totalCents", "updatedAt"]);
  });

  it("keeps the total true across requests added, moved between stages and deleted (the count is reused only while nothing changed)", async () => {
    const firmBefore = (await list(lead)).body.total;
    const ownBefore = (await list(engineer)).body.total;
    const draftsBefore = (await list(lead, "?stage=draft")).body.total;
    expect(draftsBefore).toBe(await counted(lead.orgId, sql`stage = 'draft'`));
    // the same answer twice: served with the reused count
    expect((await list(lead)).body.total).toBe(firmBefore);

    const id = crypto.randomUUID();
    const now = Date.now();
    await db.run(sql`insert into requests (id, reference, org_id, created_by_id, stage, project_name, created_at, updated_at) values (${id}, ${"LW-2099-0001"}, ${engineer.orgId}, ${engineer.id}, 'draft', 'Count check fixture', ${now}, ${now})`);
    expect((await list(lead)).body.total).toBe(firmBefore + 1);
    expect((await list(engineer)).body.total).toBe(ownBefore + 1);
    expect((await list(lead, "?stage=draft")).body.total).toBe(draftsBefore + 1);

    await db.update(requests).set({ stage: "submitted" }).where(eq(requests.id, id));
    expect((await list(lead, "?stage=draft")).body.total).toBe(draftsBefore);
    expect((await list(lead, "?stage=submitted")).body.total).toBe(await counted(lead.orgId, sql`stage = 'submitted'`));

    await db.delete(requests).where(eq(requests.id, id));
    expect((await list(lead)).body.total).toBe(firmBefore);
    expect((await list(engineer)).body.total).toBe(ownBefore);
  });

  it("serves the same answer again while nothing is committed, and a committed change at once (a project renamed, which no counter watches)", async () => {
    const { dataVersion } = await import("../../db/client");
    const before = dataVersion(db);
    expect(before).not.toBeNull();
    const { listRequestsForScope } = await import("@/db/queries/requests");
    const built = vi.mocked(listRequestsForScope);
    const first = await list(lead, "?limit=10&sort=reference&dir=asc");
    const builds = built.mock.calls.length;
    const again = await list(lead, "?limit=10&sort=reference&dir=asc");
    expect(again.body).toEqual(first.body);
    expect(built.mock.calls.length).toBe(builds); // served again, not built again
    expect(dataVersion(db)).toBe(before); // nothing in the request's path writes
    const row = first.body.rows[0]!;
    await db.update(requests).set({ projectName: "Renamed while listed" }).where(eq(requests.id, String(row.id)));
    expect(dataVersion(db)).not.toBe(before);
    const after = await list(lead, "?limit=10&sort=reference&dir=asc");
    expect(built.mock.calls.length).toBe(builds + 1);
    expect(after.body.rows[0]).toMatchObject({ id: row.id, projectName: "Renamed while listed" });
    await db.update(requests).set({ projectName: String(row.projectName) }).where(eq(requests.id, String(row.id)));
    expect((await list(lead, "?limit=10&sort=reference&dir=asc")).body.rows[0]).toMatchObject({ projectName: row.projectName });
  });

  it("counts a search afresh every time, notes included (the change counter does not watch notes)", async () => {
    const [one] = await db.select({ id: requests.id, notes: requests.notes }).from(requests).where(eq(requests.orgId, lead.orgId)).limit(1);
    const word = "zqxmarkerword";
    expect((await list(lead, `?q=${word}`)).body.total).toBe(0);
    await db.run(sql`update requests set notes = ${`checked ${word}`} where id = ${one!.id}`);
    expect((await list(lead, `?q=${word}`)).body.total).toBe(1);
    await db.run(sql`update requests set notes = ${one!.notes} where id = ${one!.id}`);
    expect((await list(lead, `?q=${word}`)).body.total).toBe(0);
  });
});

describe("GET /api/portal/me (who the static portal home draws for)", () => {
  async function me(email: string | null) {
    session.current = email ? { user: { id: (await member(email)).id } } : null;
    const res = await meRoute.GET(new Request("http://localhost/api/portal/me"));
    return { status: res.status, body: (await res.json()) as Record<string, unknown> };
  }

  it("answers the signed-in user's name, e-mail and role, and nothing else", async () => {
    const lead = await me("lead@caldrith.example");
    expect(lead.status).toBe(200);
    expect(lead.body).toEqual({ name: expect.any(String), email: "lead@caldrith.example", role: "client_admin" });
    expect((await me("engineer@caldrith.example")).body.role).toBe("client");
  });

  it("answers 401 signed out, and a disabled account is signed out", async () => {
    expect((await me(null)).status).toBe(401);
    const engineer = await member("engineer@caldrith.example");
    await db.update(users).set({ disabledAt: new Date() }).where(eq(users.id, engineer.id));
    expect((await me("engineer@caldrith.example")).status).toBe(401);
    await db.update(users).set({ disabledAt: null }).where(eq(users.id, engineer.id));
    expect((await me("engineer@caldrith.example")).status).toBe(200);
  });
});
