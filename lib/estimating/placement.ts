import { addWorkingDays, addWorkingHours, nextOpenDay, workingHoursBetween, type Plant } from "./schedule";
import { ROUTER_KEY, type Ledger, type Timeline } from "./ledger";
import type { WorkingCalendar } from "./types";

/**
 * Queue-aware placement: where a new job goes on the calendar of the cells and the router, given
 * the work already booked there. Pure: the booked work and `now` are passed in.
 *
 * A print holds its cell for one unbroken window, from its set-up through printing, cooling and
 * lifting the part off the bed (removal); its charge dries in a hopper beforehand, which does not
 * need the cell. The router then machines it in one unbroken run. Pieces of a split part and the
 * builds of a quantity are separate prints, each placed in turn.
 */
const HOUR = 3_600_000;

/** One print of a job: the cell it holds and its times (working hours on shifts unless said). */
export interface PrintSpec {
  cellKey: string;
  calendar: WorkingCalendar;
  /** Set-up before the first layer, working hours. */
  setupHours: number;
  /** Drying the first charge in a hopper, calendar hours (not on the cell). */
  dryingHours: number;
  /** Deposition and dwell, calendar hours (printing runs straight through). */
  printHours: number;
  /** In the cell after the last layer, calendar hours. */
  coolingHours: number;
  /** Lifting the part off the bed and clearing the cell, working hours. */
  removalHours: number;
  /** On the router, working hours. */
  machiningHours: number;
}

export interface JobSpec {
  prints: PrintSpec[];
  routerCalendar: WorkingCalendar;
  /** Joining a split part on the router after its pieces are machined, working hours. */
  joinHours: number;
  /** Finishing, inspection and packing, whole working days on `shipCalendar`. */
  afterDays: number;
  shipCalendar: WorkingCalendar;
}

export interface PlacedPrint {
  setupStart: number;
  dryingStart: number;
  printStart: number;
  printEnd: number;
  coolingEnd: number;
  /** The cell is free again (the part lifted off). */
  holdEnd: number;
  machiningStart: number;
  machiningEnd: number;
}

export interface JobPlacement {
  prints: PlacedPrint[];
  /** The router's last work on the job (its joining included). */
  machiningEnd: number;
  doneMs: number;
  shipDate: string;
  /** Working hours between now and the first set-up: the queue ahead of the job. */
  waitHours: number;
}

/** Extra shifts and weekends: every day of the week, three shifts (the day's window caps it at midnight). */
export function overtimeCalendar(cal: WorkingCalendar): WorkingCalendar {
  return { ...cal, workingWeekdays: [0, 1, 2, 3, 4, 5, 6], shiftsPerDay: Math.max(3, cal.shiftsPerDay), holidays: cal.holidays };
}

const snap = (t: number, cal: WorkingCalendar, plant: Plant) => addWorkingHours(new Date(t), 0, cal, plant).getTime();
const after = (t: number, h: number, cal: WorkingCalendar, plant: Plant) => addWorkingHours(new Date(t), h, cal, plant).getTime();

/** First slot from `fromMs` where one print's whole cell window is free; its hold is written into the timeline. */
function placePrint(tl: Timeline, fromMs: number, p: PrintSpec, nowMs: number, plant: Plant, overtime: boolean): Omit<PlacedPrint, "machiningStart" | "machiningEnd"> {
  const cal = overtime ? overtimeCalendar(p.calendar) : p.calendar;
  let t = fromMs;
  for (let guard = 0; guard < 5_000; guard++) {
    const setupStart = snap(t, cal, plant);
    const setupEnd = after(setupStart, p.setupHours, cal, plant);
    const dryH = Math.max(0, p.dryingHours);
    // With work ahead on the cell, the second hopper dries the charge during its last hours;
    // on an idle cell the hopper is loaded at the set-up.
    const busyAhead = tl.overlap(nowMs, setupStart) !== null;
    const dryingStart = dryH > 0 && busyAhead ? Math.max(nowMs, setupStart - dryH * HOUR) : setupStart;
    const dryEnd = dryingStart + dryH * HOUR;
    const printStart = dryEnd > setupEnd ? snap(dryEnd, cal, plant) : setupEnd;
    const printEnd = printStart + Math.max(0, p.printHours) * HOUR;
    const coolingEnd = printEnd + Math.max(0, p.coolingHours) * HOUR;
    const holdEnd = p.removalHours > 0 ? after(coolingEnd, p.removalHours, cal, plant) : coolingEnd;
    const hit = tl.overlap(setupStart, holdEnd);
    if (!hit) {
      tl.add(setupStart, holdEnd);
      return { setupStart, dryingStart, printStart, printEnd, coolingEnd, holdEnd };
    }
    t = hit[1];
  }
  throw new RangeError("no free window on the cell's calendar");
}

/** First unbroken run of `hours` working time on the router from `fromMs`; written into the timeline. */
function placeRun(tl: Timeline, fromMs: number, hours: number, cal: WorkingCalendar, plant: Plant): [number, number] {
  let t = fromMs;
  for (let guard = 0; guard < 5_000; guard++) {
    const start = snap(t, cal, plant);
    const end = after(start, hours, cal, plant);
    const hit = tl.overlap(start, end);
    if (!hit) { tl.add(start, end); return [start, end]; }
    t = hit[1];
  }
  throw new RangeError("no free run on the router's calendar");
}

/**
 * Place a job: each print in turn at the first free window of its cell, then the router machines
 * them one at a time in the order they leave their cells, joins a split part, and finishing,
 * inspection and packing follow in whole working days; the ship date is the next open day.
 * `overtime`: set-up, removal, machining and the days after on extra shifts and weekends (the
 * days' working hours kept, on the wider calendar). Writes the job's holds into `ledger`.
 */
export function placeJob(ledger: Ledger, spec: JobSpec, opts: { overtime?: boolean } = {}): JobPlacement {
  const { nowMs, plant } = ledger;
  const ot = !!opts.overtime;
  if (spec.prints.length === 0) throw new RangeError("a job needs at least one print");
  const held = spec.prints.map((p) => placePrint(ledger.timeline(p.cellKey, p.calendar), nowMs, p, nowMs, plant, ot));
  const routerCal = ot ? overtimeCalendar(spec.routerCalendar) : spec.routerCalendar;
  const router = ledger.timeline(ROUTER_KEY, spec.routerCalendar);
  const placed: PlacedPrint[] = held.map((h) => ({ ...h, machiningStart: h.holdEnd, machiningEnd: h.holdEnd }));
  let last = nowMs;
  for (const i of placed.map((_, i) => i).sort((a, b) => placed[a]!.holdEnd - placed[b]!.holdEnd || a - b)) {
    const p = placed[i]!, h = spec.prints[i]!.machiningHours;
    if (h > 0) [p.machiningStart, p.machiningEnd] = placeRun(router, p.holdEnd, h, routerCal, plant);
    else p.machiningStart = p.machiningEnd = snap(p.holdEnd, routerCal, plant);
    last = Math.max(last, p.machiningEnd);
  }
  if (spec.joinHours > 0) last = placeRun(router, last, spec.joinHours, routerCal, plant)[1];
  const dayHours = spec.shipCalendar.shiftsPerDay * spec.shipCalendar.hoursPerShift;
  const doneMs = ot
    ? after(last, spec.afterDays * dayHours, overtimeCalendar(spec.shipCalendar), plant)
    : addWorkingDays(new Date(last), spec.afterDays, spec.shipCalendar, plant).getTime();
  const first = Math.min(...placed.map((p) => p.setupStart));
  return {
    prints: placed, machiningEnd: last, doneMs,
    shipDate: nextOpenDay(new Date(doneMs), spec.shipCalendar, plant),
    waitHours: workingHoursBetween(new Date(nowMs), new Date(first), spec.prints[0]!.calendar, plant),
  };
}
