import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../db/client";
import { listRequestsForScope, REQUEST_SORTS, type RequestScope } from "../../db/queries/requests";
import { memberships, requests, users } from "../../db/schema";
import type { Stage } from "../../db/schema/common";
import { decodeListCursor, encodeListCursor, type ListCursor } from "../../lib/validation/list-cursor";
import { listQuerySchema } from "../../lib/validation/request";
import { growOrders } from "../../lib/scripts/grow-orders";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;
let db: Db;
let firm: RequestScope;
let own: RequestScope;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date() });
  db = t.db;
  await growOrders(t.url, 300);
  const [lead] = await db.select({ id: users.id, orgId: memberships.orgId }).from(users).innerJoin(memberships, eq(memberships.userId, users.id)).where(eq(users.email, "lead@caldrith.example"));
  firm = { orgId: lead!.orgId };
  own = { orgId: lead!.orgId, createdById: lead!.id };
}, 120_000);
afterAll(() => t?.close());

/** Every row of the scope in one sorted page: the reference the paged reads must match. */
async function whole(scope: RequestScope, sort: (typeof REQUEST_SORTS)[number], dir: "asc" | "desc") {
  const { rows, total } = await listRequestsForScope(db, scope, { sort, dir, limit: 200 });
  expect(rows.length).toBe(Math.min(total, 200));
  return rows;
}

describe("the portal request list (ids first, then the page's columns)", () => {
  it("every sort, both ways, comes back in its order with the id as tie-break, and pages join up without gaps or repeats", async () => {
    for (const sort of REQUEST_SORTS) {
      for (const dir of ["asc", "desc"] as const) {
        const all = await whole(firm, sort, dir);
        const key = (r: (typeof all)[number]) => {
          const v = { updatedAt: r.updatedAt.getTime(), reference: r.reference, projectName: r.projectName, stage: r.stage, neededBy: r.neededBy?.getTime() ?? null, totalCents: r.totalCents === null ? null : Number(r.totalCents) }[sort];
          return v;
        };
        // SQLite orders NULL first ascending, last descending; strings by bytes
        const cmp = (a: ReturnType<typeof key>, b: ReturnType<typeof key>) => (a === b ? 0 : a === null ? -1 : b === null ? 1 : a < b ? -1 : 1);
        for (let i = 1; i < all.length; i++) {
          const c = cmp(key(all[i - 1]!), key(all[i]!));
          expect(dir === "asc" ? c <= 0 : c >= 0, `${sort} ${dir} at ${i}`).toBe(true);
          if (c === 0) expect(all[i - 1]!.id > all[i]!.id, `${sort} ${dir} tie-break at ${i}`).toBe(true);
        }
        const paged = [];
        for (let offset = 0; offset < all.length; offset += 37) paged.push(...(await listRequestsForScope(db, firm, { sort, dir, limit: 37, offset })).rows);
        expect(paged.map((r) => r.id)).toEqual(all.map((r) => r.id));
      }
    }
  }, 120_000);

  it("keeps { rows, total } with filters: a plain client sees only their own, a stage filter and a search narrow the total", async () => {
    const firmTotal = (await listRequestsForScope(db, firm)).total;
    const ownTotal = (await listRequestsForScope(db, own)).total;
    expect(firmTotal).toBeGreaterThan(ownTotal);
    const [counted] = await db.all<{ n: number }>(sql`select count(*) as n from requests where org_id = ${own.orgId} and created_by_id = ${own.createdById!}`);
    expect(ownTotal).toBe(Number(counted!.n));
    const closed = await listRequestsForScope(db, firm, { stages: ["closed"], limit: 200 });
    expect(closed.total).toBeGreaterThan(0);
    expect(closed.total).toBeLessThan(firmTotal);
    expect(closed.rows.every((r) => r.stage === "closed")).toBe(true);
    const one = (await listRequestsForScope(db, firm, { limit: 1 })).rows[0]!;
    const found = await listRequestsForScope(db, firm, { search: one.reference });
    expect(found.rows.map((r) => r.id)).toContain(one.id);
    expect(found.total).toBeLessThan(firmTotal);
    expect(await listRequestsForScope(db, firm, { offset: firmTotal + 10 })).toEqual({ rows: [], total: firmTotal, next: null });
  });

  it("each indexed sort reads its page from an index, with no whole-table sort step (query plan)", async () => {
    const plans: [string, string][] = [
      ["updated_at desc, id desc", "requests_org_idx"],
      ["project_name asc, id desc", "requests_org_project_idx"],
      ["needed_by desc, id desc", "requests_org_needed_idx"],
      ["stage asc, id desc", "requests_org_"],
    ];
    for (const [order, index] of plans) {
      const rows = await db.all<{ detail: string }>(sql.raw(`explain query plan select id from requests where org_id = '${firm.orgId}' order by ${order} limit 50`));
      const plan = rows.map((r) => r.detail).join(" | ");
      expect(plan, order).toContain(`USING COVERING INDEX ${index}`);
      // a whole sort step is what the indexes remove; mixed directions (asc, then id desc) may
      // still order ties within one value ("RIGHT PART OF ORDER BY"), which stops with the page
      expect(plan, order).not.toContain("TEMP B-TREE FOR ORDER BY");
    }
  });

  it("keyset pages (after the previous page's cursor) give the same rows as offset pages, for every sort both ways, filtered or not", async () => {
    const cases: [RequestScope, { stages?: Stage[]; search?: string }][] = [
      [firm, {}],
      [own, {}],
      [firm, { stages: ["closed", "shipped", "printing"] }],
      [firm, { search: "LW-" }],
    ];
    for (const [scope, filter] of cases) {
      for (const sort of REQUEST_SORTS) {
        for (const dir of ["asc", "desc"] as const) {
          const byOffset: string[] = [];
          let total = 0;
          for (let offset = 0; ; offset += 23) {
            const p = await listRequestsForScope(db, scope, { ...filter, sort, dir, limit: 23, offset });
            total = p.total;
            byOffset.push(...p.rows.map((r) => r.id));
            if (p.rows.length < 23) break;
          }
          const byCursor: string[] = [];
          let after: ListCursor | undefined;
          for (let i = 0; i < 1000; i++) {
            // through the cursor's text form, as a client sends it back
            const p = await listRequestsForScope(db, scope, { ...filter, sort, dir, limit: 23, after });
            expect(p.total, `${sort} ${dir}: the total does not depend on the page`).toBe(total);
            byCursor.push(...p.rows.map((r) => r.id));
            if (!p.next) break;
            after = decodeListCursor(encodeListCursor(p.next))!;
          }
          expect(byCursor.length, `${sort} ${dir} ${JSON.stringify(filter)}`).toBe(total);
          expect(byCursor, `${sort} ${dir} ${JSON.stringify(filter)}`).toEqual(byOffset);
        }
      }
    }
  }, 180_000);

  it("keyset pages stay in order across ties: many rows sharing one sort value are split between pages without a gap or a repeat", async () => {
    // the grown orders share a handful of stages; forty requests are given no needed-by date
    // (null) and forty one same date: the id alone orders each run, so a page ending inside a
    // run of equal values must resume inside it
    const ids = (await listRequestsForScope(db, firm, { limit: 80 })).rows.map((r) => r.id);
    for (const [i, id] of ids.entries()) await db.update(requests).set({ neededBy: i < 40 ? null : new Date("2027-05-03T00:00:00Z") }).where(eq(requests.id, id));
    for (const sort of ["stage", "neededBy"] as const) {
      for (const dir of ["asc", "desc"] as const) {
        const all = (await listRequestsForScope(db, firm, { sort, dir, limit: 200 })).rows;
        const key = (r: (typeof all)[number]) => (sort === "stage" ? r.stage : r.neededBy?.getTime() ?? null);
        const ties = all.filter((r, i) => i > 0 && key(all[i - 1]!) === key(r)).length;
        expect(ties, `${sort}: the scenario has ties to cross`).toBeGreaterThan(20);
        const seen: string[] = [];
        let after: ListCursor | undefined;
        for (;;) {
          const p = await listRequestsForScope(db, firm, { sort, dir, limit: 7, after });
          seen.push(...p.rows.map((r) => r.id));
          if (!p.next || seen.length >= all.length) break;
          after = decodeListCursor(encodeListCursor(p.next))!;
        }
        expect(seen.slice(0, all.length)).toEqual(all.map((r) => r.id));
        expect(new Set(seen).size).toBe(seen.length);
      }
    }
  });

  it("a keyset page starts inside the sort's index at the cursor (query plan), and a cursor the list did not give is refused", async () => {
    const first = await listRequestsForScope(db, firm, { limit: 10 });
    const { key: k, id } = first.next!;
    expect(k).toBe(first.rows.at(-1)!.updatedAt.getTime());
    expect(id).toBe(first.rows.at(-1)!.id);
    const rows = await db.all<{ detail: string }>(
      sql`explain query plan select r.id, r.updated_at as k from requests r where r.org_id = ${firm.orgId} and (r.updated_at <= ${k} and (r.updated_at < ${k} or r.id < ${id})) order by k desc, r.id desc limit 50`,
    );
    const plan = rows.map((r) => r.detail).join(" | ");
    expect(plan).toMatch(/requests_org_idx \(org_id=\? AND updated_at<\?\)/);
    expect(plan).not.toContain("TEMP B-TREE");
    expect(decodeListCursor(encodeListCursor(first.next!))).toEqual(first.next);
    for (const bad of ["not-a-cursor", Buffer.from("[1]").toString("base64url"), Buffer.from('[{"a":1},"x"]').toString("base64url"), Buffer.from('[1,""]').toString("base64url")]) {
      expect(decodeListCursor(bad), bad).toBeNull();
      const parsed = listQuerySchema.safeParse({ after: bad });
      expect(parsed.success, bad).toBe(false);
    }
  });
});
