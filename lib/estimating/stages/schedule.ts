import { REMOVAL_FALLBACK_H } from "../card-fallbacks";
import { placeJob, type JobPlacement, type JobSpec, type PrintSpec } from "../placement";
import type { Ledger } from "../ledger";
import type { ContinuousSchedule, Plant } from "../schedule";
import type { CellParams, RateCardParams } from "../types";
import type { BuildPlan } from "./plan";

/** The plant's time zone, shift start and closed dates from the rate card (UTC and 06:00 for older rows). */
export function plantOf(card: RateCardParams): Plant {
  return { timeZone: card.plantTimeZone ?? "UTC", dayStartHour: card.shiftStartHour ?? 6, holidays: card.holidays ?? [] };
}

export { REMOVAL_FALLBACK_H };

/** A candidate's schedule: the dates of its first and last prints, and the placement behind them. */
export interface PlacedSchedule extends ContinuousSchedule {
  /** Working hours between now and the first set-up (the work ahead on the cell). */
  waitHours: number;
  spec: JobSpec;
  placement: JobPlacement;
}

/**
 * The prints of one plan on one cell: each build its own print (set-up, drying, its share of the
 * printing by the parts it holds, cooling, removal) and its parts' machining.
 */
export function printsOf(cell: CellParams, card: RateCardParams, bp: BuildPlan, quantity: number): PrintSpec[] {
  const per = bp.partsPerBuild, builds = bp.builds;
  const q = Math.max(1, quantity);
  return Array.from({ length: builds }, (_, i) => {
    const parts = i < builds - 1 ? per : q - per * (builds - 1);
    return {
      cellKey: cell.key, calendar: cell.calendar, setupHours: card.printSetupHours ?? 0, dryingHours: bp.feed.drying?.hours ?? 0,
      printHours: ((bp.printHours + bp.dwellHours) * parts) / q, coolingHours: bp.coolingHours,
      removalHours: card.removalHours ?? REMOVAL_FALLBACK_H, machiningHours: bp.machining.totalHours * parts,
    };
  });
}

/** What follows the prints: the router's calendar, finishing, inspection and packing days, the calendar the ship date falls on. */
export function jobTail(cell: CellParams, card: RateCardParams): Omit<JobSpec, "prints" | "joinHours"> {
  return { routerCalendar: card.routerCalendar ?? cell.calendar, afterDays: card.finishingDays + card.inspectionDays + card.packingDays, shipCalendar: cell.calendar };
}

/** Dates of a placed job in the schedule's shape: the first set-up and print, the last print, cooling and machining. */
export function scheduleOf(pl: JobPlacement, spec: JobSpec): PlacedSchedule {
  const d = (ms: number) => new Date(ms);
  const min = (f: (p: JobPlacement["prints"][number]) => number) => Math.min(...pl.prints.map(f));
  const max = (f: (p: JobPlacement["prints"][number]) => number) => Math.max(...pl.prints.map(f));
  return {
    setupStart: d(min((p) => p.setupStart)), dryingStart: d(min((p) => p.dryingStart)), printStart: d(min((p) => p.printStart)),
    printEnd: d(max((p) => p.printEnd)), coolingEnd: d(max((p) => p.coolingEnd)), machiningEnd: d(pl.machiningEnd), shipDate: pl.shipDate,
    waitHours: pl.waitHours, spec, placement: pl,
  };
}

/**
 * Stage 7: the plan placed on the calendar as booked: each build at the first window where the
 * cell is free for its set-up, printing (straight through), cooling and removal, with its charge
 * dried before; the router after; the ship date on an open day. The ledger is not changed.
 */
export function scheduleStage(ledger: Ledger, cell: CellParams, card: RateCardParams, bp: BuildPlan, quantity: number): PlacedSchedule {
  const spec: JobSpec = { prints: printsOf(cell, card, bp, quantity), joinHours: 0, ...jobTail(cell, card) };
  return scheduleOf(placeJob(ledger.fork(), spec), spec);
}
