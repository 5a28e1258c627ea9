/**
 * `npm run db:backup`: a consistent snapshot of the running app's SQLite database into
 * DATA_DIR/backups/layerwright-<UTC timestamp>.db. `VACUUM INTO` reads inside one read
 * transaction, so writers may go on meanwhile (WAL mode) and the copy is the database as of one
 * moment. The copy is checked with `PRAGMA integrity_check` before it is reported.
 */
import { createClient, type Client } from "@libsql/client";
import { createHash } from "node:crypto";
import { mkdirSync, statSync } from "node:fs";
import path from "node:path";

export function filePathOf(url: string): string {
  if (!url.startsWith("file:")) throw new Error(`Backups work on local SQLite files only (DATABASE_URL is ${url.split(":")[0]}:…).`);
  return path.resolve(url.slice("file:".length));
}

/** `layerwright-20261201T120000123Z.db` */
export function backupName(now: Date): string {
  return `layerwright-${now.toISOString().replace(/[-:.]/g, "")}.db`;
}

export async function integrityCheck(client: Client): Promise<string> {
  const r = await client.execute("PRAGMA integrity_check");
  return r.rows.map((row) => String(Object.values(row)[0])).join("; ");
}

export interface BackupResult {
  file: string;
  bytes: number;
  ms: number;
}

export async function backupDatabase(opts: { url: string; dir: string; now?: Date }): Promise<BackupResult> {
  const source = filePathOf(opts.url);
  statSync(source); // a missing database is an error, not an empty backup
  mkdirSync(opts.dir, { recursive: true });
  const file = path.join(path.resolve(opts.dir), backupName(opts.now ?? new Date()));
  const started = performance.now();
  // The client's own timeout covers every connection it opens (a PRAGMA would cover one).
  const client = createClient({ url: `file:${source}`, timeout: 10_000 });
  try {
    await client.execute({ sql: "VACUUM INTO ?", args: [file] });
  } finally {
    client.close();
  }
  const copy = createClient({ url: `file:${file}` });
  try {
    const check = await integrityCheck(copy);
    if (check !== "ok") throw new Error(`The backup ${file} failed its integrity check: ${check}`);
  } finally {
    copy.close();
  }
  return { file, bytes: statSync(file).size, ms: performance.now() - started };
}

/** Row count and a SHA-256 over every row (in rowid order) of each table, for comparing copies. */
export async function tableChecksums(client: Client): Promise<Record<string, { rows: number; sha256: string }>> {
  const tables = await client.execute("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name");
  const out: Record<string, { rows: number; sha256: string }> = {};
  for (const t of tables.rows) {
    const name = String(t.name);
    const quoted = `"${name.replaceAll('"', '""')}"`;
    const rows = await client.execute(`SELECT * FROM ${quoted} ORDER BY rowid`);
    const hash = createHash("sha256");
    for (const row of rows.rows) hash.update(JSON.stringify(rows.columns.map((c) => row[c] ?? null), (_k, v: unknown) => (typeof v === "bigint" ? v.toString() : v instanceof ArrayBuffer ? Buffer.from(v).toString("base64") : v)) + "\n");
    out[name] = { rows: rows.rows.length, sha256: hash.digest("hex") };
  }
  return out;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  const dir = path.join(process.env.DATA_DIR ?? "./data", "backups");
  backupDatabase({ url, dir })
    .then((r) => console.log(`backup written: ${r.file} (${(r.bytes / 1024).toFixed(0)} KiB, ${r.ms.toFixed(0)} ms, integrity ok)`))
    .catch((e: unknown) => {
      console.error(`backup failed: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    });
}
