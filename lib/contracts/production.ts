import { z } from "zod";
import { STAGE_LABEL } from "@/lib/labels";
import { keysOf, wireDate } from "./wire";

/**
 * Production's routes, as sent (app/api/admin/board, calendar, reports/actuals): one schema each,
 * used by the route (checked outside production) and by the component that reads it.
 */

const stage = keysOf(STAGE_LABEL);

/** GET /api/admin/board: orders by stage, in columns, each with its count and a page of cards. */
export const boardCard = z.object({
  orderId: z.string(),
  reference: z.string(),
  projectName: z.string(),
  firmName: z.string(),
  stage,
  heldFromStage: stage.nullable(),
  isControlled: z.boolean(),
  plannedShip: wireDate.nullable(),
});
export const boardColumn = z.object({ key: z.string(), title: z.string(), total: z.number().int(), offset: z.number().int(), cards: z.array(boardCard) });
export const boardAnswer = z.object({ columns: z.array(boardColumn) });
export type BoardCard = z.infer<typeof boardCard>;
export type BoardColumn = z.infer<typeof boardColumn>;
export type BoardAnswer = z.infer<typeof boardAnswer>;

/** GET /api/admin/calendar: one printing cell's blocks over a window of plant days. */
export const calendarAnswer = z.object({
  cell: z.object({ key: z.string(), name: z.string(), calendar: z.object({ workingWeekdays: z.array(z.number().int()) }) }),
  from: wireDate,
  to: wireDate,
  blocks: z.array(
    z.object({ id: z.string(), orderId: z.string(), kind: z.string(), startsAt: wireDate, endsAt: wireDate, reference: z.string(), projectName: z.string(), stage }),
  ),
});
export type CalendarAnswer = z.infer<typeof calendarAnswer>;

/** GET /api/admin/reports/actuals: each finished order's actuals against its estimate, and per material the error's mean and spread. */
const errorStats = z.object({ count: z.number().int(), meanPct: z.number().nullable(), spreadPct: z.number().nullable() });
export const actualsAnswer = z.object({
  perOrder: z.array(
    z.object({
      orderId: z.string(),
      reference: z.string(),
      projectName: z.string(),
      material: z.string(),
      actualPrintHours: z.number().nullable(),
      actualMaterialKg: z.number().nullable(),
      actualMachiningHours: z.number().nullable(),
      estimate: z.object({ printHours: z.number(), massKg: z.number(), machiningHours: z.number() }),
    }),
  ),
  perMaterial: z.array(z.object({ material: z.string(), print: errorStats, kg: errorStats, machining: errorStats })),
});
export type ErrorStats = z.infer<typeof errorStats>;
export type ActualsAnswer = z.infer<typeof actualsAnswer>;
