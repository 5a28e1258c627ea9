import "server-only";
import { and, asc, desc, eq, gt, isNotNull, notInArray, sql } from "drizzle-orm";
import type { Db } from "../client";
import { analyses, orders, organisations, parts, quotes, requests, shipDateChanges } from "../schema";
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

/** Issued quotes still open, with their parts' latest finished estimates (for the check of their dates against today's calendar). */
export async function listOpenQuotesWithEstimates(db: Db | Tx) {
  const rows = await db
    .select({ quoteId: quotes.id, requestId: requests.id, reference: requests.reference, projectName: requests.projectName, firmName: organisations.name, version: quotes.version, shipDate: quotes.shipDate, leadTime: quotes.leadTime, partId: parts.id, result: analyses.result })
    .from(quotes)
    .innerJoin(requests, eq(requests.id, quotes.requestId))
    .innerJoin(organisations, eq(organisations.id, requests.orgId))
    .innerJoin(parts, eq(parts.requestId, requests.id))
    .innerJoin(analyses, and(eq(analyses.revisionId, parts.currentRevisionId), eq(analyses.status, "done")))
    .where(and(eq(quotes.status, "issued"), isNotNull(quotes.shipDate)))
    .orderBy(asc(quotes.shipDate), desc(analyses.createdAt));
  const byQuote = new Map<string, { quoteId: string; requestId: string; reference: string; projectName: string; firmName: string; version: number; shipDate: Date; leadTime: string; results: NonNullable<(typeof rows)[number]["result"]>[]; seen: Set<string> }>();
  for (const r of rows) {
    const q = byQuote.get(r.quoteId) ?? { ...r, shipDate: r.shipDate!, results: [], seen: new Set<string>() };
    byQuote.set(r.quoteId, q);
    if (!r.result || q.seen.has(r.partId)) continue;
    q.seen.add(r.partId);
    q.results.push(r.result);
  }
  return [...byQuote.values()].map(({ seen: _s, ...q }) => q);
}
