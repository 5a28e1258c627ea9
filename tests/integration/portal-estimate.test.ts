import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { uploads, users } from "../../db/schema";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { createTestDb, type TestDb } from "../helpers/test-db";

const session = vi.hoisted(() => ({ current: null as null | { user: { id: string } } }));
vi.mock("@/lib/auth/config", () => ({ auth: async () => session.current }));
const dbRef = vi.hoisted(() => ({ db: null as unknown }));
vi.mock("@/db/client", async (importOriginal) => ({ ...(await importOriginal<object>()), getDb: () => dbRef.db }));
const files = vi.hoisted(() => new Map<string, Uint8Array>());
vi.mock("@/lib/uploads/uploadthing", () => ({ fetchUploadedFile: async (key: string) => files.get(key)! }));
const poolMode = vi.hoisted(() => ({ full: false }));
vi.mock("@/lib/estimating/pool", async (importOriginal) => {
  const real = await importOriginal<typeof import("../../lib/estimating/pool")>();
  return {
    ...real,
    getEstimatePool: () => (poolMode.full ? { run: () => Promise.reject(new real.QueueFullError(7)) } : real.getEstimatePool()),
  };
});

let t: TestDb;
let db: Db;
let uploadId: string;
let POST: (req: Request) => Promise<Response>;

beforeAll(async () => {
  t = await createTestDb({ seeded: true });
  db = t.db;
  dbRef.db = db;
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, "engineer@kittering.example"));
  session.current = { user: { id: u!.id } };
  files.set("kbox", binaryStl(box(600, 300, 150)));
  const [up] = await db.insert(uploads).values({ fileKey: "kbox", fileName: "box.stl", sizeBytes: 1, url: "http://127.0.0.1:1/f/kbox", userId: u!.id, purpose: "model" }).returning({ id: uploads.id });
  uploadId = up!.id;
  ({ POST } = await import("../../app/api/estimate/route"));
}, 120_000);
afterAll(() => t?.close());

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
