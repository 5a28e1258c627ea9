import "server-only";
import type { Db } from "@/db/client";
import { listBookedBlocks, listMaintenanceBlocks, listUnscheduledEstimates } from "@/db/queries/capacity";
import type { Tx } from "@/db/queries/audit";
import type { CapacityQueue } from "@/lib/estimating/ledger";
import { forCells, queueFromRows, unscheduledOf, type BookedRow, type UnscheduledRow } from "@/lib/estimating/queue";

/**
 * The queue a new estimate is placed around (lib/estimating/placement.ts): live jobs' print,
 * cooling and machining blocks from now on (each with the slack its promised date leaves),
 * maintenance blocks, and accepted work not yet scheduled at its estimated hours; kept to the
 * catalogue's cells and the router.
 */
export async function loadCapacityQueue(db: Db | Tx, now: Date, cellKeys: string[]): Promise<CapacityQueue> {
  const far = new Date(now.getTime() + 400 * 86_400_000);
  const [booked, blocks, unscheduled] = await Promise.all([listBookedBlocks(db, now, far), listMaintenanceBlocks(db, now, far), listUnscheduledEstimates(db)]);
  const rows: BookedRow[] = booked.map((b) => ({
    cellKey: b.cellKey, kind: b.kind, startsAt: b.startsAt.getTime(), endsAt: b.endsAt.getTime(), ref: b.reference,
    plannedShipMs: b.plannedShip?.getTime() ?? null, promisedShipMs: b.promisedShip?.getTime() ?? null,
  }));
  for (const m of blocks) rows.push({ cellKey: m.resourceKey, kind: "maintenance", startsAt: m.startsAt.getTime(), endsAt: m.endsAt.getTime(), ref: m.reason });
  const hours: UnscheduledRow[] = unscheduled.map((u) => unscheduledOf(u.estimate)).filter((u): u is UnscheduledRow => u !== null);
  return forCells(queueFromRows(now.getTime(), rows, hours), cellKeys);
}
