import { integer, text } from "drizzle-orm/sqlite-core";
import { randomUUID } from "node:crypto";

/** Text primary key filled with a random UUID. */
export const id = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => randomUUID());

/** UTC timestamp stored as integer milliseconds. */
export const ts = (name: string) => integer(name, { mode: "timestamp_ms" });

export const createdAt = () =>
  ts("created_at")
    .notNull()
    .$defaultFn(() => new Date());

export const ROLES = ["client", "client_admin", "sales", "production", "accounts", "admin"] as const;
export type Role = (typeof ROLES)[number];
export const STAFF_ROLES = ["sales", "production", "accounts", "admin"] as const satisfies readonly Role[];
export const CLIENT_ROLES = ["client", "client_admin"] as const satisfies readonly Role[];

/** The order's life (DESIGN.md). */
export const STAGES = [
  "draft",
  "submitted",
  "quoted",
  "accepted",
  "deposit_paid",
  "scheduled",
  "printing",
  "cooling",
  "machining",
  "inspection",
  "finishing",
  "packed",
  "shipped",
  "delivered",
  "closed",
  "on_hold",
  "cancelled",
] as const;
export type Stage = (typeof STAGES)[number];

/** Stages after which an order's model files are no longer needed for the work. */
export const FINISHED_STAGES = ["closed", "cancelled"] as const satisfies readonly Stage[];
