/**
 * Analyses as durable jobs: a worker killed mid-analysis puts the job back in the queue and the
 * next attempt finishes it; a job whose process died (its lease ran out) is taken over by the
 * sweeper; a job out of attempts ends failed with a plain message and staff can run it again.
 * Runs the real estimate pool (worker threads, the bundled worker) against a local file server.
 */
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import path from "node:path";
import type { Worker } from "node:worker_threads";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../db/client";
import { analyses, fileRevisions } from "../../db/schema";
import { LEASE_MS, MAX_ATTEMPTS, retryAnalysis, startAnalysis, sweepAnalyses, type RunDeps } from "../../lib/analysis/run";
import { EstimatePool } from "../../lib/estimating/pool";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { startFileServer } from "../helpers/file-server";
import { createTestDb, type TestDb } from "../helpers/test-db";

const root = path.resolve(import.meta.dirname, "../..");
let t: TestDb;
let db: Db;
let pool: EstimatePool;
let server: Awaited<ReturnType<typeof startFileServer>>;
const files = new Map<string, Uint8Array>();
const bytes = binaryStl(box(800, 400, 300));
let revisionId: string;

beforeAll(async () => {
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), path.join(root, "lib/scripts/build-worker.ts")], { cwd: root, stdio: "pipe" });
  t = await createTestDb({ seeded: true });
  db = t.db;
  server = await startFileServer(files);
  pool = new EstimatePool({ size: 1, workerPath: path.join(root, ".worker", "estimate-worker.mjs") });
  const [rev] = await db.select({ id: fileRevisions.id, key: fileRevisions.fileKey }).from(fileRevisions).limit(1);
  revisionId = rev!.id;
  await db.update(fileRevisions).set({ sha256: null }).where(eq(fileRevisions.id, revisionId));
  files.set(rev!.key, bytes);
}, 120_000);
afterAll(async () => {
  await pool?.close();
  await server?.close();
  t?.close();
});

const deps = (extra: Partial<RunDeps> = {}): RunDeps => ({ pool, fileUrl: async (k) => `${server.base}/${k}`, retryDelayMs: () => 0, ...extra });
const rowOf = async (id: string) => (await db.select().from(analyses).where(eq(analyses.id, id)))[0]!;
const start = (d: RunDeps) => startAnalysis(db, { revisionId, fileKey: "", fileName: "box.stl", options: { materialKey: "pc-cf" } }, d);
/** The pool's worker threads (private; reached here only to kill one, as a crash would). */
const workersOf = (p: EstimatePool) => (p as unknown as { slots: { worker: Worker }[] }).slots.map((s) => s.worker);

describe("durable analyses", () => {
  it("a worker killed mid-analysis: the job goes back to the queue and the next attempt finishes it", async () => {
    let killed = false;
    const killing: RunDeps["pool"] = {
      run: (input, onProgress) =>
        pool.run(input, (f, s) => {
          onProgress?.(f, s);
          if (!killed) {
            killed = true;
            for (const w of workersOf(pool)) void w.terminate();
          }
        }),
    };
    const { analysisId, done } = await start(deps({ pool: killing }));
    await done;
    expect(killed).toBe(true);
    const after = await rowOf(analysisId);
    expect(after).toMatchObject({ status: "queued", attempts: 1 });
    expect(after.leaseUntil!.getTime()).toBeGreaterThan(Date.now());

    // The sweeper takes it once its back-off has passed.
    const later = () => new Date(Date.now() + 60_000);
    const swept = await sweepAnalyses(db, deps({ now: later }));
    expect(swept.resumed).toContain(analysisId);
    await swept.done;
    const finished = await rowOf(analysisId);
    expect(finished).toMatchObject({ status: "done", attempts: 2, progress: 1 });
    expect((finished.result as { volumeMm3: number }).volumeMm3).toBeCloseTo(800 * 400 * 300, 0);
    // The worker hashed the whole file; the request thread never read it.
    const [rev] = await db.select({ sha256: fileRevisions.sha256 }).from(fileRevisions).where(eq(fileRevisions.id, revisionId));
    expect(rev!.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
    expect(finished.result).not.toHaveProperty("fileSha256");
  }, 120_000);

  it("counts against its uploader's share of the estimator: it waits while their other jobs fill it, then runs", async () => {
    const [rev] = await db.select({ by: fileRevisions.uploadedById }).from(fileRevisions).where(eq(fileRevisions.id, revisionId));
    const owner = rev!.by;
    const small = new EstimatePool({ size: 1, maxPerOwner: 1, workerPath: path.join(root, ".worker", "estimate-worker.mjs") });
    try {
      // The uploader already has one job (an estimate being prepared): their share is full.
      const held = small.tryReserve(owner, "firm");
      expect("reason" in held).toBe(false);
      const { analysisId, done } = await start(deps({ pool: small, retryDelayMs: () => 50 }));
      await expect.poll(async () => (await rowOf(analysisId)).stageLabel, { timeout: 20_000 }).toBe("Waiting for your other estimates to finish");
      if (!("reason" in held)) held.release();
      await done;
      expect(await rowOf(analysisId)).toMatchObject({ status: "done" });
    } finally {
      await small.close();
    }
  }, 120_000);

  it("a job whose process died (lease ran out) is taken over by the sweeper and finishes", async () => {
    const hung: RunDeps["pool"] = { run: () => new Promise(() => {}) };
    const { analysisId } = await start(deps({ pool: hung }));
    await new Promise((r) => setTimeout(r, 200));
    expect(await rowOf(analysisId)).toMatchObject({ status: "running", attempts: 1 });
    // Before the lease ends nobody takes it.
    expect((await sweepAnalyses(db, deps())).resumed).not.toContain(analysisId);
    const swept = await sweepAnalyses(db, deps({ now: () => new Date(Date.now() + LEASE_MS + 1000) }));
    expect(swept.resumed).toContain(analysisId);
    await swept.done;
    expect(await rowOf(analysisId)).toMatchObject({ status: "done", attempts: 2 });
  }, 120_000);

  it("out of attempts it ends failed with a plain message; staff's retry runs it again to the end", async () => {
    const hung: RunDeps["pool"] = { run: () => new Promise(() => {}) };
    const { analysisId } = await start(deps({ pool: hung }));
    await new Promise((r) => setTimeout(r, 200));
    await db.update(analyses).set({ attempts: MAX_ATTEMPTS }).where(eq(analyses.id, analysisId));
    const swept = await sweepAnalyses(db, deps({ now: () => new Date(Date.now() + LEASE_MS + 1000) }));
    expect(swept.failed).toContain(analysisId);
    const failed = await rowOf(analysisId);
    expect(failed).toMatchObject({ status: "failed", errorCode: "job:abandoned" });
    expect(failed.errorMessage).toMatch(/interrupted 3 times/);

    const retry = await retryAnalysis(db, analysisId, deps());
    expect(retry.retried).toBe(true);
    await retry.done;
    expect(await rowOf(analysisId)).toMatchObject({ status: "done", attempts: 1, errorCode: null });
    expect((await retryAnalysis(db, analysisId, deps())).retried).toBe(false);
  }, 120_000);

  it("a bad file fails at once, without retries", async () => {
    files.set("bad-key", new Uint8Array(200).fill(7));
    const [rev] = await db.insert(fileRevisions).values({ partId: (await db.select({ p: fileRevisions.partId }).from(fileRevisions).limit(1))[0]!.p, revision: 99, fileKey: "bad-key", fileName: "bad.stl", sizeBytes: 200, uploadedById: (await db.select({ u: fileRevisions.uploadedById }).from(fileRevisions).limit(1))[0]!.u }).returning({ id: fileRevisions.id });
    const { analysisId, done } = await startAnalysis(db, { revisionId: rev!.id, fileKey: "bad-key", fileName: "bad.stl", options: {} }, deps());
    await done;
    expect(await rowOf(analysisId)).toMatchObject({ status: "failed", attempts: 1, errorCode: "file:type" });
  }, 60_000);
});
