/**
 * npm run bench:capacity — what the estimate API does for one estimate (the catalogue and the
 * calendar's queue read from the database, then the engine's analysis with the search over every
 * cell), timed on the demo database with 200 booked jobs added to its calendar against the same
 * with the queue left empty. Prints the p50 (and p90) of each and of the queue's load alone.
 * Runs in process on a throwaway database; the HTTP, sign-in and worker-pool hops of the real
 * route are the same in both cases and are measured by `npm run load`.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDb } from "../../db/client";
import { loadCapacityQueue } from "../analysis/capacity-queue";
import { loadCatalogue } from "../../db/queries/catalogue";
import * as s from "../../db/schema";
import { seed } from "../seed/seed";
import { binaryStl, drillFixture } from "../../mocks/fixtures/meshes";
import { analyse } from "../estimating/analyse";
import { migrateDatabase } from "./migrate";

const RUNS = Number(process.env.BENCH_RUNS ?? 15);
const JOBS = 200;
const H = 3_600_000;
const pct = (xs: number[], p: number) => { const v = [...xs].sort((a, b) => a - b); return v[Math.min(v.length - 1, Math.floor(p * v.length))]!; };

async function main() {
  const dir = mkdtempSync(path.join(os.tmpdir(), "layerwright-bench-capacity-"));
  const url = `file:${path.join(dir, "bench.db")}`;
  await migrateDatabase(url);
  const { db, client } = openDb(url);
  try {
    const now = new Date();
    await seed(db, { dataDir: dir, quiet: true, now, fileBaseUrl: "http://127.0.0.1:1/f" });
    const cat = (await loadCatalogue(db))!;
    // 200 booked jobs: copies of a seeded order, laid end to end on the cells in turn from now
    // (print 20 h, cooling 12 h, machining 6 h on the router, finishing after), with slack
    const [src] = await db.select().from(s.orders).limit(1);
    const [srcReq] = await db.select().from(s.requests).limit(1);
    const cells = cat.cells.map((c) => c.key);
    const at = new Map(cells.map((k) => [k, now.getTime()]));
    let router = now.getTime();
    for (let i = 0; i < JOBS; i++) {
      const cell = cells[i % cells.length]!;
      const start = at.get(cell)!;
      const [req] = await db.insert(s.requests).values({ reference: `LW-BENCH-${String(i).padStart(4, "0")}`, orgId: srcReq!.orgId, createdById: srcReq!.createdById, projectName: `Bench job ${i}`, stage: "scheduled" }).returning({ id: s.requests.id });
      const ship = new Date(start + 32 * H + 6 * H + 5 * 24 * H);
      const [q] = await db.insert(s.quotes).values({ requestId: req!.id, version: 1, status: "accepted", shipDate: new Date(ship.getTime() + 3 * 24 * H) }).returning({ id: s.quotes.id });
      const [o] = await db.insert(s.orders).values({ requestId: req!.id, orgId: src!.orgId, quoteId: q!.id, poNumber: `PO-B${i}`, totalCents: 1, depositCents: 0, balanceCents: 1, cellKey: cell, plannedStart: new Date(start), plannedShip: ship }).returning({ id: s.orders.id });
      const mStart = Math.max(router, start + 32 * H);
      await db.insert(s.scheduleBlocks).values([
        { orderId: o!.id, cellKey: cell, kind: "print", startsAt: new Date(start), endsAt: new Date(start + 20 * H) },
        { orderId: o!.id, cellKey: cell, kind: "cooling", startsAt: new Date(start + 20 * H), endsAt: new Date(start + 32 * H) },
        { orderId: o!.id, cellKey: cell, kind: "machining", startsAt: new Date(mStart), endsAt: new Date(mStart + 6 * H) },
        { orderId: o!.id, cellKey: cell, kind: "finishing", startsAt: new Date(mStart + 6 * H), endsAt: ship },
      ]);
      at.set(cell, start + 32 * H + 4 * H);
      router = mStart + 6 * H;
    }
    const bytes = binaryStl(drillFixture());
    const time = async (withQueue: boolean) => {
      const t0 = performance.now();
      const c = (await loadCatalogue(db))!;
      const queue = withQueue ? await loadCapacityQueue(db, now, c.cells.map((x) => x.key)) : null;
      const t1 = performance.now();
      const r = await analyse({ bytes, fileName: "fixture.stl", options: {}, catalogue: c, now, ...(queue ? { queue: queue.hours, booked: queue.booked } : {}) });
      return { total: performance.now() - t0, load: t1 - t0, ship: r.shipDate, wait: r.schedule.queueHours };
    };
    await time(false); await time(true); // warm
    const empty: number[] = [], loaded: number[] = [], loads: number[] = [];
    let last = { empty: "", loaded: "", wait: 0 };
    for (let i = 0; i < RUNS; i++) {
      const a = await time(false), b = await time(true);
      empty.push(a.total); loaded.push(b.total); loads.push(b.load);
      last = { empty: a.ship, loaded: b.ship, wait: b.wait };
    }
    const f = (v: number) => `${v.toFixed(1)} ms`;
    console.log(`estimate (catalogue + queue from the database, then the analysis), ${RUNS} runs each, drill fixture, search over ${cells.length} cells`);
    console.log(`  empty calendar:   p50 ${f(pct(empty, 0.5))}  p90 ${f(pct(empty, 0.9))}  ships ${last.empty}`);
    console.log(`  ${JOBS} booked jobs:  p50 ${f(pct(loaded, 0.5))}  p90 ${f(pct(loaded, 0.9))}  ships ${last.loaded} (${last.wait.toFixed(0)} working h ahead on its cell)`);
    console.log(`  of which the queue's load: p50 ${f(pct(loads, 0.5))}`);
  } finally {
    client.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => { console.error(e); process.exit(1); });
