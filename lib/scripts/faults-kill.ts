/** Fault scenarios: the app server killed in the middle of stage changes and webhook payments (see faults-core.ts). */
import { setTimeout as sleep } from "node:timers/promises";
import { createClient, type Client } from "@libsql/client";
import Stripe from "stripe";
import { createCheckoutSession } from "../payments/stripe";
import type { HardStack } from "./hard-stack";
import { listActions } from "./http-client";
import { checkDatabase, signedIn, type CheckReport } from "./faults-core";

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

