/**
 * Grow a seeded database to a given number of orders for load runs: each new order copies a
 * seeded request that has one (its firm, creator, quote and parts), with its own id, reference,
 * stage, dates, stage event and deposit.
 * Run alone: `DATABASE_URL=file:… tsx lib/scripts/grow-orders.ts 10000`.
 */
import { createClient, type Client, type InValue } from "@libsql/client";
import { randomUUID } from "node:crypto";

type Row = Record<string, InValue | undefined>;

const DAY = 86_400_000;
/**
 * Share of grown orders per stage (sums to 1): about three years of history, almost all closed,
 * with some 150 jobs between acceptance and delivery (invented; a few cells run a few dozen jobs
 * at a time, plus those waiting and shipped).
 */
const STAGE_MIX: [string, number][] = [
  ["closed", 0.919],
  ["cancelled", 0.05],
  ["delivered", 0.015],
  ["shipped", 0.002],
  ["accepted", 0.002],
  ["deposit_paid", 0.002],
  ["scheduled", 0.002],
  ["printing", 0.0015],
  ["cooling", 0.001],
  ["machining", 0.0015],
  ["inspection", 0.001],
  ["finishing", 0.001],
  ["packed", 0.001],
  ["on_hold", 0.001],
];

function stageFor(i: number, n: number): string {
  let acc = 0;
  const x = (i + 0.5) / n;
  for (const [stage, share] of STAGE_MIX) {
    acc += share;
    if (x < acc) return stage;
  }
  return "closed";
}

async function rows(db: Client, sql: string, args: InValue[] = []): Promise<Row[]> {
  const r = await db.execute({ sql, args });
  return r.rows.map((row) => Object.fromEntries(r.columns.map((c) => [c, row[c] as InValue])));
}

function insert(table: string, row: Row) {
  const cols = Object.keys(row);
  return { sql: `INSERT INTO ${table} (${cols.map((c) => `"${c}"`).join(", ")}) VALUES (${cols.map(() => "?").join(", ")})`, args: cols.map((c) => row[c] ?? null) };
}

/** Add orders until the database holds `total`; returns how many were added and the time taken. */
export async function growOrders(url: string, total: number, now = new Date()): Promise<{ added: number; ms: number }> {
  const started = performance.now();
  // The client's own timeout covers every connection it opens, transactions' included.
  const db = createClient({ url, timeout: 10_000 });
  try {
    const have = Number((await db.execute("SELECT count(*) AS n FROM orders")).rows[0]?.n ?? 0);
    const templates = await rows(db, "SELECT r.*, o.id AS _order_id FROM requests r JOIN orders o ON o.request_id = r.id ORDER BY r.reference");
    if (templates.length === 0) throw new Error("No seeded order to copy: seed the database first.");
    const orderOf = new Map<string, Row>();
    for (const o of await rows(db, "SELECT * FROM orders")) orderOf.set(String(o.request_id), o);
    const partsOf = new Map<string, Row[]>();
    for (const p of await rows(db, "SELECT * FROM parts")) {
      const list = partsOf.get(String(p.request_id)) ?? [];
      list.push(p);
      partsOf.set(String(p.request_id), list);
    }
    const toAdd = Math.max(0, total - have);
    const BATCH = 250;
    for (let start = 0; start < toAdd; start += BATCH) {
      const stmts: { sql: string; args: InValue[] }[] = [];
      for (let i = start; i < Math.min(toAdd, start + BATCH); i++) {
        const t = templates[i % templates.length]!;
        const { _order_id: _, ...request } = t;
        const stage = stageFor(i, toAdd);
        // Older orders further back: spread over about three years.
        const updatedAt = now.getTime() - Math.round(((toAdd - i) / toAdd) * 1100 * DAY) - (i % 97) * 3_600_000;
        const requestId = randomUUID();
        const n = String(have + i + 1).padStart(6, "0");
        stmts.push(
          insert("requests", {
            ...request,
            id: requestId,
            reference: `LW-H${n}`,
            project_name: `${String(request.project_name)} (${n})`,
            stage,
            held_from_stage: stage === "on_hold" ? "printing" : null,
            created_at: updatedAt - 20 * DAY,
            updated_at: updatedAt,
            ...(request.needed_by !== undefined ? { needed_by: updatedAt + 30 * DAY } : {}),
          }),
        );
        const order = orderOf.get(String(t.id))!;
        const orderId = randomUUID();
        stmts.push(insert("orders", { ...order, id: orderId, request_id: requestId, created_at: updatedAt - 15 * DAY, planned_start: updatedAt - 10 * DAY, planned_ship: updatedAt }));
        for (const p of partsOf.get(String(t.id)) ?? []) stmts.push(insert("parts", { ...p, id: randomUUID(), request_id: requestId, current_revision_id: null }));
        stmts.push(insert("stage_events", { id: randomUUID(), request_id: requestId, from_stage: null, to_stage: stage, actor_id: null, note: "grown for load runs", planned_at: null, at: updatedAt }));
        if (stage !== "accepted" && stage !== "cancelled") {
          stmts.push(
            insert("payments", {
              id: randomUUID(),
              order_id: orderId,
              org_id: order.org_id,
              kind: "deposit",
              status: "paid",
              amount_cents: order.deposit_cents,
              refunded_cents: 0,
              currency: order.currency,
              checkout_session_id: `cs_grown_${n}`,
              created_at: updatedAt - 14 * DAY,
              paid_at: updatedAt - 14 * DAY,
            }),
          );
        }
      }
      await db.batch(stmts, "write");
    }
    await db.execute("ANALYZE");
    return { added: toAdd, ms: performance.now() - started };
  } finally {
    db.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  const total = Number(process.argv[2] ?? 10_000);
  growOrders(url, total)
    .then((r) => console.log(`added ${r.added} orders in ${(r.ms / 1000).toFixed(1)} s (${url} now holds ${total})`))
    .catch((e: unknown) => {
      console.error(`growing failed: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    });
}
