import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";

export type Db = LibSQLDatabase<typeof schema>;

/** Open a database by URL; `file:` databases get WAL and a busy timeout. */
export function openDb(url: string, authToken?: string): { db: Db; client: Client } {
  if (url.startsWith("file:")) {
    const file = url.slice("file:".length);
    if (file && file !== ":memory:") mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  }
  const client = createClient({ url, authToken });
  if (url.startsWith("file:")) {
    // Fire and forget is not enough: these must hold before the first query.
    void client.execute("PRAGMA busy_timeout = 5000");
    void client.execute("PRAGMA journal_mode = WAL");
    void client.execute("PRAGMA foreign_keys = ON");
  }
  return { db: drizzle(client, { schema }), client };
}

const globalForDb = globalThis as unknown as { layerwrightDb?: { db: Db; client: Client } };

/** The process-wide database (one client per process). */
export function getDb(): Db {
  if (!globalForDb.layerwrightDb) {
    const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
    globalForDb.layerwrightDb = openDb(url, process.env.DATABASE_AUTH_TOKEN);
  }
  return globalForDb.layerwrightDb.db;
}
