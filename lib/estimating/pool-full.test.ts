import { execFileSync } from "node:child_process";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { EstimateInputError } from "./errors";
import { EstimateJobError, EstimatePool, QueueFullError, type JobInput } from "./pool";
import type { AnalyseInput } from "./analyse";

const root = path.resolve(import.meta.dirname, "../..");
const workerPath = path.join(root, ".worker", "estimate-worker.mjs");
const input = (bytes: Uint8Array): AnalyseInput => ({
  bytes, fileName: "part.stl", options: {}, catalogue: { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard }, now: new Date("2027-03-01T09:00:00Z"),
});

beforeAll(() => {
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), path.join(root, "lib/scripts/build-worker.ts")], { cwd: root, stdio: "pipe" });
}, 60_000);

describe("estimate pool saturation, checked before the work is prepared", () => {
  let pool: EstimatePool;
  afterAll(() => pool?.close());

  it("isFull is true exactly when the next run would be refused, and clears when work drains", async () => {
    pool = new EstimatePool({ workerPath, size: 1, maxQueue: 1, timeLimitMs: 60_000 });
    const bytes = binaryStl(box(1000, 500, 400));
    expect(pool.isFull).toBe(false);
    const a = pool.run(input(bytes));
    expect(pool.isFull).toBe(false); // the worker is busy, the queue has room
    const b = pool.run(input(bytes));
    expect(pool.isFull).toBe(true);
    const refused = pool.run(input(bytes));
    await expect(refused).rejects.toBeInstanceOf(QueueFullError);
    await expect(refused.catch((e: QueueFullError) => e.retryAfterS)).resolves.toBe(pool.retryAfterS);
    await Promise.all([a, b]);
    expect(pool.isFull).toBe(false);
  });
});

describe("reservations: room held while a caller prepares its job", () => {
  let pool: EstimatePool;
  afterAll(() => pool?.close());

  it("counts held room against the bound, so check and hold are one step", async () => {
    pool = new EstimatePool({ workerPath, size: 1, maxQueue: 1, maxPerOwner: 5 });
    const a = pool.tryReserve("u1");
    const b = pool.tryReserve("u2");
    expect("run" in a && "run" in b).toBe(true);
    // Two held: the pool is full although nothing runs yet.
    expect(pool.isFull).toBe(true);
    expect(pool.tryReserve("u3")).toEqual({ reason: "full", retryAfterS: pool.retryAfterS, queued: expect.any(Number) });
    await expect(pool.run(input(binaryStl(box(10, 10, 10))))).rejects.toBeInstanceOf(QueueFullError);
    // Giving one back frees its room; a second release does nothing.
    if ("release" in b) { b.release(); b.release(); }
    expect(pool.isFull).toBe(false);
    const c = pool.tryReserve("u3");
    expect("run" in c).toBe(true);
    // Held room is never refused later, even with the queue otherwise full.
    if (!("run" in a) || !("run" in c)) throw new Error("reservations expected");
    const [ra, rc] = await Promise.all([a.run(input(binaryStl(box(1000, 500, 400)))), c.run(input(binaryStl(box(1000, 400, 300))))]);
    expect(ra.volumeMm3).toBeCloseTo(2e8, 0);
    expect(rc.volumeMm3).toBeCloseTo(1.2e8, 0);
    await expect(a.run(input(binaryStl(box(10, 10, 10))))).rejects.toThrow(/already used/);
    expect(pool.isFull).toBe(false);
  });

  it("limits one owner's jobs in flight and frees the share when a job settles", async () => {
    const p = new EstimatePool({ workerPath, size: 1, maxQueue: 8, maxPerOwner: 2 });
    try {
      const first = p.tryReserve("busy-user");
      const second = p.tryReserve("busy-user");
      expect(p.tryReserve("busy-user")).toEqual({ reason: "owner", retryAfterS: p.retryAfterS, queued: expect.any(Number) });
      // Someone else still gets in.
      const other = p.tryReserve("other-user");
      expect("run" in other).toBe(true);
      if ("release" in other) other.release();
      if (!("run" in first) || !("release" in second)) throw new Error("reservations expected");
      second.release();
      expect("run" in p.tryReserve("busy-user")).toBe(true); // the released share came back (now 2 held again)
      expect(p.tryReserve("busy-user")).toMatchObject({ reason: "owner" });
      // A failed job gives its share back too.
      await expect(first.run(input(new Uint8Array(100).fill(7)))).rejects.toBeInstanceOf(EstimateInputError);
      expect("run" in p.tryReserve("busy-user")).toBe(true);
    } finally {
      await p.close();
    }
  });
});

describe("remote files: the worker fetches and checks the file itself", () => {
  let server: Server;
  let base = "";
  const files = new Map<string, Uint8Array>();
  let pool: EstimatePool;

  beforeAll(async () => {
    files.set("/part.stl", binaryStl(box(1000, 500, 400)));
    files.set("/drawing.stl", new TextEncoder().encode("%PDF-1.7\n1 0 obj << /Type /Catalog >> endobj\n".repeat(20)));
    server = createServer((req, res) => {
      const body = files.get(req.url ?? "");
      if (!body) { res.writeHead(404).end("no such file"); return; }
      res.writeHead(200, { "content-type": "application/octet-stream", "content-length": body.length }).end(Buffer.from(body));
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    pool = new EstimatePool({ workerPath, size: 1 });
  });
  afterAll(async () => {
    await pool?.close();
    await new Promise((r) => server?.close(r));
  });
  const remote = (file: string, maxBytes = 1e8): JobInput => {
    const { bytes: _bytes, ...rest } = input(new Uint8Array());
    return { ...rest, fileName: file.slice(1), remote: { url: base + file, maxBytes } };
  };

  it("analyses a file it fetched, the same as one handed over", async () => {
    const fetched = await pool.run(remote("/part.stl"));
    const handed = await pool.run(input(files.get("/part.stl")!));
    expect(fetched.volumeMm3).toBeCloseTo(2e8, 0);
    expect(fetched.volumeMm3).toBe(handed.volumeMm3);
    expect(fetched.triangles).toBe(handed.triangles);
  });

  it("reads a fetched file for the preview, thinning it to the triangles asked for", async () => {
    const whole = await pool.read({ remote: { url: `${base}/part.stl`, maxBytes: 1e8 }, fileName: "part.stl", options: { units: "mm" } });
    expect(whole.triangles).toBe(12);
    expect(whole.positions.length).toBe(12 * 9);
    // 12 triangles at most 5: every 3rd, so 4 remain, each a whole triangle of the original.
    const thin = await pool.read({ remote: { url: `${base}/part.stl`, maxBytes: 1e8 }, fileName: "part.stl", options: { units: "mm", maxTriangles: 5 } });
    expect(thin.triangles).toBe(12);
    expect(thin.positions.length).toBe(4 * 9);
    for (let t = 0; t < 4; t++) expect(Array.from(thin.positions.subarray(t * 9, t * 9 + 9))).toEqual(Array.from(whole.positions.subarray(t * 3 * 9, t * 3 * 9 + 9)));
    const pdf = await pool.read({ remote: { url: `${base}/drawing.stl`, maxBytes: 1e8 }, fileName: "drawing.stl", options: {} }).catch((x: unknown) => x);
    expect((pdf as EstimateInputError).code).toBe("file:type");
  });

  it("refuses a file whose content is not a model, by the upload check", async () => {
    const e = await pool.run(remote("/drawing.stl")).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(EstimateInputError);
    expect((e as EstimateInputError).code).toBe("file:type");
  });

  it("reports a missing or oversized stored file as a storage problem", async () => {
    const missing = await pool.run(remote("/gone.stl")).catch((x: unknown) => x);
    expect(missing).toBeInstanceOf(EstimateJobError);
    expect((missing as EstimateJobError).code).toBe("storage");
    expect((missing as Error).message).toMatch(/not found/);
    const big = await pool.run(remote("/part.stl", 100)).catch((x: unknown) => x);
    expect((big as EstimateJobError).code).toBe("storage");
    expect((big as Error).message).toMatch(/larger than 100 bytes/);
  });
});

describe("fetching a stored file", () => {
  it("retries once when the storage drops the connection, then reports it", async () => {
    const { fetchModelBytes, ModelFetchError } = await import("./fetch-model");
    let calls = 0;
    const body = Buffer.from(binaryStl(box(1000, 500, 400)));
    const server = createServer((req, res) => {
      calls += 1;
      // The first request of each pair is cut off without an answer.
      if (calls % 2 === 1) return void req.socket.destroy();
      res.writeHead(200, { "content-length": body.length }).end(body);
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/part.stl`;
    try {
      const bytes = await fetchModelBytes(url, { maxBytes: 1e6 });
      expect(bytes.length).toBe(body.length);
      expect(calls).toBe(2);
      server.removeAllListeners("request");
      server.on("request", (req) => req.socket.destroy());
      const e = await fetchModelBytes(url, { maxBytes: 1e6 }).catch((x: unknown) => x);
      expect(e).toBeInstanceOf(ModelFetchError);
      expect((e as Error).message).toMatch(/unreachable/);
    } finally {
      await new Promise((r) => server.close(r));
    }
  });
});
