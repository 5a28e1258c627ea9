import { and, desc, eq } from "drizzle-orm";
import type { CellParams, MaterialParams, RateCardParams } from "../../lib/estimating/types";
import type { Db } from "../client";
import { cells, materials, rateCards } from "../schema";

export async function listCurrentMaterials(db: Db, { activeOnly = true } = {}) {
  const rows = await db
    .select({ id: materials.id, key: materials.key, version: materials.version, isActive: materials.isActive, params: materials.params })
    .from(materials)
    .where(activeOnly ? and(eq(materials.isCurrent, true), eq(materials.isActive, true)) : eq(materials.isCurrent, true))
    .orderBy(materials.key);
  return rows;
}

export async function listCurrentCells(db: Db, { activeOnly = true } = {}) {
  return db
    .select({ id: cells.id, key: cells.key, version: cells.version, isActive: cells.isActive, params: cells.params })
    .from(cells)
    .where(activeOnly ? and(eq(cells.isCurrent, true), eq(cells.isActive, true)) : eq(cells.isCurrent, true))
    .orderBy(cells.key);
}

export async function getCurrentRateCard(db: Db) {
  const [row] = await db
    .select({ id: rateCards.id, version: rateCards.version, params: rateCards.params, createdAt: rateCards.createdAt })
    .from(rateCards)
    .where(eq(rateCards.isCurrent, true))
    .orderBy(desc(rateCards.version))
    .limit(1);
  return row ?? null;
}

export async function getRateCardById(db: Db, id: string) {
  const [row] = await db.select().from(rateCards).where(eq(rateCards.id, id));
  return row ?? null;
}

/** Everything the estimator needs, as plain params. */
export async function loadCatalogue(db: Db): Promise<{
  materials: MaterialParams[];
  cells: CellParams[];
  rateCard: RateCardParams;
  rateCardId: string;
} | null> {
  const [m, c, r] = await Promise.all([listCurrentMaterials(db), listCurrentCells(db), getCurrentRateCard(db)]);
  if (!r) return null;
  return { materials: m.map((x) => x.params), cells: c.map((x) => x.params), rateCard: r.params, rateCardId: r.id };
}
