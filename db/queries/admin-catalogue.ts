import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { CellParams, MaterialParams, RateCardParams } from "../../lib/estimating/types";
import type { Db } from "../client";
import { cells, materials, rateCards } from "../schema";
import type { Tx } from "./audit";

/**
 * Versioned catalogue writes: an edit inserts version n+1 and clears is_current on the old row,
 * so quotes and analyses keep pointing at the values they were made with.
 */
export async function saveMaterialVersion(tx: Tx, params: MaterialParams, isActive: boolean, actorId: string) {
  const [prev] = await tx.select().from(materials).where(and(eq(materials.key, params.key), eq(materials.isCurrent, true)));
  const [{ next }] = (await tx.select({ next: sql<number>`coalesce(max(${materials.version}), 0) + 1` }).from(materials).where(eq(materials.key, params.key))) as [{ next: number }];
  await tx.update(materials).set({ isCurrent: false }).where(eq(materials.key, params.key));
  const [row] = await tx.insert(materials).values({ key: params.key, version: next, isCurrent: true, isActive, params, createdById: actorId }).returning({ id: materials.id, version: materials.version });
  return { before: prev ?? null, after: row! };
}

export async function saveCellVersion(tx: Tx, params: CellParams, isActive: boolean, actorId: string) {
  const [prev] = await tx.select().from(cells).where(and(eq(cells.key, params.key), eq(cells.isCurrent, true)));
  const [{ next }] = (await tx.select({ next: sql<number>`coalesce(max(${cells.version}), 0) + 1` }).from(cells).where(eq(cells.key, params.key))) as [{ next: number }];
  await tx.update(cells).set({ isCurrent: false }).where(eq(cells.key, params.key));
  const [row] = await tx.insert(cells).values({ key: params.key, version: next, isCurrent: true, isActive, params, createdById: actorId }).returning({ id: cells.id, version: cells.version });
  return { before: prev ?? null, after: row! };
}

export async function saveRateCardVersion(tx: Tx, params: RateCardParams, actorId: string) {
  const [prev] = await tx.select().from(rateCards).where(eq(rateCards.isCurrent, true));
  const [{ next }] = (await tx.select({ next: sql<number>`coalesce(max(${rateCards.version}), 0) + 1` }).from(rateCards)) as [{ next: number }];
  await tx.update(rateCards).set({ isCurrent: false }).where(eq(rateCards.isCurrent, true));
  const [row] = await tx.insert(rateCards).values({ version: next, isCurrent: true, params, createdById: actorId }).returning({ id: rateCards.id, version: rateCards.version });
  return { before: prev ?? null, after: row! };
}

export async function getCurrentMaterial(db: Db | Tx, key: string) {
  const [m] = await db.select().from(materials).where(and(eq(materials.key, key), eq(materials.isCurrent, true)));
  return m ?? null;
}

export async function getCurrentCell(db: Db | Tx, key: string) {
  const [c] = await db.select().from(cells).where(and(eq(cells.key, key), eq(cells.isCurrent, true)));
  return c ?? null;
}

export async function listRateCardVersions(db: Db, limit = 20) {
  return db.select({ id: rateCards.id, version: rateCards.version, isCurrent: rateCards.isCurrent, createdAt: rateCards.createdAt }).from(rateCards).orderBy(desc(rateCards.version)).limit(limit);
}

export async function countVersions(db: Db) {
  const m = await db.select({ key: materials.key, n: sql<number>`count(*)` }).from(materials).groupBy(materials.key);
  const c = await db.select({ key: cells.key, n: sql<number>`count(*)` }).from(cells).groupBy(cells.key);
  return { materials: new Map(m.map((r) => [r.key, Number(r.n)])), cells: new Map(c.map((r) => [r.key, Number(r.n)])) };
}
