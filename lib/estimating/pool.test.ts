import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { EstimateInputError } from "./errors";
import { EstimateJobError, EstimatePool, QueueFullError } from "./pool";
import type { AnalyseInput } from "./analyse";

const root = path.resolve(import.meta.dirname, "../..");
const workerPath = path.join(root, ".worker", "estimate-worker.mjs");
const input = (bytes: Uint8Array, fileName = "part.stl"): AnalyseInput => ({
  bytes, fileName, options: {}, catalogue: { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard }, now: new Date("2027-03-01T09:00:00Z"),
});

beforeAll(() => {
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), path.join(root, "lib/scripts/build-worker.ts")], { cwd: root, stdio: "pipe" });
}, 60_000);

describe("estimate pool (worker threads)", () => {
  const pools: EstimatePool[] = [];
  afterAll(async () => { await Promise.all(pools.map((p) => p.close())); });
  const make = (o: ConstructorParameters<typeof EstimatePool>[0]) => { const p = new EstimatePool({ workerPath, ...o }); pools.push(p); return p; };

  it("runs analyse in a worker and relays progress", async () => {
    const pool = make({ size: 1 });
    const stages: string[] = [];
    const r = await pool.run(input(binaryStl(box(1000, 500, 400))), (_f, s) => stages.push(s));
    expect(r.volumeMm3).toBeCloseTo(2e8, 0);
    expect(stages).toContain("slicing");
    expect(stages[stages.length - 1]).toBe("done");
  });

  it("gives bad files back as EstimateInputError", async () => {
    const pool = make({ size: 1 });
    await expect(pool.run(input(new Uint8Array(100).fill(7)))).rejects.toBeInstanceOf(EstimateInputError);
  });

  it("refuses work beyond its queue with QueueFullError", async () => {
    const pool = make({ size: 1, maxQueue: 1 });
    const bytes = binaryStl(box(1000, 500, 400));
    const a = pool.run(input(bytes)), b = pool.run(input(bytes));
    await expect(pool.run(input(bytes))).rejects.toBeInstanceOf(QueueFullError);
    await expect(Promise.all([a, b])).resolves.toHaveLength(2);
  });

  it("stops a job past its time limit and keeps serving", async () => {
    const pool = make({ size: 1, timeLimitMs: 1 });
    await expect(pool.run(input(binaryStl(box(1000, 500, 400))))).rejects.toBeInstanceOf(EstimateJobError);
    const ok = make({ size: 1, timeLimitMs: 30_000 });
    await expect(ok.run(input(binaryStl(box(1000, 500, 400))))).resolves.toHaveProperty("totalCents");
  });

  it("tessellates STEP in the worker and retires a worker whose CAD kernel memory passed the limit", async () => {
    // cube-10x10.stp: a 10 mm cube from the occt-import-js test files (mocks/fixtures/cad/README.md).
    const step = new Uint8Array(readFileSync(path.join(root, "mocks/fixtures/cad/cube-10x10.stp")));
    const keep = make({ size: 1 });
    const r1 = await keep.run(input(step, "cube-10x10.stp"));
    await keep.run(input(step, "cube-10x10.stp"));
    expect(r1.format).toBe("step");
    expect(r1.volumeMm3).toBeCloseTo(1000, 3);
    expect(keep.workersStarted).toBe(1);

    process.env.ESTIMATE_WASM_RETIRE_MB = "1";
    try {
      const retire = make({ size: 1 });
      await retire.run(input(step, "cube-10x10.stp"));
      await retire.run(input(step, "cube-10x10.stp"));
      expect(retire.workersStarted).toBe(2);
    } finally {
      delete process.env.ESTIMATE_WASM_RETIRE_MB;
    }
  });

  it("reads a model's triangles in a worker for the preview, in millimetres", async () => {
    const pool = make({ size: 1 });
    const r = await pool.read({ bytes: binaryStl(box(10, 20, 30)), fileName: "box.stl", options: { units: "in" } });
    expect(r.format).toBe("stl-binary");
    expect(r.positions.length).toBe(12 * 9);
    expect(Math.max(...r.positions)).toBeCloseTo(30 * 25.4, 3);
    await expect(pool.read({ bytes: new Uint8Array(50).fill(3), fileName: "junk.step", options: {} })).rejects.toBeInstanceOf(EstimateInputError);
  });
});
