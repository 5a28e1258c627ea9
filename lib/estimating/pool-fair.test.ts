import { execFileSync } from "node:child_process";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import type { AnalyseInput } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { EstimatePool, OwnerBusyError, type QueuePlace } from "./pool";

const root = path.resolve(import.meta.dirname, "../..");
const workerPath = path.join(root, ".worker", "estimate-worker.mjs");
const input = (bytes: Uint8Array): AnalyseInput => ({
  bytes, fileName: "part.stl", options: {}, catalogue: { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard }, now: new Date("2027-03-01T09:00:00Z"),
});

beforeAll(() => {
  execFileSync(process.execPath, [path.join(root, "node_modules/tsx/dist/cli.mjs"), path.join(root, "lib/scripts/build-worker.ts")], { cwd: root, stdio: "pipe" });
}, 60_000);

describe("the estimate pool serves firms in turn", () => {
  const pools: EstimatePool[] = [];
  afterAll(async () => { await Promise.all(pools.map((p) => p.close())); });

  it("one firm's six jobs do not hold another firm's one: it runs next, and is told its place", async () => {
    const pool = new EstimatePool({ workerPath, size: 1, maxQueue: 8 });
    pools.push(pool);
    const bytes = binaryStl(box(400, 300, 200));
    const finished: string[] = [];
    const places: QueuePlace[] = [];
    const flood = Array.from({ length: 6 }, (_, i) => pool.run(input(bytes), undefined, { lane: "firm-a" }).then(() => void finished.push(`a${i + 1}`)));
    const small = pool.run(input(bytes), undefined, { lane: "firm-b", onPlace: (p) => places.push(p) }).then(() => void finished.push("b1"));
    await Promise.all([...flood, small]);
    // a1 was already running; then the lanes take turns: a2, b1, a3 …
    expect(finished.slice(0, 3)).toEqual(["a1", "a2", "b1"]);
    expect(places[0]).toMatchObject({ ahead: 1 });
    expect(places[0]!.waitS).toBeGreaterThan(0);
    expect(places.at(-1)).toMatchObject({ ahead: 0 });
  }, 180_000);

  it("a firm may hold half the pool's room; another firm still finds a place", () => {
    const pool = new EstimatePool({ workerPath, size: 1, maxQueue: 8, maxPerOwner: 10 });
    pools.push(pool);
    const held = Array.from({ length: 5 }, () => pool.tryReserve("lead-a", "firm-a"));
    expect(held.every((r) => !("reason" in r))).toBe(true);
    expect(pool.tryReserve("lead-a", "firm-a")).toMatchObject({ reason: "lane" });
    const other = pool.tryReserve("lead-b", "firm-b");
    expect("reason" in other).toBe(false);
    for (const r of [...held, other]) if (!("reason" in r)) r.release();
    expect("reason" in pool.tryReserve("lead-a", "firm-a")).toBe(false);
  });

  it("one user's share counts every kind of job: an estimate held and a preview running refuse a third of either kind", async () => {
    const pool = new EstimatePool({ workerPath, size: 1, maxQueue: 8, maxPerOwner: 2 });
    pools.push(pool);
    const bytes = binaryStl(box(40, 30, 20));
    const estimate = pool.tryReserve("user-a", "firm-a");
    expect("reason" in estimate).toBe(false);
    const preview = pool.read({ bytes, fileName: "part.stl", options: {} }, { owner: "user-a", lane: "firm-a" });
    // A third job of any kind is refused with the user's own reason, before it costs anything.
    await expect(pool.read({ bytes, fileName: "part.stl", options: {} }, { owner: "user-a", lane: "firm-a" })).rejects.toBeInstanceOf(OwnerBusyError);
    await expect(pool.run(input(bytes), undefined, { owner: "user-a", lane: "firm-a" })).rejects.toBeInstanceOf(OwnerBusyError);
    expect(pool.tryReserve("user-a", "firm-a")).toMatchObject({ reason: "owner" });
    // Another user of the same firm is not held by it.
    const colleague = pool.read({ bytes, fileName: "part.stl", options: {} }, { owner: "user-b", lane: "firm-a" });
    expect((await preview).triangles).toBe(12);
    expect((await colleague).triangles).toBe(12);
    // With the preview done, the share has room again; a released reservation gives its place back.
    const next = pool.run(input(bytes), undefined, { owner: "user-a", lane: "firm-a" });
    if (!("reason" in estimate)) estimate.release();
    expect("reason" in pool.tryReserve("user-a", "firm-a")).toBe(false);
    await next;
  }, 180_000);
});
