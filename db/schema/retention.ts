import { integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { ts } from "./common";
import { requests } from "./requests";

/** Default period clients' model files are kept after their order closes, days (the bureau may change it). */
export const DEFAULT_MODEL_RETENTION_DAYS = 180;

/**
 * The bureau's settings that are not versioned with the catalogue's prices: one row, id "bureau".
 * `retentionRunOn` is the UTC date (YYYY-MM-DD) the daily deletion last ran, so that several
 * server processes run it once a day between them.
 */
export const bureauSettings = sqliteTable("bureau_settings", {
  id: text("id").primaryKey(),
  modelRetentionDays: integer("model_retention_days").notNull().default(DEFAULT_MODEL_RETENTION_DAYS),
  retentionRunOn: text("retention_run_on"),
  updatedById: text("updated_by_id").references(() => users.id),
  updatedAt: ts("updated_at"),
});
export type BureauSettings = typeof bureauSettings.$inferSelect;

/**
 * What happened to one request's model files: a client admin's request for earlier deletion, and
 * when the files were deleted from storage (the request, its parts, file names, analyses, quotes
 * and documents stay).
 */
export const fileRetention = sqliteTable("file_retention", {
  requestId: text("request_id")
    .primaryKey()
    .references(() => requests.id, { onDelete: "cascade" }),
  deletionRequestedAt: ts("deletion_requested_at"),
  deletionRequestedById: text("deletion_requested_by_id").references(() => users.id),
  filesDeletedAt: ts("files_deleted_at"),
  filesDeletedCount: integer("files_deleted_count"),
});
export type FileRetention = typeof fileRetention.$inferSelect;
