import { execFileSync } from "node:child_process";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { EstimatePool, QueueFullError } from "./pool";
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
