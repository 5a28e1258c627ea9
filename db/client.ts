import { createClient, type Client, type InValue } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import Database from "libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";
import { gateWrites, isReadOnlyStatement, WriteGate } from "./write-gate";

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
  const db = drizzle(client, { schema });
  const file = url.startsWith("file:") ? url.slice("file:".length).split("?")[0]! : "";
  if (file && file !== ":memory:") readers.set(db, { file: path.resolve(file), timeoutMs: busyTimeoutMs(), statements: new Map() });
  // closing the client closes the read connection too
  const closing = new Proxy(client, {
    get(target, prop) {
      if (prop === "close") return () => { closeReader(db); target.close(); };
      return Reflect.get(target, prop) as unknown;
    },
  });
  return { db, client: closing };
}

/**
 * The hot reads' own connection (the guard's user, the lists, the board's counter): one
 * synchronous libSQL connection per database file and process, its statements prepared once.
 * Through the query builder and the async client each such read cost 0.3–1 ms of CPU (building
 * the SQL, preparing the statement again, mapping the row); prepared here, 0.02–0.4 ms. Reads
 * only (a statement that could write is refused); each runs in its own read transaction, so it
 * sees every write committed before it (WAL), from this process or another.
 */
interface Reader {
  file: string;
  timeoutMs: number;
  conn?: Database.Database;
  statements: Map<string, Database.Statement>;
  /** `pragma data_version`, prepared once. */
  version?: Database.Statement;
}

/**
 * On globalThis, as the database itself is (`getDb`): the production build bundles this module
 * into many server chunks (routes, pages, instrumentation), each its own copy, and a reader kept
 * in one copy's map was not found from the others, whose reads then went through the async client
 * and prepared their statement again on every call.
 */
const readers = ((globalThis as unknown as { layerwrightReaders?: WeakMap<Db, Reader> }).layerwrightReaders ??= new WeakMap<Db, Reader>());
/** Distinct statements kept per connection (the code's own SQL, a few dozen shapes). */
const MAX_STATEMENTS = 256;

function closeReader(db: Db): void {
  const r = readers.get(db);
  if (r?.conn) r.conn.close();
  readers.delete(db);
}

/**
 * Rows of a read-only statement (`?` parameters), as objects keyed by column name: prepared once
 * on the process's read connection when the database is a local file, else sent through the
 * client. Integers come back as numbers, timestamps as stored (milliseconds).
 */
export async function readRows<T extends Record<string, unknown>>(db: Db, sql: string, args: InValue[] = []): Promise<T[]> {
  if (!isReadOnlyStatement(sql)) throw new Error("readRows runs reads only");
  const r = readers.get(db);
  if (!r) {
    const res = await (db as unknown as { $client: Client }).$client.execute({ sql, args });
    return res.rows.map((row) => Object.fromEntries(res.columns.map((c, i) => [c, row[i]]))) as T[];
  }
  r.conn ??= new Database(r.file, { timeout: r.timeoutMs });
  let stmt = r.statements.get(sql);
  if (!stmt) {
    if (r.statements.size >= MAX_STATEMENTS) r.statements.clear();
    stmt = r.conn.prepare(sql);
    r.statements.set(sql, stmt);
  }
  return stmt.all(...args) as T[];
}

/**
 * A number that changes whenever another connection commits to the database file: this
 * process's client, or another process (SQLite's `data_version`, read on the process's read
 * connection, which never writes). An answer built from reads after this number was read may be
 * served again while it is unchanged. Null when the database is not a local file: keep nothing.
 */
export function dataVersion(db: Db): number | null {
  const r = readers.get(db);
  if (!r) return null;
  r.conn ??= new Database(r.file, { timeout: r.timeoutMs });
  r.version ??= r.conn.prepare("pragma data_version");
  return Number((r.version.get() as { data_version: number }).data_version);
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
