import { createClient, type Client } from "@libsql/client";
import { spawn } from "node:child_process";
import { copyFileSync, existsSync, readdirSync, truncateSync, writeFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { backupDatabase, integrityCheck, tableChecksums } from "../../lib/scripts/db-backup";
import { restoreDatabase } from "../../lib/scripts/db-restore";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let writer: Client;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  writer = createClient({ url: t.url, timeout: 5000 });
});
afterAll(() => {
  writer?.close();
  t?.close();
});

/**
 * Numbered audit rows written one by one from another process until stopped, as the running app
 * would: a consistent snapshot holds 1..k with no gap.
 */
const WRITER = `
import { createClient } from "@libsql/client";
const db = createClient({ url: process.env.DB_URL, timeout: 5000 });
let n = 0, stop = false;
process.stdin.on("data", () => { stop = true; });
process.stdin.resume();
while (!stop) {
  n += 1;
  await db.execute({ sql: "INSERT INTO audit_log (id, action, entity_type, entity_id, created_at) VALUES (?, 'backup.probe', 'probe', ?, ?)", args: ["probe-" + n, String(n), Date.now()] });
  if (n === 1) console.log("started");
  await new Promise((r) => setImmediate(r));
}
db.close();
console.log("written " + n);
process.exit(0);
`;

async function startWriter() {
  const child = spawn(process.execPath, ["--input-type=module", "-e", WRITER], { cwd: process.cwd(), env: { ...process.env, DB_URL: t.url }, stdio: ["pipe", "pipe", "inherit"] });
  let out = "";
  child.stdout.on("data", (d: Buffer) => (out += d.toString()));
  const deadline = Date.now() + 20_000;
  while (!out.includes("started") && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
  if (!out.includes("started")) throw new Error("the writer process did not start");
  return {
    stop: async () => {
      child.stdin.write("stop\n");
      await new Promise((r) => child.once("exit", r));
      return Number(out.match(/written (\d+)/)?.[1] ?? 0);
    },
  };
}

async function probeNumbers(client: Client): Promise<number[]> {
  const r = await client.execute("SELECT CAST(entity_id AS INTEGER) AS n FROM audit_log WHERE action = 'backup.probe' ORDER BY n");
  return r.rows.map((row) => Number(row.n));
}

describe("backup and restore", () => {
  let backupFile = "";

  it("backs up while writes go on: the copy is whole and one moment's state", async () => {
    const w = await startWriter();
    await new Promise((r) => setTimeout(r, 150));
    const result = await backupDatabase({ url: t.url, dir: path.join(t.dataDir, "backups"), now: new Date("2026-12-02T08:30:00Z") });
    await new Promise((r) => setTimeout(r, 150));
    const written = await w.stop();
    backupFile = result.file;
    expect(path.basename(result.file)).toBe("layerwright-20261202T083000000Z.db");
    expect(result.bytes).toBeGreaterThan(0);

    const copy = createClient({ url: `file:${result.file}` });
    try {
      expect(await integrityCheck(copy)).toBe("ok");
      const inCopy = await probeNumbers(copy);
      // Writes went on before and after the snapshot, and the copy holds a gapless prefix.
      expect(inCopy.length).toBeGreaterThan(0);
      expect(inCopy.length).toBeLessThan(written);
      expect(inCopy).toEqual(Array.from({ length: inCopy.length }, (_, i) => i + 1));
    } finally {
      copy.close();
    }
  });

  it("restores the backup: every table's row count and checksum match the copy; the old database is kept aside", async () => {
    const copy = createClient({ url: `file:${backupFile}` });
    const expected = await tableChecksums(copy);
    copy.close();
    const live = createClient({ url: t.url });
    const before = await tableChecksums(live);
    live.close();
    expect(before.audit_log!.rows).toBeGreaterThan(expected.audit_log!.rows);

    writer.close();
    const r = await restoreDatabase({ url: t.url, file: backupFile, now: new Date("2026-12-02T09:00:00Z") });
    writer = createClient({ url: t.url });
    expect(r.keptAside && existsSync(r.keptAside)).toBe(true);

    const restored = createClient({ url: t.url });
    const after = await tableChecksums(restored);
    restored.close();
    expect(Object.keys(after)).toEqual(Object.keys(expected));
    expect(after).toEqual(expected);
    expect(after.requests!.rows).toBeGreaterThan(0);

    const aside = createClient({ url: `file:${r.keptAside}` });
    expect(await tableChecksums(aside)).toEqual(before);
    aside.close();
  });

  it("refuses a damaged or foreign file and leaves the database untouched", async () => {
    const live = createClient({ url: t.url });
    const before = await tableChecksums(live);
    live.close();
    const damaged = path.join(t.dataDir, "damaged.db");
    copyFileSync(backupFile, damaged);
    truncateSync(damaged, 8192);
    const garbage = path.join(t.dataDir, "garbage.db");
    writeFileSync(garbage, "this is not a database".repeat(200));
    const foreign = path.join(t.dataDir, "foreign.db");
    const other = createClient({ url: `file:${foreign}` });
    await other.execute("CREATE TABLE notes (body TEXT)");
    other.close();
    const asideBefore = readdirSync(t.dataDir).filter((f) => f.includes("before-restore")).length;

    await expect(restoreDatabase({ url: t.url, file: damaged })).rejects.toThrow(/integrity check|not a readable SQLite database/);
    await expect(restoreDatabase({ url: t.url, file: garbage })).rejects.toThrow(/not a readable SQLite database|integrity/);
    await expect(restoreDatabase({ url: t.url, file: foreign })).rejects.toThrow(/not a Layerwright database/);
    await expect(restoreDatabase({ url: t.url, file: path.join(t.dataDir, "missing.db") })).rejects.toThrow(/No backup file/);

    const now = createClient({ url: t.url });
    expect(await tableChecksums(now)).toEqual(before);
    now.close();
    expect(readdirSync(t.dataDir).filter((f) => f.includes("before-restore")).length).toBe(asideBefore);
  });
});
