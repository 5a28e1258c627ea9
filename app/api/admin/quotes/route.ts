import { NextResponse } from "next/server";
import { getDb } from "@/db/client";
import { listQuotes, quoteOutcomeRows } from "@/db/queries/quotes";
import { requirePermission } from "@/lib/auth/guard";
import { withErrors } from "@/lib/auth/route";
import { turnaround, winRate } from "@/lib/quoting/stats";
import { quoteListQuerySchema } from "@/lib/validation/admin-quotes";

export const dynamic = "force-dynamic";

/** Quotes by status (server-side filter, sort, page) with the win rate and turnaround. */
export const GET = withErrors(async (req: Request) => {
  await requirePermission("quote:manage");
  const query = quoteListQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const db = getDb();
  const [list, outcome] = await Promise.all([listQuotes(db, query), quoteOutcomeRows(db)]);
  return NextResponse.json({ ...list, stats: { winRate: winRate(outcome.outcomes, new Date()), turnaround: turnaround(outcome.turnaround) } });
});
