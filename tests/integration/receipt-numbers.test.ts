import { readFileSync } from "node:fs";
import path from "node:path";
import { asc, eq, isNotNull } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { markPaymentPaid } from "../../db/queries/payments";
import { payments } from "../../db/schema";
import { parseReceiptNumber } from "@/db/receipt-number";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
}, 120_000);
afterAll(() => t?.close());

async function numbered() {
  return t.db.select({ id: payments.id, n: payments.receiptNumber, paidAt: payments.paidAt }).from(payments).where(isNotNull(payments.receiptNumber)).orderBy(asc(payments.paidAt), asc(payments.id));
}

/** Each year's numbers run 1, 2, 3… in the order the money arrived. */
function expectGapFreeSeries(rows: { n: string | null; paidAt: Date | null }[]) {
  const byYear = new Map<number, number[]>();
  for (const r of rows) {
    const p = parseReceiptNumber(r.n!);
    expect(p, r.n!).not.toBeNull();
    expect(p!.year).toBe(r.paidAt!.getUTCFullYear());
    byYear.set(p!.year, [...(byYear.get(p!.year) ?? []), p!.seq]);
  }
  for (const seqs of byYear.values()) expect(seqs).toEqual(seqs.map((_, i) => i + 1));
}

describe("receipt numbers", () => {
  it("the seed numbers every received payment and no other", async () => {
    const all = await t.db.select({ status: payments.status, n: payments.receiptNumber }).from(payments);
    const received = all.filter((p) => ["paid", "refunded", "partially_refunded"].includes(p.status));
    expect(received.length).toBeGreaterThan(3);
    expect(received.every((p) => p.n !== null)).toBe(true);
    expect(all.filter((p) => p.n === null).every((p) => !["paid", "refunded", "partially_refunded"].includes(p.status))).toBe(true);
    expectGapFreeSeries(await numbered());
  });

  it("a payment recorded as paid takes the next number of its year, once", async () => {
    const [pending] = await t.db.select().from(payments).where(eq(payments.status, "pending"));
    const before = await numbered();
    const year = 2026;
    const highest = Math.max(...before.map((r) => parseReceiptNumber(r.n!)!).filter((p) => p.year === year).map((p) => p.seq));
    const paidAt = new Date("2026-12-01T13:00:00Z");
    expect(await t.db.transaction((tx) => markPaymentPaid(tx, pending!.id, { checkoutSessionId: pending!.checkoutSessionId ?? "cs_case", paymentIntentId: null, paidAt }))).toBe(true);
    const [after] = await t.db.select().from(payments).where(eq(payments.id, pending!.id));
    expect(after!.receiptNumber).toBe(`RC-${year}-${String(highest + 1).padStart(5, "0")}`);
    // A replayed "paid" changes nothing, the number included.
    expect(await t.db.transaction((tx) => markPaymentPaid(tx, pending!.id, { checkoutSessionId: pending!.checkoutSessionId ?? "cs_case", paymentIntentId: null, paidAt }))).toBe(false);
    const [again] = await t.db.select().from(payments).where(eq(payments.id, pending!.id));
    expect(again!.receiptNumber).toBe(after!.receiptNumber);
  });

  it("a new year starts its own series at 1", async () => {
    const [pending] = await t.db.select().from(payments).where(eq(payments.status, "pending"));
    await t.db.transaction((tx) => markPaymentPaid(tx, pending!.id, { checkoutSessionId: pending!.checkoutSessionId ?? "cs_next", paymentIntentId: null, paidAt: new Date("2027-01-02T09:00:00Z") }));
    const [row] = await t.db.select().from(payments).where(eq(payments.id, pending!.id));
    expect(row!.receiptNumber).toBe("RC-2027-00001");
  });

  it("the migration numbers the payments received before receipt numbers existed", async () => {
    const sql = readFileSync(path.resolve(__dirname, "../../db/migrations/0003_receipt-numbers.sql"), "utf8");
    const backfill = sql.split("--> statement-breakpoint").find((s) => s.trim().startsWith("UPDATE"))!;
    const expected = (await numbered()).map((r) => ({ id: r.id, n: r.n }));
    await t.db.update(payments).set({ receiptNumber: null });
    await t.db.run(backfill);
    const rows = await numbered();
    expectGapFreeSeries(rows);
    // Same order of arrival, so the same numbers the live numbering gave.
    expect(rows.map((r) => ({ id: r.id, n: r.n }))).toEqual(expected);
  });
});
