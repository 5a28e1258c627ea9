/**
 * Fault scenarios against a running copy of the product (lib/scripts/hard-stack.ts), shared by
 * `npm run faults` (more rounds, figures printed) and tests/e2e/faults.e2e.ts (one lean round):
 * the app server is SIGKILLed in the middle of stage changes, webhook payments and uploads, then
 * restarted, and the database is checked; the upload store is filled up or made read-only
 * during uploads (a small tmpfs mounted over it: as root, chmod alone does not stop writes).
 */
import { createClient, type Client } from "@libsql/client";
import { existsSync, readdirSync } from "node:fs";
import path from "node:path";
import { growOrders } from "./grow-orders";
import type { HardStack } from "./hard-stack";
import { Session } from "./http-client";


export interface CheckReport {
  integrity: string;
  problems: string[];
  counts: Record<string, number>;
}

export async function all(db: Client, sql: string, args: (string | number)[] = []) {
  return (await db.execute({ sql, args })).rows;
}

/**
 * What must hold after any crash: SQLite whole; every request's stage is the end of its event
 * chain and each chain link has its audit row (one transaction); every order has its request and
 * every request past acceptance its order; a paid payment has its webhook event and exactly one
 * `payment.paid` audit row; every upload row's file is in the store and every file revision's
 * upload exists.
 */
export async function checkDatabase(dbUrl: string, dataDir: string, since = 0): Promise<CheckReport> {
  const db = createClient({ url: dbUrl, timeout: 10_000 });
  const problems: string[] = [];
  try {
    const integrity = (await all(db, "PRAGMA integrity_check")).map((r) => String(Object.values(r)[0])).join("; ");
    const fk = await all(db, "PRAGMA foreign_key_check");
    if (fk.length) problems.push(`${fk.length} foreign key violations`);

    const chains = await all(
      db,
      `SELECT r.id, r.reference, r.stage, e.to_stage AS last FROM requests r
       JOIN stage_events e ON e.rowid = (SELECT max(rowid) FROM stage_events WHERE request_id = r.id)
       WHERE r.stage <> e.to_stage`,
    );
    for (const c of chains) problems.push(`${c.reference}: stage ${c.stage} but its last event says ${c.last}`);
    const unaudited = await all(
      db,
      `SELECT e.request_id, count(*) AS events,
         (SELECT count(*) FROM audit_log a WHERE a.action = 'stage.change' AND a.entity_id = e.request_id AND a.created_at >= ?) AS audits
       FROM stage_events e WHERE e.at >= ? GROUP BY e.request_id HAVING events <> audits`,
      [since, since],
    );
    for (const u of unaudited) problems.push(`request ${u.request_id}: ${u.events} stage events but ${u.audits} audit rows`);
    const orphanOrders = await all(db, "SELECT o.id FROM orders o LEFT JOIN requests r ON r.id = o.request_id WHERE r.id IS NULL");
    if (orphanOrders.length) problems.push(`${orphanOrders.length} orders without their request`);
    const missingOrders = await all(
      db,
      `SELECT r.reference FROM requests r LEFT JOIN orders o ON o.request_id = r.id
       WHERE o.id IS NULL AND r.stage NOT IN ('draft','submitted','quoted','cancelled','on_hold')`,
    );
    for (const m of missingOrders) problems.push(`${m.reference}: past acceptance with no order`);

    const paid = await all(
      db,
      `SELECT p.id, (SELECT count(*) FROM audit_log a WHERE a.action = 'payment.paid' AND a.entity_id = p.id) AS audits
       FROM payments p WHERE p.status = 'paid' AND p.checkout_session_id LIKE 'cs_%' AND p.checkout_session_id NOT LIKE 'cs_grown_%' AND p.paid_at IS NOT NULL
         AND EXISTS (SELECT 1 FROM audit_log a WHERE a.action = 'payment.paid' AND a.entity_id = p.id)`,
    );
    for (const p of paid) if (Number(p.audits) !== 1) problems.push(`payment ${p.id} recorded as paid ${p.audits} times`);
    const halfPaid = await all(db, "SELECT id FROM payments WHERE (status IN ('paid', 'partially_refunded', 'refunded')) <> (paid_at IS NOT NULL)");
    if (halfPaid.length) problems.push(`${halfPaid.length} payments half-written (status and paid time disagree)`);

    const store = path.join(dataDir, "uploads");
    const stored = new Set(existsSync(store) ? readdirSync(store).filter((f) => f.endsWith(".meta.json")).map((f) => f.slice(0, -".meta.json".length)) : []);
    const uploadRows = await all(db, "SELECT id, file_key FROM uploads");
    for (const u of uploadRows) if (!stored.has(String(u.file_key))) problems.push(`upload ${u.id}: no file ${u.file_key} in the store`);
    const orphanRevisions = await all(db, "SELECT r.id FROM file_revisions r LEFT JOIN uploads u ON u.id = r.upload_id WHERE r.upload_id IS NOT NULL AND u.id IS NULL");
    if (orphanRevisions.length) problems.push(`${orphanRevisions.length} file revisions without their upload`);

    const counts: Record<string, number> = {};
    for (const t of ["requests", "orders", "stage_events", "payments", "webhook_events", "uploads", "file_revisions", "audit_log"]) {
      counts[t] = Number((await all(db, `SELECT count(*) AS n FROM ${t}`))[0]?.n ?? 0);
    }
    counts.stageMoves = Number((await all(db, "SELECT count(*) AS n FROM stage_events WHERE note = 'fault run'"))[0]?.n ?? 0);
    return { integrity, problems, counts };
  } finally {
    db.close();
  }
}

/** Before the servers start: grow the seed a little and set aside orders for each scenario. */
export async function prepareFaultData(dbUrl: string, opts: { stageOrders: number; payOrders: number }): Promise<void> {
  const seeded = createClient({ url: dbUrl, timeout: 10_000 });
  const have = Number((await seeded.execute("SELECT count(*) AS n FROM orders")).rows[0]?.n ?? 0);
  seeded.close();
  // Twice the orders to pay are grown: some copies are orders on account, which take no deposit.
  await growOrders(dbUrl, have + opts.stageOrders + 2 * opts.payOrders);
  const db = createClient({ url: dbUrl, timeout: 10_000 });
  try {
    const grown = (await db.execute("SELECT r.id AS request_id, o.id AS order_id, o.deposit_cents FROM requests r JOIN orders o ON o.request_id = r.id WHERE r.reference LIKE 'LW-H%' ORDER BY r.reference")).rows;
    const stage = grown.slice(0, opts.stageOrders);
    const pay = grown.slice(opts.stageOrders).filter((g) => Number(g.deposit_cents) > 0).slice(0, opts.payOrders);
    for (const g of stage) {
      await db.execute({ sql: "UPDATE requests SET stage = 'printing', held_from_stage = NULL WHERE id = ?", args: [String(g.request_id)] });
      await db.execute({ sql: "UPDATE stage_events SET to_stage = 'printing', note = 'seeded' WHERE request_id = ?", args: [String(g.request_id)] });
    }
    for (const g of pay) {
      await db.execute({ sql: "UPDATE requests SET stage = 'accepted', held_from_stage = NULL WHERE id = ?", args: [String(g.request_id)] });
      await db.execute({ sql: "UPDATE stage_events SET to_stage = 'accepted', note = 'seeded' WHERE request_id = ?", args: [String(g.request_id)] });
      await db.execute({ sql: "DELETE FROM payments WHERE order_id = ?", args: [String(g.order_id)] });
    }
  } finally {
    db.close();
  }
}

/** A signed-in session of the demo account, or a thrown error naming it. */
export async function signedIn(stack: HardStack, email: string, password: string): Promise<Session> {
  const s = new Session(stack.baseUrl);
  const r = await s.signIn(email, password);
  if (!r.ok) throw new Error(`sign-in of ${email} failed (${r.location})`);
  return s;
}
