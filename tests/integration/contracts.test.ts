import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { ne } from "drizzle-orm";
import { analyses, fileRevisions, memberships, parts, requests, users } from "../../db/schema";
import { analysisPoll, requestStatus } from "../../lib/contracts/portal";
import { actualsAnswer, boardAnswer, calendarAnswer } from "../../lib/contracts/production";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

let t: TestDb;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  dbRef.db = t.db;
}, 120_000);
afterAll(() => t?.close());

/** A seeded request with a finished analysis, and the client who made it. */
async function seededAnalysis() {
  const [row] = await t.db
    .select({ analysisId: analyses.id, requestId: requests.id, createdById: requests.createdById, orgId: requests.orgId })
    .from(analyses)
    .innerJoin(fileRevisions, eq(fileRevisions.id, analyses.revisionId))
    .innerJoin(parts, eq(parts.id, fileRevisions.partId))
    .innerJoin(requests, eq(requests.id, parts.requestId))
    .where(eq(analyses.status, "done"))
    .limit(1);
  return row!;
}

describe("the portal's polled answers keep their contracts (lib/contracts/portal.ts)", () => {
  it("an analysis's progress and estimate, as the client's view", async () => {
    const a = await seededAnalysis();
    session.current = { user: { id: a.createdById } };
    const { GET } = await import("@/app/api/portal/analyses/[id]/route");
    const res = await GET(new Request(`http://x/api/portal/analyses/${a.analysisId}`), { params: Promise.resolve({ id: a.analysisId }) });
    expect(res.status).toBe(200);
    const body = analysisPoll.parse(await res.json());
    expect(body).toMatchObject({ id: a.analysisId, status: "done", progress: 1 });
    expect(body.result?.totalCents).toBeGreaterThan(0);
  });

  it("a request's stage, and another firm's request is not found", async () => {
    const a = await seededAnalysis();
    session.current = { user: { id: a.createdById } };
    const { GET } = await import("@/app/api/portal/requests/[id]/route");
    const res = await GET(new Request(`http://x/api/portal/requests/${a.requestId}`), { params: Promise.resolve({ id: a.requestId }) });
    expect(res.status).toBe(200);
    expect(requestStatus.parse(await res.json()).id).toBe(a.requestId);
    const [stranger] = await t.db.select({ id: memberships.userId }).from(memberships).where(ne(memberships.orgId, a.orgId)).limit(1);
    session.current = { user: { id: stranger!.id } };
    const other = await GET(new Request(`http://x/api/portal/requests/${a.requestId}`), { params: Promise.resolve({ id: a.requestId }) });
    expect(other.status).toBe(404);
  });
});

describe("production's answers keep their contracts (lib/contracts/production.ts)", () => {
  async function asProduction() {
    const [p] = await t.db.select({ id: users.id }).from(users).where(eq(users.role, "production")).limit(1);
    session.current = { user: { id: p!.id } };
  }

  it("the board: every column with its count and cards, each card's stage one the screens name", async () => {
    await asProduction();
    const { GET } = await import("@/app/api/admin/board/route");
    const res = await GET(new Request("http://x/api/admin/board"));
    expect(res.status).toBe(200);
    const body = boardAnswer.parse(await res.json());
    expect(body.columns.length).toBeGreaterThan(3);
    expect(body.columns.reduce((n, c) => n + c.cards.length, 0)).toBeGreaterThan(0);
  });

  it("a cell's calendar and the actuals report", async () => {
    await asProduction();
    const cal = await (await import("@/app/api/admin/calendar/route")).GET(new Request("http://x/api/admin/calendar?cell=long-bed&from=2026-11-01&days=60"));
    expect(cal.status).toBe(200);
    expect(calendarAnswer.parse(await cal.json()).cell.key).toBe("long-bed");
    const act = await (await import("@/app/api/admin/reports/actuals/route")).GET(new Request("http://x/api/admin/reports/actuals"));
    expect(act.status).toBe(200);
    expect(actualsAnswer.parse(await act.json()).perOrder.length).toBeGreaterThan(0);
  });
});
