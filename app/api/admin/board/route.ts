import { NextResponse } from "next/server";
import { z } from "zod";
import { getDb } from "@/db/client";
import { countOrdersByStage, listBoardColumn } from "@/db/queries/orders";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { BOARD_COLUMNS, BOARD_PAGE, BOARD_PAGE_MAX, boardColumn } from "@/lib/orders/board";

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
 */
export const GET = withErrors(async (req: Request) => {
  await requirePermission("production:board");
  const q = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const db = getDb();
  const columns = q.column ? [boardColumn(q.column)!] : BOARD_COLUMNS;
  const [counts, cards] = await Promise.all([
    countOrdersByStage(db, columns.flatMap((c) => c.stages)),
    Promise.all(columns.map((c) => listBoardColumn(db, c.stages, { limit: q.limit, offset: q.offset }))),
  ]);
  return NextResponse.json(
    {
      columns: columns.map((c, i) => ({
        key: c.key,
        title: c.title,
        total: c.stages.reduce((n, s) => n + (counts[s] ?? 0), 0),
        offset: q.offset,
        cards: cards[i]!,
      })),
    },
    { headers: { "cache-control": "no-store" } },
  );
});
