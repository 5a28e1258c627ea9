import "server-only";
import { and, asc, desc, eq, gt, isNotNull, notInArray, sql } from "drizzle-orm";
import type { Db } from "../client";
import { orders, organisations, quotes, requests, shipDateChanges } from "../schema";
import type { Tx } from "./audit";
import { OFF_THE_CALENDAR } from "./capacity";

export async function recordShipDateChange(tx: Tx, c: { orderId: string; fromDate: Date | null; toDate: Date; reason: string; isNotified: boolean; actorId: string }): Promise<string> {
  const [row] = await tx.insert(shipDateChanges).values(c).returning({ id: shipDateChanges.id });
  return row!.id;
}

/** An order's ship-date changes, oldest first (for its timeline). */
export async function listShipDateChanges(db: Db | Tx, orderId: string) {
  return db
    .select({ id: shipDateChanges.id, fromDate: shipDateChanges.fromDate, toDate: shipDateChanges.toDate, reason: shipDateChanges.reason, at: shipDateChanges.at })
    .from(shipDateChanges)
    .where(eq(shipDateChanges.orderId, orderId))
    .orderBy(asc(shipDateChanges.at));
}

/**
 * Orders still in the works whose planned ship is past the date their quote promised (compared
 * by the plant's day: the planned instant later than the end of the promised day), latest first.
 */
export async function listBrokenPromises(db: Db | Tx) {
  return db
    .select({
      orderId: orders.id, requestId: requests.id, reference: requests.reference, projectName: requests.projectName, firmName: organisations.name,
      stage: requests.stage, promised: quotes.shipDate, planned: orders.plannedShip, leadTime: quotes.leadTime,
    })
    .from(orders)
    .innerJoin(requests, eq(requests.id, orders.requestId))
    .innerJoin(organisations, eq(organisations.id, orders.orgId))
    .innerJoin(quotes, eq(quotes.id, orders.quoteId))
    .where(and(
      notInArray(requests.stage, [...OFF_THE_CALENDAR]), isNotNull(orders.plannedShip), isNotNull(quotes.shipDate),
      // the promised day ends 24 h after its midnight
      gt(orders.plannedShip, sql`${quotes.shipDate} + 86400000`),
    ))
    .orderBy(desc(orders.plannedShip));
}
