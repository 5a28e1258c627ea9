import { shipSchedule, type ShipSchedule } from "../schedule";
import type { CellParams, RateCardParams } from "../types";
import type { BuildPlan } from "./plan";

/** Stage 7: print, cooling, machining and the ship date on the cell's calendar. */
export function scheduleStage(now: Date, cell: CellParams, card: RateCardParams, bp: BuildPlan, quantity: number, queueHours: number): ShipSchedule {
  return shipSchedule(now, cell.calendar, {
    queueHours, printHours: (bp.printHours + bp.dwellHours) * quantity, coolingHours: bp.coolingHours, machiningHours: bp.machining.totalHours * quantity,
    finishingDays: card.finishingDays, inspectionDays: card.inspectionDays, packingDays: card.packingDays,
  });
}
