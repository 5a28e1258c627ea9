import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { readFileSync } from "node:fs";
import { fileRevisions, parts, requests, uploads, users } from "../../db/schema";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { startFileServer } from "../helpers/file-server";
import { createTestDb, type TestDb } from "../helpers/test-db";
import type * as PoolModule from "../../lib/estimating/pool";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
const files = vi.hoisted(() => new Map<string, Uint8Array>());
// Storage: the route hands the worker a signed URL; here it points at a small local file server.
const storage = vi.hoisted(() => ({ base: "" }));
vi.mock("@/lib/uploads/uploadthing", () => ({
  fetchUploadedFile: async (key: string) => files.get(key)!,
  signedFileUrl: async (key: string) => `${storage.base}/${key}`,
}));
const poolMode = vi.hoisted(() => ({ full: false }));
vi.mock("@/lib/estimating/pool", async (importOriginal) => {
  const real = await importOriginal<typeof PoolModule>();
  return {
    ...real,
    getEstimatePool: () => (poolMode.full ? { tryReserve: () => ({ reason: "full", retryAfterS: 7 }) } : real.getEstimatePool()),
  };
});

let t: TestDb;
let db: Db;
let uploadId: string;
let POST: (req: Request) => Promise<Response>;
let server: Awaited<ReturnType<typeof startFileServer>>;

beforeAll(async () => {
  server = await startFileServer(files);
  storage.base = server.base;
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, "engineer@caldrith.example"));
  session.current = { user: { id: u!.id } };
  files.set("kbox", binaryStl(box(600, 300, 150)));
  const [up] = await db.insert(uploads).values({ fileKey: "kbox", fileName: "box.stl", sizeBytes: 1, url: "http://127.0.0.1:1/f/kbox", userId: u!.id, purpose: "model" }).returning({ id: uploads.id });
  uploadId = up!.id;
  ({ POST } = await import("../../app/api/estimate/route"));
}, 120_000);
afterAll(async () => {
  t?.close();
  await server?.close();
});

const call = (body: unknown) => POST(new Request("http://localhost/api/estimate", { method: "POST", body: JSON.stringify(body), headers: { "content-type": "application/json" } }));

describe("POST /api/estimate", () => {
  it("returns the engine's JSON for the caller's upload", async () => {
    const res = await call({ uploadId, options: { materialKey: "pc-cf", allowanceMm: 5, units: "mm" } });
    expect(res.status).toBe(200);
    const r = (await res.json()) as { kind: string; volumeMm3: number; allowanceMm: number; format: string };
    expect(r).toMatchObject({ kind: "estimate", allowanceMm: 5, format: "stl-binary" });
    expect(r.volumeMm3).toBeCloseTo(600 * 300 * 150, 0);
  }, 60_000);

  it("answers 503 with Retry-After when the queue is full", async () => {
    poolMode.full = true;
    const res = await call({ uploadId });
    poolMode.full = false;
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("7");
  });

  it("lets one user have two estimates in flight, answering a third with 429 and Retry-After", async () => {
    const [first, second, third] = await Promise.all([call({ uploadId }), call({ uploadId }), call({ uploadId })]);
    expect([first.status, second.status].sort()).toEqual([200, 200]);
    expect(third.status).toBe(429);
    expect(Number(third.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(((await third.json()) as { error: { code: string } }).error.code).toBe("busy:yours");
    // Shares come back when the jobs end.
    expect((await call({ uploadId })).status).toBe(200);
  }, 60_000);

  it("tells a missing stored file apart from a bad one", async () => {
    const me = session.current!.user.id;
    const [gone] = await db.insert(uploads).values({ fileKey: "kgone", fileName: "gone.stl", sizeBytes: 1, url: "http://127.0.0.1:1/f/kgone", userId: me, purpose: "model" }).returning({ id: uploads.id });
    const missing = await call({ uploadId: gone!.id });
    expect(missing.status).toBe(502);
    expect(((await missing.json()) as { error: { code: string } }).error.code).toBe("bad_gateway:storage");
    files.set("kpdf", new TextEncoder().encode("%PDF-1.7\n" + "x".repeat(2000)));
    const [pdf] = await db.insert(uploads).values({ fileKey: "kpdf", fileName: "drawing.stl", sizeBytes: 1, url: "http://127.0.0.1:1/f/kpdf", userId: me, purpose: "model" }).returning({ id: uploads.id });
    const bad = await call({ uploadId: pdf!.id });
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as { error: { code: string } }).error.code).toBe("unprocessable:file:type");
  }, 60_000);

  it("refuses unknown options, strangers' uploads and the signed-out", async () => {
    expect((await call({ uploadId, options: { evil: true } })).status).toBe(400);
    const keep = session.current;
    const [other] = await db.select({ id: users.id }).from(users).where(eq(users.email, "buyer@bramblewake.example"));
    session.current = { user: { id: other!.id } };
    expect((await call({ uploadId })).status).toBe(404);
    session.current = null;
    expect((await call({ uploadId })).status).toBe(401);
    session.current = keep;
  });
});

describe("STEP files in the portal (issue 7 item 5)", () => {
  it("estimates a STEP upload and serves its tessellated mesh to the preview", async () => {
    // "Cube 10x10.stp": a 10 mm cube from occt-import-js's test files (origin in mocks/fixtures/cad/README.md).
    const step = new Uint8Array(readFileSync("mocks/fixtures/cad/cube-10x10.stp"));
    files.set("kstep", step);
    const me = session.current!.user.id;
    const [up] = await db.insert(uploads).values({ fileKey: "kstep", fileName: "cube.step", sizeBytes: step.length, url: "http://127.0.0.1:1/f/kstep", userId: me, purpose: "model" }).returning({ id: uploads.id });
    const res = await call({ uploadId: up!.id, options: { materialKey: "pc-cf" } });
    expect(res.status).toBe(200);
    const r = (await res.json()) as { format: string; bboxMm: number[]; volumeMm3: number };
    expect(r.format).toBe("step");
    for (const v of r.bboxMm) expect(v).toBeCloseTo(10, 3);
    expect(r.volumeMm3).toBeCloseTo(1000, 0);

    const [req] = await db.select({ id: requests.id }).from(requests).where(eq(requests.createdById, me)).limit(1);
    const [p] = await db.insert(parts).values({ requestId: req!.id, name: "Cube", materialKey: "pc-cf", allowanceMm: 1 }).returning({ id: parts.id });
    const [rev] = await db.insert(fileRevisions).values({ partId: p!.id, revision: 1, uploadId: up!.id, fileKey: "kstep", fileName: "cube.step", sizeBytes: step.length, uploadedById: me }).returning({ id: fileRevisions.id });
    const { GET } = await import("../../app/api/portal/revisions/[id]/mesh/route");
    const mesh = await GET(new Request(`http://localhost/api/portal/revisions/${rev!.id}/mesh`), { params: Promise.resolve({ id: rev!.id }) });
    expect(mesh.status).toBe(200);
    const tri = new Float32Array(await mesh.arrayBuffer());
    // A cube tessellates to 12 triangles, 9 floats each, 10 mm along each axis.
    expect(tri.length).toBe(12 * 9);
    for (let axis = 0; axis < 3; axis++) {
      const v = Array.from(tri).filter((_, i) => i % 3 === axis);
      expect(Math.max(...v) - Math.min(...v)).toBeCloseTo(10, 3);
    }
  }, 60_000);
});
