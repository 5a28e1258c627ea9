import "server-only";
import { and, asc, desc, eq, gt, inArray, isNull, lt, notInArray } from "drizzle-orm";
import type { Db } from "../client";
import { analyses, maintenanceBlocks, orders, parts, quotes, requests, scheduleBlocks } from "../schema";
import type { Tx } from "./audit";
import type { EstimateResult } from "../../lib/estimating/types";

/** Stages whose job no longer holds a cell or the router, whatever its blocks say. */
export const OFF_THE_CALENDAR = ["shipped", "delivered", "closed", "cancelled"] as const;

/** Booked blocks of live jobs overlapping [from, to), with the order's reference and its planned and promised ship. */
export async function listBookedBlocks(db: Db | Tx, from: Date, to: Date) {
  return db
    .select({
      orderId: scheduleBlocks.orderId, cellKey: scheduleBlocks.cellKey, kind: scheduleBlocks.kind, startsAt: scheduleBlocks.startsAt, endsAt: scheduleBlocks.endsAt,
      reference: requests.reference, projectName: requests.projectName, stage: requests.stage, plannedShip: orders.plannedShip, promisedShip: quotes.shipDate,
    })
    .from(scheduleBlocks)
    .innerJoin(orders, eq(orders.id, scheduleBlocks.orderId))
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(quotes, eq(quotes.id, orders.quoteId))
    .where(and(gt(scheduleBlocks.endsAt, from), lt(scheduleBlocks.startsAt, to), notInArray(requests.stage, [...OFF_THE_CALENDAR])))
    .orderBy(asc(scheduleBlocks.startsAt));
}

/** Maintenance blocks overlapping [from, to). */
export async function listMaintenanceBlocks(db: Db | Tx, from: Date, to: Date) {
  return db
    .select({ id: maintenanceBlocks.id, resourceKey: maintenanceBlocks.resourceKey, startsAt: maintenanceBlocks.startsAt, endsAt: maintenanceBlocks.endsAt, reason: maintenanceBlocks.reason })
    .from(maintenanceBlocks)
    .where(and(gt(maintenanceBlocks.endsAt, from), lt(maintenanceBlocks.startsAt, to)))
    .orderBy(asc(maintenanceBlocks.startsAt));
}

export async function createMaintenanceBlock(tx: Tx, b: { resourceKey: string; startsAt: Date; endsAt: Date; reason: string; createdById: string }) {
  const [row] = await tx.insert(maintenanceBlocks).values(b).returning({ id: maintenanceBlocks.id });
  return row!.id;
}

export async function getMaintenanceBlock(db: Db | Tx, id: string) {
  const [row] = await db.select().from(maintenanceBlocks).where(eq(maintenanceBlocks.id, id));
  return row ?? null;
}

export async function deleteMaintenanceBlock(tx: Tx, id: string): Promise<boolean> {
  const gone = await tx.delete(maintenanceBlocks).where(eq(maintenanceBlocks.id, id)).returning({ id: maintenanceBlocks.id });
  return gone.length > 0;
}

/** Accepted orders not yet on a cell, with their parts' latest finished estimates. */
export async function listUnscheduledEstimates(db: Db | Tx) {
  const rows = await db
    .select({ orderId: orders.id, reference: requests.reference, promisedShip: quotes.shipDate, result: analyses.result })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(quotes, eq(quotes.id, orders.quoteId))
    .innerJoin(parts, eq(parts.requestId, requests.id))
    .innerJoin(analyses, and(eq(analyses.revisionId, parts.currentRevisionId), eq(analyses.status, "done")))
    .where(and(inArray(requests.stage, ["accepted", "deposit_paid"]), isNull(orders.cellKey)))
    .orderBy(desc(analyses.createdAt));
  // the latest analysis of each part's revision
  const seen = new Set<string>();
  const out: { orderId: string; reference: string; promisedShip: Date | null; estimate: EstimateResult }[] = [];
  for (const r of rows) {
    const key = `${r.orderId}|${r.result?.fileName ?? ""}|${r.result?.cell ?? ""}`;
    if (!r.result || seen.has(key)) continue;
    seen.add(key);
    out.push({ orderId: r.orderId, reference: r.reference, promisedShip: r.promisedShip, estimate: r.result });
  }
  return out;
}
