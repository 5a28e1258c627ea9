import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { boardVersion } from "../../db/queries/orders";
import { orders, organisations, requests } from "../../db/schema";
import type * as BoardRoute from "../../app/api/admin/board/route";
import { BOARD_COLUMNS, BOARD_PAGE } from "../../lib/orders/board";
import { growOrders } from "../../lib/scripts/grow-orders";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { USER_BY_ROLE, userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));

interface Card { orderId: string; stage: string; reference: string }
interface Column { key: string; total: number; offset: number; cards: Card[] }

let t: TestDb;
let db: Db;
let route: typeof BoardRoute;
/** Orders per stage straight from the tables, to check the API's counts against. */
let expected: Map<string, number>;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  db = t.db;
  dbRef.db = db;
  // 8,000 orders of which ~1.5 % are delivered: the "Shipped" column then needs several pages.
  await growOrders(t.url, 8_000);
  const rows = await db.all<{ stage: string; n: number }>(sql`SELECT r.stage, count(*) AS n FROM requests r JOIN orders o ON o.request_id = r.id GROUP BY r.stage`);
  expected = new Map(rows.map((r) => [r.stage, Number(r.n)]));
  session.current = { user: { id: await userIdOf(db, USER_BY_ROLE.production) } };
  route = await import("../../app/api/admin/board/route");
}, 180_000);
afterAll(() => t?.close());

async function board(query = ""): Promise<{ status: number; body: { columns: Column[]; error?: { code: string } } }> {
  const res = await route.GET(new Request(`http://localhost/api/admin/board${query}`));
  return { status: res.status, body: await res.json() };
}

describe("production board API", () => {
  it("gives every column its true count and at most one page of cards", async () => {
    const { status, body } = await board();
    expect(status).toBe(200);
    expect(body.columns.map((c) => c.key)).toEqual(BOARD_COLUMNS.map((c) => c.key));
    for (const def of BOARD_COLUMNS) {
      const col = body.columns.find((c) => c.key === def.key)!;
      const total = def.stages.reduce((n, s) => n + (expected.get(s) ?? 0), 0);
      expect(col.total, def.key).toBe(total);
      expect(col.cards.length, def.key).toBe(Math.min(total, BOARD_PAGE));
      for (const card of col.cards) expect(def.stages as readonly string[]).toContain(card.stage);
    }
    // Closed and cancelled orders are history: never on the board.
    const all = body.columns.flatMap((c) => c.cards.map((x) => x.stage));
    expect(all).not.toContain("closed");
    expect(all).not.toContain("cancelled");
  });

  it("pages one column to its end without repeating or skipping a card", async () => {
    const first = (await board()).body.columns.find((c) => c.key === "shipped")!;
    expect(first.total).toBeGreaterThan(3 * BOARD_PAGE);
    const seen = first.cards.map((c) => c.orderId);
    while (seen.length < first.total) {
      const { status, body } = await board(`?column=shipped&offset=${seen.length}&limit=${BOARD_PAGE}`);
      expect(status).toBe(200);
      expect(body.columns).toHaveLength(1);
      const next = body.columns[0]!;
      expect(next.offset).toBe(seen.length);
      expect(next.cards.length).toBeGreaterThan(0);
      seen.push(...next.cards.map((c) => c.orderId));
    }
    expect(seen).toHaveLength(first.total);
    expect(new Set(seen).size).toBe(first.total);
  });

  it("serves a repeated answer from memory but never after a change to what it shows", async () => {
    const before = await boardVersion(db);
    const first = (await board()).body;
    expect(await boardVersion(db)).toBe(before); // reading changes nothing
    expect((await board()).body).toEqual(first);
    // Move one card from "Waiting" to "On hold" behind the API's back, as another process would.
    const waiting = first.columns.find((c) => c.key === "waiting")!;
    const moved = waiting.cards[0]!;
    await db.update(requests).set({ stage: "on_hold", heldFromStage: moved.stage as "accepted" }).where(eq(requests.reference, moved.reference));
    expect(await boardVersion(db)).toBeGreaterThan(before);
    const after = (await board()).body;
    expect(after.columns.find((c) => c.key === "waiting")!.total).toBe(waiting.total - 1);
    expect(after.columns.find((c) => c.key === "on-hold")!.total).toBe(first.columns.find((c) => c.key === "on-hold")!.total + 1);
    expect(after.columns.flatMap((c) => c.cards).find((c) => c.orderId === moved.orderId)?.stage).toBe("on_hold");
  });

  it("raises the board's counter for what the board shows, not for other edits", async () => {
    const v0 = await boardVersion(db);
    const [one] = await db.select({ id: requests.id }).from(requests).limit(1);
    await db.update(requests).set({ notes: "a note the board does not show" }).where(eq(requests.id, one!.id));
    expect(await boardVersion(db)).toBe(v0);
    await db.update(orders).set({ plannedShip: new Date("2027-02-01T00:00:00Z") }).where(eq(orders.requestId, one!.id));
    const [hasOrder] = await db.select({ id: orders.id }).from(orders).where(eq(orders.requestId, one!.id));
    expect(await boardVersion(db)).toBe(hasOrder ? v0 + 1 : v0);
    await db.update(organisations).set({ name: sql`${organisations.name}` });
    expect(await boardVersion(db)).toBeGreaterThan(v0);
  });

  it("refuses an unknown column, a page too big and unknown parameters", async () => {
    for (const q of ["?column=closed", "?limit=5000", "?offset=-1", "?stage=printing", "?limit=abc"]) {
      const { status, body } = await board(q);
      expect(status, q).toBe(400);
      expect(body.error?.code, q).toBe("invalid_input");
    }
  });

  it("answers the signed-out and clients without the board", async () => {
    session.current = null;
    expect((await board()).status).toBe(401);
    session.current = { user: { id: await userIdOf(db, USER_BY_ROLE.client_admin) } };
    expect((await board()).status).toBe(403);
    session.current = { user: { id: await userIdOf(db, USER_BY_ROLE.production) } };
  });
});
