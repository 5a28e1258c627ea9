import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { ne } from "drizzle-orm";
import { analyses, fileRevisions, memberships, parts, requests } from "../../db/schema";
import { analysisPoll, requestStatus } from "../../lib/contracts/portal";
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
