import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { analyses, fileRevisions, parts, requests } from "../../db/schema";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { dbRef } from "../support/integration";

vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

let t: TestDb;
// The health door is public: it never reads a session, so the sign-in module stays out.
vi.mock("@/lib/auth/config", () => ({ auth: async () => null }));

let route: (req: Request) => Promise<Response>;
const GET = () => route(new Request("http://localhost/api/health"));

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  dbRef.db = t.db;
  ({ GET: route } = await import("../../app/api/health/route"));
}, 120_000);
afterAll(() => t?.close());

describe("GET /api/health", () => {
  it("answers 200 with the database, the estimator pool and the backlog, and nothing else", async () => {
    const res = await GET();
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const body = await res.json();
    expect(Object.keys(body).sort()).toEqual(["database", "estimator", "jobs", "status", "time", "uptimeS"]);
    expect(body.status).toBe("ok");
    expect(body.database.ok).toBe(true);
    expect(body.database.latencyMs).toBeGreaterThanOrEqual(0);
    expect(body.estimator).toMatchObject({ running: 0, queued: 0 });
    expect(body.jobs.analyses).toMatchObject({ queued: expect.any(Number), running: expect.any(Number) });
    // No record's content: no e-mail address, id or file name appears anywhere in the answer.
    const text = JSON.stringify(body);
    expect(text).not.toMatch(/@|\.stl|\.step|secret|token/i);
  });

  it("reports a long-waiting analysis as degraded, still 200", async () => {
    const [rev] = await t.db
      .select({ id: fileRevisions.id })
      .from(fileRevisions)
      .innerJoin(parts, eq(parts.id, fileRevisions.partId))
      .innerJoin(requests, eq(requests.id, parts.requestId))
      .limit(1);
    expect(rev).toBeTruthy();
    await t.db.insert(analyses).values({ revisionId: rev!.id, status: "queued", options: {}, createdAt: new Date(Date.now() - 3600_000) });
    const res = await GET();
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.status).toBe("degraded");
    expect(body.jobs.analyses.oldestQueuedAgeS).toBeGreaterThan(3000);
  });

  it("answers 503 when the database does not", async () => {
    const real = dbRef.db;
    dbRef.db = { run: async () => { throw new Error("disk I/O error"); } };
    try {
      const res = await GET();
      expect(res.status).toBe(503);
      expect((await res.json()).status).toBe("down");
    } finally {
      dbRef.db = real;
    }
  });
});
