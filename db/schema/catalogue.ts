import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import type { CellParams, MaterialParams } from "../../lib/estimating/types";
import type { RateCardParams } from "../../lib/estimating/types";
import { users } from "./auth";
import { createdAt, id } from "./common";

/**
 * Catalogue rows are versioned: an edit inserts version n+1 and clears is_current on the old row,
 * so quotes keep pointing at the exact values they were made with.
 */
export const materials = sqliteTable(
  "materials",
  {
    id: id(),
    key: text("key").notNull(),
    version: integer("version").notNull().default(1),
    isCurrent: integer("is_current", { mode: "boolean" }).notNull().default(true),
    isActive: integer("is_active", { mode: "boolean" }).notNull().default(true),
    params: text("params", { mode: "json" }).$type<MaterialParams>().notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("materials_key_version_uq").on(t.key, t.version), index("materials_current_idx").on(t.isCurrent)],
);
export type Material = typeof materials.$inferSelect;

export const cells = sqliteTable(
  "cells",
  {
    id: id(),
    key: text("key").notNull(),
    version: integer("version").notNull().default(1),
    isCurrent: integer("is_current", { mode: "boolean" }).notNull().default(true),
    isActive: integer("is_active", { mode: "boolean" }).notNull().default(true),
    params: text("params", { mode: "json" }).$type<CellParams>().notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("cells_key_version_uq").on(t.key, t.version), index("cells_current_idx").on(t.isCurrent)],
);
export type Cell = typeof cells.$inferSelect;

export const rateCards = sqliteTable(
  "rate_cards",
  {
    id: id(),
    version: integer("version").notNull(),
    isCurrent: integer("is_current", { mode: "boolean" }).notNull().default(true),
    params: text("params", { mode: "json" }).$type<RateCardParams>().notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("rate_cards_version_uq").on(t.version)],
);
export type RateCard = typeof rateCards.$inferSelect;
