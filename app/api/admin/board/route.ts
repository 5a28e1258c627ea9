import { NextResponse } from "next/server";
import { z } from "zod";
import type { Db } from "@/db/client";
import { boardVersion, countOrdersByStage, listBoardColumn } from "@/db/queries/orders";
import { BOARD_COLUMNS, BOARD_PAGE, BOARD_PAGE_MAX, boardColumn } from "@/lib/orders/board";
import { VersionedCache } from "@/lib/orders/board-cache";
import { boardAnswer } from "@/lib/contracts/production";
import { checkedAnswer, defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

const querySchema = z
  .object({
    column: z.enum(BOARD_COLUMNS.map((c) => c.key) as [string, ...string[]]).optional(),
    limit: z.coerce.number().int().min(1).max(BOARD_PAGE_MAX).default(BOARD_PAGE),
    offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
  })
  .strict();

/**
 * GET /api/admin/board → every column with its count and first `limit` cards (default 20).
 * GET /api/admin/board?column=shipped&offset=20&limit=20 → the next cards of one column.
 * The permission is checked on every request; only the built answer is reused, while the
 * database says nothing on the board has changed. The answer's contract: lib/contracts/production.ts.
 */
export const GET = defineRoute({ access: "production:board", query: querySchema }, async ({ query: q, db }) => {
  // Read first: a change landing while the answer is built raises it, and the next request rebuilds.
  const version = await boardVersion(db);
  const key = `${q.column ?? "*"}:${q.offset}:${q.limit}`;
  let body = answers.get(key, version);
  if (body === undefined) {
    body = await buildBoard(db, q);
    answers.set(key, version, body);
  }
  return new NextResponse(body, { headers: { "content-type": "application/json", "cache-control": "no-store" } });
});

/** Answers by query, valid while the board's change counter is unchanged (board-cache.ts). */
const answers = new VersionedCache<string>();

async function buildBoard(db: Db, q: z.infer<typeof querySchema>): Promise<string> {
  const columns = q.column ? [boardColumn(q.column)!] : BOARD_COLUMNS;
  const [counts, cards] = await Promise.all([
    countOrdersByStage(db, columns.flatMap((c) => c.stages)),
    Promise.all(columns.map((c) => listBoardColumn(db, c.stages, { limit: q.limit, offset: q.offset }))),
  ]);
  return JSON.stringify(checkedAnswer(boardAnswer, {
    columns: columns.map((c, i) => ({
      key: c.key,
      title: c.title,
      total: c.stages.reduce((n, s) => n + (counts[s] ?? 0), 0),
      offset: q.offset,
      cards: cards[i]!,
    })),
  }));
}
