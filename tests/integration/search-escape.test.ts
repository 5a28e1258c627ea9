/**
 * Searches take `%` and `_` literally: the requests search (which escaped them but had no ESCAPE
 * clause, so found nothing), the ledger and the quotes (which did not escape them at all).
 */
import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listLedger } from "../../db/queries/ledger";
import { listQuotes } from "../../db/queries/quotes";
import { listRequestsForScope } from "../../db/queries/requests";
import { orders, organisations, payments, quotes, requests } from "../../db/schema";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let orgId: string;
let percentRef: string;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  // A request with a payment and a quote, renamed so that its project and its firm carry % and _.
  const [paid] = await t.db.select({ orderId: payments.orderId }).from(payments).where(eq(payments.status, "paid")).limit(1);
  const [order] = await t.db.select({ requestId: orders.requestId }).from(orders).where(eq(orders.id, paid!.orderId));
  const [req] = await t.db.select().from(requests).where(eq(requests.id, order!.requestId));
  orgId = req!.orgId;
  percentRef = req!.reference;
  await t.db.update(requests).set({ projectName: "Scale model 10% lip_edge" }).where(eq(requests.id, req!.id));
  await t.db.update(organisations).set({ name: "Firm 50%_off" }).where(eq(organisations.id, orgId));
}, 120_000);
afterAll(() => t?.close());

describe("searches with % and _", () => {
  it("the requests search finds a literal % and _ and nothing else", async () => {
    const scope = { orgId };
    expect((await listRequestsForScope(t.db, scope, { search: "10%" })).rows.map((r) => r.reference)).toEqual([percentRef]);
    expect((await listRequestsForScope(t.db, scope, { search: "lip_edge" })).rows.map((r) => r.reference)).toEqual([percentRef]);
    // A bare % or _ means those characters, not "anything".
    const all = (await listRequestsForScope(t.db, scope, {})).rows.length;
    expect(all).toBeGreaterThan(1);
    expect((await listRequestsForScope(t.db, scope, { search: "%" })).rows.map((r) => r.reference)).toEqual([percentRef]);
    expect((await listRequestsForScope(t.db, scope, { search: "lip%edge" })).rows).toEqual([]);
  });

  it("the ledger search does the same", async () => {
    const everything = await listLedger(t.db, { pageSize: 200 });
    const underscore = await listLedger(t.db, { q: "_", pageSize: 200 });
    const firm = await listLedger(t.db, { q: "50%_", pageSize: 200 });
    expect(underscore.rows.length).toBeLessThan(everything.rows.length);
    expect(firm.rows.length).toBeGreaterThan(0);
    expect(new Set(firm.rows.map((r) => r.firmName))).toEqual(new Set(["Firm 50%_off"]));
    expect(underscore.rows.every((r) => [r.reference, r.firmName, r.paymentIntentId].some((v) => v?.includes("_")))).toBe(true);
  });

  it("the quotes search does the same", async () => {
    const orgQuotes = await t.db.select({ id: quotes.id }).from(quotes).innerJoin(requests, eq(requests.id, quotes.requestId)).where(inArray(requests.orgId, [orgId]));
    const found = await listQuotes(t.db, { q: "50%_off", pageSize: 200 });
    expect(found.rows.length).toBe(orgQuotes.length);
    expect((await listQuotes(t.db, { q: "5_%", pageSize: 200 })).rows).toEqual([]);
  });
});
