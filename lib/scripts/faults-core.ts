/**
 * Fault scenarios against a running copy of the product (lib/scripts/hard-stack.ts), shared by
 * `npm run faults` (more rounds, figures printed) and tests/e2e/faults.e2e.ts (one lean round):
 * the app server is SIGKILLed in the middle of stage changes, webhook payments and uploads, then
 * restarted, and the database is checked; the upload store is filled up or made read-only
 * during uploads (a small tmpfs mounted over it: as root, chmod alone does not stop writes).
 */
import { createClient, type Client } from "@libsql/client";
import { execFileSync } from "node:child_process";
import { cpSync, existsSync, mkdirSync, readdirSync, renameSync, rmSync } from "node:fs";
import path from "node:path";
import Stripe from "stripe";
import { binaryStl, box, layupMold } from "../../mocks/fixtures/meshes";
import { createCheckoutSession } from "../payments/stripe";
import { growOrders } from "./grow-orders";
import type { HardStack } from "./hard-stack";
import { listActions, Session } from "./http-client";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface CheckReport {
  integrity: string;
  problems: string[];
  counts: Record<string, number>;
}

async function all(db: Client, sql: string, args: (string | number)[] = []) {
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

async function signedIn(stack: HardStack, email: string, password: string): Promise<Session> {
  const s = new Session(stack.baseUrl);
  const r = await s.signIn(email, password);
  if (!r.ok) throw new Error(`sign-in of ${email} failed (${r.location})`);
  return s;
}

export interface StageFaultFigures {
  orders: number;
  movesAnswered: number;
  killedAfterMs: number;
  restartMs: number;
  check: CheckReport;
}

/** Production moves orders forward stage by stage, many at once; the server is killed midway. */
export async function stageChangeFault(stack: HardStack, opts: { killAfterMs: number; orders?: number }): Promise<StageFaultFigures> {
  const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
  const orders = (await db.execute("SELECT o.id FROM orders o JOIN requests r ON r.id = o.request_id WHERE r.stage = 'printing' AND r.reference LIKE 'LW-H%' ORDER BY r.reference LIMIT ?", [opts.orders ?? 1000])).rows.map((r) => String(r.id));
  db.close();
  const action = listActions(stack.distDir).find((a) => a.name === "moveStage" && a.file.includes("admin/production"));
  if (!action) throw new Error("moveStage action not found in the build");
  const session = await signedIn(stack, "production@ostrevane.example", "demo-production-2026");
  const path_ = ["cooling", "machining", "inspection", "finishing", "packed"];
  let answered = 0;
  let killed = false;
  const loops = orders.map(async (orderId) => {
    for (const to of path_) {
      if (killed) return;
      try {
        const r = await session.callAction(action, [{ orderId, to, note: "fault run" }]);
        if (r.status === 200) answered += 1;
      } catch {
        return; // connection dropped by the kill
      }
    }
  });
  const started = Date.now();
  await sleep(opts.killAfterMs);
  killed = true;
  await stack.killApp();
  const killedAfterMs = Date.now() - started;
  await Promise.allSettled(loops);
  const t0 = Date.now();
  await stack.restartApp();
  return { orders: orders.length, movesAnswered: answered, killedAfterMs, restartMs: Date.now() - t0, check: await checkDatabase(stack.dbUrl, stack.dataDir, started - 1000) };
}

export interface WebhookFaultFigures {
  payments: number;
  eventsBeforeKill: number;
  processed: number;
  paidOnce: boolean;
  replayedOutcomes: Record<string, number>;
  check: CheckReport;
}

function stripeFor(stack: HardStack): Stripe {
  return new Stripe(stack.env.STRIPE_SECRET_KEY!, { host: "127.0.0.1", port: stack.ports.stripe, protocol: "http", maxNetworkRetries: 0 });
}

async function fakeEvents(stack: HardStack) {
  const res = await fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/events`);
  return ((await res.json()) as { data: { id: string; type: string; delivery: { attempts: number; deliveredAt: number | null } }[] }).data;
}

/**
 * Deposits waiting to be paid on the grown orders at `accepted` that take one (an order on account
 * has none): a pending payment row and its
 * checkout session on the payment fake for each (at most `count`); returns the sessions' ids.
 */
export async function pendingDeposits(stack: HardStack, db: Client, count: number, label: string): Promise<string[]> {
  const stripe = stripeFor(stack);
  const targets = (await db.execute("SELECT o.id AS order_id, o.org_id, o.deposit_cents, o.currency FROM orders o JOIN requests r ON r.id = o.request_id WHERE r.stage = 'accepted' AND r.reference LIKE 'LW-H%' AND o.deposit_cents > 0 ORDER BY r.reference LIMIT ?", [count])).rows;
  const sessions: string[] = [];
  for (const t of targets) {
    const paymentId = crypto.randomUUID();
    await db.execute({
      sql: "INSERT INTO payments (id, order_id, org_id, kind, status, amount_cents, refunded_cents, currency, created_at) VALUES (?, ?, ?, 'deposit', 'pending', ?, 0, ?, ?)",
      args: [paymentId, String(t.order_id), String(t.org_id), Number(t.deposit_cents), String(t.currency), Date.now()],
    });
    const s = await createCheckoutSession(
      { paymentId, orderId: String(t.order_id), amountCents: Number(t.deposit_cents), currency: String(t.currency), description: `Deposit (${label})`, successUrl: `${stack.baseUrl}/portal`, cancelUrl: `${stack.baseUrl}/portal`, idempotencyKey: `${label.replaceAll(" ", "-")}-${paymentId}` },
      stripe,
    );
    await db.execute({ sql: "UPDATE payments SET checkout_session_id = ? WHERE id = ?", args: [s.id, paymentId] });
    sessions.push(s.id);
  }
  return sessions;
}

/**
 * Deposits paid on the payment fake one after another while its webhooks reach the app; the app
 * is killed midway, so some events are left unacknowledged. After the restart the fake resends
 * them; every payment must be recorded exactly once, and a second full replay changes nothing.
 */
export async function webhookFault(stack: HardStack, opts: { killAfterMs: number; payments?: number }): Promise<WebhookFaultFigures> {
  const since = Date.now();
  const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
  const eventsAtStart = Number((await db.execute("SELECT count(*) AS n FROM webhook_events")).rows[0]!.n);
  const sessions = await pendingDeposits(stack, db, opts.payments ?? 1000, "fault run");
  const started = Date.now();
  const paying = (async () => {
    for (const id of sessions) {
      await fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/pay/${id}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ card: "4242424242424242" }) });
      await sleep(50);
    }
  })();
  await sleep(Math.max(0, opts.killAfterMs - (Date.now() - started)));
  await stack.killApp();
  await paying;
  const eventsBeforeKill = (await db.execute("SELECT count(*) AS n FROM webhook_events")).rows[0]!.n as number;
  await stack.restartApp();
  await fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/redeliver`, { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
  const deadline = Date.now() + 60_000;
  for (;;) {
    const pending = (await fakeEvents(stack)).filter((e) => e.type === "checkout.session.completed" && e.delivery.deliveredAt === null);
    if (pending.length === 0) break;
    if (Date.now() > deadline) throw new Error(`${pending.length} webhook events still unacknowledged after the restart`);
    await sleep(250);
  }
  // Replay every event once more (as a processor may): all must come back as duplicates.
  const completed = (await fakeEvents(stack)).filter((e) => e.type === "checkout.session.completed");
  const before = await db.execute("SELECT count(*) AS n FROM webhook_events");
  for (const e of completed) await fetch(`http://127.0.0.1:${stack.ports.stripe}/_fake/redeliver`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ id: e.id }) });
  for (let i = 0; i < 240 && (await fakeEvents(stack)).some((e) => e.delivery.deliveredAt === null); i++) await sleep(250);
  const after = await db.execute("SELECT count(*) AS n FROM webhook_events");
  const outcomes = await db.execute("SELECT outcome, count(*) AS n FROM webhook_events GROUP BY outcome");
  const paidRows = await db.execute({ sql: `SELECT count(*) AS n FROM payments WHERE status = 'paid' AND checkout_session_id IN (${sessions.map(() => "?").join(",")})`, args: sessions });
  const movedRows = await db.execute({
    sql: `SELECT count(*) AS n FROM stage_events e JOIN orders o ON o.request_id = e.request_id JOIN payments p ON p.order_id = o.id WHERE e.to_stage = 'deposit_paid' AND p.checkout_session_id IN (${sessions.map(() => "?").join(",")})`,
    args: sessions,
  });
  db.close();
  const check = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  const paidOnce = Number(paidRows.rows[0]!.n) === sessions.length && Number(movedRows.rows[0]!.n) === sessions.length && Number(after.rows[0]!.n) === Number(before.rows[0]!.n);
  if (!paidOnce) check.problems.push(`payments paid ${paidRows.rows[0]!.n}/${sessions.length}, deposit_paid moves ${movedRows.rows[0]!.n}, events ${before.rows[0]!.n} → ${after.rows[0]!.n} after the replay`);
  return {
    payments: sessions.length,
    eventsBeforeKill: Number(eventsBeforeKill) - eventsAtStart,
    processed: Number(after.rows[0]!.n),
    paidOnce,
    replayedOutcomes: Object.fromEntries(outcomes.rows.map((r) => [String(r.outcome), Number(r.n)])),
    check,
  };
}

/** The browser's upload protocol (@uploadthing/react) by fetch, signed in. */
export async function uploadFile(session: Session, name: string, bytes: Uint8Array): Promise<{ status: number; body: Record<string, unknown> }> {
  const start = await session.fetch("/api/uploadthing?actionType=upload&slug=model", {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" },
    body: JSON.stringify({ files: [{ name, size: bytes.length, type: "model/stl", lastModified: Date.now() }], input: null }),
  });
  const startBody = (await start.json()) as unknown;
  if (!start.ok) return { status: start.status, body: startBody as Record<string, unknown> };
  const presigned = (startBody as { url: string; key: string }[])[0]!;
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(bytes)], { type: "model/stl" }), name);
  const put = await fetch(presigned.url, { method: "PUT", headers: { range: "bytes=0-", "x-uploadthing-version": "7.7.4" }, body: form });
  const text = await put.text();
  let body: Record<string, unknown>;
  try {
    body = JSON.parse(text) as Record<string, unknown>;
  } catch {
    body = { text };
  }
  return { status: put.status, body: { ...body, key: presigned.key } };
}

export interface UploadFaultFigures {
  started: number;
  completedBeforeKill: number;
  rowsAfter: number;
  check: CheckReport;
}

/** Several uploads in flight when the server is killed: no upload row without its stored file. */
export async function uploadFault(stack: HardStack, opts: { uploads: number; killAfterMs: number }): Promise<UploadFaultFigures> {
  const since = Date.now();
  const session = await signedIn(stack, "engineer@caldrith.example", "demo-client-2026");
  const bytes = binaryStl(layupMold(160, 80));
  const before = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  let completed = 0;
  const inFlight = Array.from({ length: opts.uploads }, async (_, i) => {
    await sleep(i * 20);
    try {
      const r = await uploadFile(session, `fault-${i}.stl`, bytes);
      if (r.status === 200 && !r.body.error) completed += 1;
    } catch {
      /* dropped by the kill */
    }
  });
  await sleep(opts.killAfterMs);
  await stack.killApp();
  const completedBeforeKill = completed;
  await Promise.allSettled(inFlight);
  await stack.restartApp();
  const check = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  return { started: opts.uploads, completedBeforeKill, rowsAfter: check.counts.uploads! - before.counts.uploads!, check };
}

export interface DiskFaultFigures {
  mode: "full" | "read-only";
  status: number;
  message: string;
  rowsAdded: number;
  recoveredStatus: number;
  check: CheckReport;
}

/** Mount a small tmpfs over the upload store (keeping its files); null when mounting is not allowed here. */
export function mountSmallStore(dataDir: string, sizeKb: number): { remount: (mode: "ro" | "rw") => void; unmount: () => void } | null {
  const store = path.join(dataDir, "uploads");
  const keep = path.join(dataDir, "uploads-before-mount");
  renameSync(store, keep);
  mkdirSync(store);
  try {
    execFileSync("mount", ["-t", "tmpfs", "-o", `size=${sizeKb}k`, "tmpfs", store], { stdio: "ignore" });
  } catch {
    rmSync(store, { recursive: true, force: true });
    renameSync(keep, store);
    return null;
  }
  cpSync(keep, store, { recursive: true });
  return {
    remount: (mode) => execFileSync("mount", ["-o", `remount,${mode}`, store], { stdio: "ignore" }),
    unmount: () => {
      execFileSync("umount", [store], { stdio: "ignore" });
      rmSync(store, { recursive: true, force: true });
      renameSync(keep, store);
    },
  };
}

/** An upload into a store that is full or read-only: a clear error, no upload row, and uploads work again once it has room. */
export async function diskFault(stack: HardStack, mode: "full" | "read-only", control: { remount: (m: "ro" | "rw") => void }): Promise<DiskFaultFigures> {
  const since = Date.now();
  const session = await signedIn(stack, "engineer@caldrith.example", "demo-client-2026");
  const before = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  if (mode === "read-only") control.remount("ro");
  // Full: the store has room for its files and about 512 KiB more, not for this 3 MB part.
  const big = binaryStl(layupMold(240, 120));
  const r = await uploadFile(session, `disk-${mode}.stl`, mode === "full" ? big : binaryStl(box(100, 100, 100)));
  if (mode === "read-only") control.remount("rw");
  const afterFault = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  const small = await uploadFile(session, `after-${mode}.stl`, binaryStl(box(50, 50, 50)));
  const check = await checkDatabase(stack.dbUrl, stack.dataDir, since);
  const message = String(r.body.error ?? r.body.message ?? r.body.text ?? "");
  if (small.status !== 200) check.problems.push(`the upload after the fault failed: ${JSON.stringify(small.body).slice(0, 300)}`);
  return { mode, status: r.status, message, rowsAdded: afterFault.counts.uploads! - before.counts.uploads!, recoveredStatus: small.status, check };
}
