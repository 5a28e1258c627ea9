import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";
import { gateWrites, WriteGate } from "./write-gate";

export type Db = LibSQLDatabase<typeof schema>;

/**
 * How long a statement waits for another connection's write lock before SQLITE_BUSY, in ms.
 * Every serving process, the job runner and the scripts share one file; a write transaction here
 * lasts milliseconds, so 10 s is only reached when something is wrong.
 */
export const DEFAULT_BUSY_TIMEOUT_MS = 10_000;

function busyTimeoutMs(): number {
  const raw = Number(process.env.DATABASE_BUSY_TIMEOUT_MS);
  return Number.isFinite(raw) && raw >= 0 ? raw : DEFAULT_BUSY_TIMEOUT_MS;
}

/**
 * A libSQL client for a database URL. For `file:` databases the busy timeout is the client's own
 * `timeout` option, which libSQL applies to every connection it opens (its pool opens more for
 * transactions); a `PRAGMA busy_timeout` would land on one pooled connection only. Foreign keys
 * are per connection too: libSQL is built with SQLITE_DEFAULT_FOREIGN_KEYS, so every connection
 * opens with them on; `assertForeignKeysByDefault` refuses a build without it. Writes within the
 * process queue on one gate per file (write-gate.ts says why the timeout alone would deadlock).
 */
export function openClient(url: string, authToken?: string, timeoutMs = busyTimeoutMs()): Client {
  const isFile = url.startsWith("file:");
  if (isFile) {
    const file = url.slice("file:".length);
    if (file && file !== ":memory:") mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  }
  const raw = createClient({ url, authToken, ...(isFile ? { timeout: timeoutMs } : {}) });
  const client = isFile ? gateWrites(raw, gateFor(url, timeoutMs)) : raw;
  if (isFile) {
    // WAL is a property of the file, not of a connection: set once, it holds for every connection
    // and process. The first statement queued on the client, so it runs before any other.
    client.execute("PRAGMA journal_mode = WAL").catch((e: unknown) => console.error("database: could not switch to WAL", e));
    assertForeignKeysByDefault(client).catch((e: unknown) => console.error(e));
  }
  return client;
}

const gates = ((globalThis as unknown as { layerwrightWriteGates?: Map<string, WriteGate> }).layerwrightWriteGates ??= new Map());

/** One gate per database file in this process, however many clients open it. */
function gateFor(url: string, timeoutMs: number): WriteGate {
  const file = url.slice("file:".length).split("?")[0]!;
  const key = file === ":memory:" || file === "" ? url : path.resolve(file);
  let gate = gates.get(key);
  if (!gate) {
    // A queued write waits as long as libSQL would wait for another process's lock, and as long again.
    gate = new WriteGate(Math.max(2 * timeoutMs, 1000));
    gates.set(key, gate);
  }
  return gate;
}

/** Throws when this libSQL build opens connections without foreign-key enforcement. */
export async function assertForeignKeysByDefault(client: Client): Promise<void> {
  const r = await client.execute("PRAGMA compile_options");
  const options = r.rows.map((row) => String(row[0]));
  if (!options.includes("DEFAULT_FOREIGN_KEYS")) {
    throw new Error("database: this libSQL build does not enforce foreign keys on new connections (DEFAULT_FOREIGN_KEYS missing)");
  }
}

/** Open a database by URL (see `openClient` for the per-connection settings). */
export function openDb(url: string, authToken?: string): { db: Db; client: Client } {
  const client = openClient(url, authToken);
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
