import { listQuotes, quoteOutcomeRows } from "@/db/queries/quotes";
import { turnaround, winRate } from "@/lib/quoting/stats";
import { quotesAnswer } from "@/lib/contracts/admin";
import { defineRoute } from "@/lib/server/define-route";
import { quoteListQuerySchema } from "@/lib/validation/admin-quotes";

export const dynamic = "force-dynamic";

/** Quotes by status (server-side filter, sort, page) with the win rate and turnaround. */
export const GET = defineRoute({ access: "quote:manage", query: quoteListQuerySchema, response: quotesAnswer }, async ({ query, db }) => {
  const [list, outcome] = await Promise.all([listQuotes(db, query), quoteOutcomeRows(db)]);
  return { ...list, stats: { winRate: winRate(outcome.outcomes, new Date()), turnaround: turnaround(outcome.turnaround) } };
});
