import { getCurrentCell } from "@/db/queries/admin-catalogue";
import { listCellBlocks } from "@/db/queries/orders";
import { AppError } from "@/lib/errors";
import { defineRoute } from "@/lib/server/define-route";
import { calendarQuerySchema } from "@/lib/validation/admin-production";

export const dynamic = "force-dynamic";

/** A printing cell's blocks over a window of days (default: from today, three weeks). */
export const GET = defineRoute({ access: "production:board", query: calendarQuerySchema }, async ({ query: q, db }) => {
  const cell = await getCurrentCell(db, q.cell);
  if (!cell) throw new AppError("not_found:cell", "That printing cell was not found.");
  const from = q.from ? new Date(`${q.from}T00:00:00Z`) : new Date(new Date().toISOString().slice(0, 10) + "T00:00:00Z");
  const to = new Date(from.getTime() + q.days * 86_400_000);
  const blocks = await listCellBlocks(db, q.cell, from, to);
  return { cell: { key: cell.key, name: cell.params.name, calendar: cell.params.calendar }, from, to, blocks };
});
