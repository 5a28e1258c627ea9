import { continuousSchedule, type ContinuousSchedule, type Plant } from "../schedule";
import type { CellParams, RateCardParams } from "../types";
import type { BuildPlan } from "./plan";

/** The plant's time zone, shift start and closed dates from the rate card (UTC and 06:00 for older rows). */
export function plantOf(card: RateCardParams): Plant {
  return { timeZone: card.plantTimeZone ?? "UTC", dayStartHour: card.shiftStartHour ?? 6, holidays: card.holidays ?? [] };
}

/** Stage 7: set-up on shifts while the first charge dries, printing straight through, cooling, machining on shifts, the ship date on an open day. */
export function scheduleStage(now: Date, cell: CellParams, card: RateCardParams, bp: BuildPlan, quantity: number, queueHours: number, plant: Plant): ContinuousSchedule {
  return continuousSchedule(now, cell.calendar, plant, {
    queueHours, setupHours: (card.printSetupHours ?? 0) * bp.builds,
    printHours: bp.printHours + bp.dwellHours, coolingHours: bp.coolingHours, machiningHours: bp.machining.totalHours * quantity,
    finishingDays: card.finishingDays, inspectionDays: card.inspectionDays, packingDays: card.packingDays,
    dryingHours: bp.feed.drying?.hours ?? 0, machiningCalendar: card.routerCalendar,
  });
}
