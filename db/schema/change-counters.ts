import { integer, sqliteTable, text } from "drizzle-orm/sqlite-core";

/**
 * Counters that SQLite triggers raise on every change to the rows a cached view is built from
 * (migration 0002: "board" counts inserts, deletes and relevant updates of requests, orders and
 * organisations). A process may serve a cached view while its counter is unchanged: exact across
 * processes and connections, because the database itself keeps the count.
 */
export const changeCounters = sqliteTable("change_counters", {
  name: text("name").primaryKey(),
  n: integer("n").notNull().default(0),
});
