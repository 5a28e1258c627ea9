/**
 * The database handle under concurrent writers: another process holding the write lock makes
 * every connection of ours wait (the client's own timeout, not a PRAGMA on one pooled
 * connection), writes inside one process queue instead of deadlocking on libSQL's sleeping busy
 * wait, and foreign keys hold on every connection.
 */
import { spawn } from "node:child_process";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDb, type Db } from "../../db/client";
import { auditLog } from "../../db/schema";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let db: Db;
let client: ReturnType<typeof openDb>["client"];

beforeAll(async () => {
  t = await createTestDb();
  ({ db, client } = openDb(t.url));
});
afterAll(() => {
  client?.close();
  t?.close();
});

/** Another process takes the write lock, says so, holds it for `holdMs`, then commits. */
const HOLDER = `
import { createClient } from "@libsql/client";
const db = createClient({ url: process.env.DB_URL, timeout: 5000 });
const tx = await db.transaction("write");
await tx.execute({ sql: "INSERT INTO audit_log (id, action, entity_type, entity_id, created_at) VALUES ('holder', 'lock.probe', 'probe', 'holder', ?)", args: [Date.now()] });
console.log("locked");
await new Promise((r) => setTimeout(r, Number(process.env.HOLD_MS)));
await tx.commit();
db.close();
console.log("released");
`;

async function holdWriteLock(holdMs: number): Promise<{ done: Promise<void> }> {
  const child = spawn(process.execPath, ["--input-type=module", "-e", HOLDER], {
    cwd: process.cwd(),
    env: { ...process.env, DB_URL: t.url, HOLD_MS: String(holdMs) },
    stdio: ["ignore", "pipe", "inherit"],
  });
  let out = "";
  child.stdout.on("data", (d: Buffer) => (out += d.toString()));
  const done = new Promise<void>((resolve, reject) => child.once("exit", (code) => (code === 0 ? resolve() : reject(new Error(`lock holder exited with ${code}`)))));
  const deadline = Date.now() + 20_000;
  while (!out.includes("locked") && Date.now() < deadline) await new Promise((r) => setTimeout(r, 10));
  if (!out.includes("locked")) throw new Error("the lock holder did not start");
  return { done };
}

const probe = (n: string) => ({ id: `w-${n}`, action: "lock.probe", entityType: "probe", entityId: n });

describe("database handle", () => {
  it("waits for another process's write lock on every connection, transactions' included", async () => {
    const holder = await holdWriteLock(700);
    const started = Date.now();
    // Transactions each take a connection of their own from libSQL's pool; plain writes another.
    const writes = await Promise.allSettled([
      ...Array.from({ length: 6 }, (_, i) => db.transaction(async (tx) => tx.insert(auditLog).values(probe(`tx-${i}`)))),
      ...Array.from({ length: 6 }, (_, i) => db.insert(auditLog).values(probe(`plain-${i}`))),
    ]);
    await holder.done;
    const failed = writes.filter((w) => w.status === "rejected").map((w) => String((w).reason));
    expect(failed).toEqual([]);
    expect(Date.now() - started).toBeGreaterThanOrEqual(300);
    const [n] = await db.select({ n: sql<number>`count(*)` }).from(auditLog).where(sql`${auditLog.action} = 'lock.probe'`);
    expect(n?.n).toBe(13);
  });

  it("runs concurrent write transactions of one process one after another, none busy", async () => {
    const results = await Promise.allSettled(
      Array.from({ length: 8 }, (_, i) =>
        db.transaction(async (tx) => {
          await tx.insert(auditLog).values(probe(`same-${i}`));
          await new Promise((r) => setTimeout(r, 20)); // awaits inside the transaction, as actions do
          return i;
        }),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(Array(8).fill("fulfilled"));
  });

  it("gives every pooled connection the busy timeout and foreign keys", async () => {
    // Read transactions hold their connections, so these are three distinct ones.
    const txs = await Promise.all([client.transaction("read"), client.transaction("read"), client.transaction("read")]);
    try {
      for (const tx of txs) {
        expect(Number((await tx.execute("PRAGMA busy_timeout")).rows[0]?.[0])).toBe(10_000);
        expect(Number((await tx.execute("PRAGMA foreign_keys")).rows[0]?.[0])).toBe(1);
      }
    } finally {
      for (const tx of txs) tx.close();
    }
    // A write transaction's connection refuses a dangling reference.
    const refused = await db
      .transaction((tx) => tx.run(sql`INSERT INTO memberships (id, org_id, user_id, created_at) VALUES ('m-x', 'no-such-org', 'no-such-user', 0)`))
      .then(() => null, (e: Error) => String(e.cause ?? e));
    expect(refused).toMatch(/FOREIGN KEY/);
  });
});
