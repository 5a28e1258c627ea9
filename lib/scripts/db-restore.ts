/**
 * `npm run db:restore FILE`: replace the database with a backup. Stop the app first: a running
 * server keeps its old file open and would go on writing to the copy that was moved aside.
 *
 * The backup must pass `PRAGMA integrity_check` and hold the migrations table; the current
 * database (with its -wal/-shm files) is kept beside it as `<name>.before-restore-<timestamp>`;
 * the backup is copied next to the target and renamed into place, so a crash midway leaves
 * either the old or the new file, never half of one.
 */
import { createClient } from "@libsql/client";
import { closeSync, copyFileSync, existsSync, fsyncSync, openSync, renameSync, statSync } from "node:fs";
import path from "node:path";
import { filePathOf, integrityCheck } from "./db-backup";

export interface RestoreResult {
  restored: string;
  keptAside: string | null;
  ms: number;
}

async function checkBackup(file: string): Promise<void> {
  if (!existsSync(file) || !statSync(file).isFile()) throw new Error(`No backup file at ${file}.`);
  const client = createClient({ url: `file:${file}` });
  try {
    let check: string;
    try {
      check = await integrityCheck(client);
    } catch (e) {
      throw new Error(`${file} is not a readable SQLite database (${e instanceof Error ? e.message : String(e)}).`);
    }
    if (check !== "ok") throw new Error(`${file} failed its integrity check (${check.slice(0, 300)}); nothing was changed.`);
    const migrations = await client.execute("SELECT count(*) AS n FROM sqlite_master WHERE type = 'table' AND name = '__drizzle_migrations'");
    if (Number(migrations.rows[0]?.n ?? 0) === 0) throw new Error(`${file} is not a Layerwright database (no migrations table); nothing was changed.`);
  } finally {
    client.close();
  }
}

export async function restoreDatabase(opts: { url: string; file: string; now?: Date }): Promise<RestoreResult> {
  const started = performance.now();
  const target = filePathOf(opts.url);
  const file = path.resolve(opts.file);
  if (file === target) throw new Error("The backup is the live database itself.");
  await checkBackup(file);

  let keptAside: string | null = null;
  if (existsSync(target)) {
    // Fold the WAL into the main file so the copy kept aside is whole on its own.
    const current = createClient({ url: `file:${target}` });
    try {
      await current.execute("PRAGMA wal_checkpoint(TRUNCATE)");
    } finally {
      current.close();
    }
    keptAside = `${target}.before-restore-${(opts.now ?? new Date()).toISOString().replace(/[-:.]/g, "")}`;
    renameSync(target, keptAside);
    for (const suffix of ["-wal", "-shm"]) if (existsSync(target + suffix)) renameSync(target + suffix, keptAside + suffix);
  }
  const tmp = `${target}.restoring`;
  copyFileSync(file, tmp);
  const fd = openSync(tmp, "r+");
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  renameSync(tmp, target);

  const restored = createClient({ url: `file:${target}` });
  try {
    const check = await integrityCheck(restored);
    if (check !== "ok") throw new Error(`The restored database failed its integrity check (${check}); the previous one is at ${keptAside}.`);
  } finally {
    restored.close();
  }
  return { restored: target, keptAside, ms: performance.now() - started };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const file = process.argv[2];
  if (!file) {
    console.error("usage: npm run db:restore -- FILE   (stop the app first)");
    process.exit(2);
  }
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  console.log("Restoring: the app and the local fakes must be stopped while this runs.");
  restoreDatabase({ url, file })
    .then((r) => console.log(`restored ${r.restored} from ${file} in ${r.ms.toFixed(0)} ms; previous database kept at ${r.keptAside ?? "(none existed)"}`))
    .catch((e: unknown) => {
      console.error(`restore refused: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    });
}
