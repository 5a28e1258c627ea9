import { getCurrentCell } from "@/db/queries/admin-catalogue";
import { listCellBlocks } from "@/db/queries/orders";
import { addPlantDays, fromPlantInput, plantToday } from "@/lib/dates";
import { AppError } from "@/lib/errors";
import { calendarAnswer } from "@/lib/contracts/production";
import { defineRoute } from "@/lib/server/define-route";
import { calendarQuerySchema } from "@/lib/validation/admin-production";

export const dynamic = "force-dynamic";

/** A printing cell's blocks over a window of days (default: from today, three weeks). */
export const GET = defineRoute({ access: "production:board", query: calendarQuerySchema, response: calendarAnswer }, async ({ query: q, db }) => {
  const cell = await getCurrentCell(db, q.cell);
  if (!cell) throw new AppError("not_found:cell", "That printing cell was not found.");
  // The window runs from the plant's midnight of `from` (lib/dates.ts) for `days` plant days.
  const day = q.from ?? plantToday();
  const from = fromPlantInput(`${day}T00:00`)!;
  const to = fromPlantInput(`${addPlantDays(day, q.days)}T00:00`)!;
  const blocks = await listCellBlocks(db, q.cell, from, to);
  return { cell: { key: cell.key, name: cell.params.name, calendar: cell.params.calendar }, from, to, blocks };
});
