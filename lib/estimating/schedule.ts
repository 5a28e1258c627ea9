import type { WorkingCalendar } from "./types";

/**
 * Working time on a cell's calendar, counted in the plant's time zone. Each working day's shifts
 * run back to back from the plant's shift start (local time). A plant given as a number is the
 * old form: that hour in UTC, no bureau holidays.
 */
const HOUR = 3_600_000;

export interface Plant {
  /** IANA time zone id. */
  timeZone: string;
  /** Local hour the first shift starts. */
  dayStartHour: number;
  /** Dates (YYYY-MM-DD, local) the whole plant is closed. */
  holidays: string[];
}

export const UTC_PLANT: Plant = { timeZone: "UTC", dayStartHour: 6, holidays: [] };

const formatters = new Map<string, Intl.DateTimeFormat>();
/** Offsets by zone, then by hour since the epoch (numeric keys: placing work around a booked calendar asks this often). */
const offsets = new Map<string, Map<number, number>>();
let offsetCount = 0;

/** The zone's offset from UTC at instant t, ms (local = t + offset). Cached per zone and hour. */
export function zoneOffsetMs(t: number, timeZone: string): number {
  if (timeZone === "UTC") return 0;
  const key = Math.floor(t / HOUR);
  let zone = offsets.get(timeZone);
  if (!zone) { zone = new Map(); offsets.set(timeZone, zone); }
  const hit = zone.get(key);
  if (hit !== undefined) return hit;
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit" });
    formatters.set(timeZone, f);
  }
  const v: Record<string, number> = {};
  for (const p of f.formatToParts(new Date(Math.floor(t / 1000) * 1000))) if (p.type !== "literal") v[p.type] = Number(p.value);
  const local = Date.UTC(v.year!, v.month! - 1, v.day, v.hour, v.minute, v.second);
  const off = local - Math.floor(t / 1000) * 1000;
  if (++offsetCount > 50_000) { offsets.clear(); offsetCount = 0; zone = new Map(); offsets.set(timeZone, zone); }
  zone.set(key, off);
  return off;
}

/** The instant of local wall time y-m-d h:00 in the zone (the later instant across a DST gap). */
export function zonedToUtc(y: number, m: number, d: number, hour: number, timeZone: string): number {
  const guess = Date.UTC(y, m, d, hour);
  const t1 = guess - zoneOffsetMs(guess, timeZone);
  return guess - zoneOffsetMs(t1, timeZone);
}

/** Local calendar date (as a UTC-midnight Date) of instant t in the zone. */
function localDay(t: number, timeZone: string): Date {
  const l = new Date(t + zoneOffsetMs(t, timeZone));
  return new Date(Date.UTC(l.getUTCFullYear(), l.getUTCMonth(), l.getUTCDate()));
}

const isoDate = (d: Date) => d.toISOString().slice(0, 10);
const asPlant = (p: number | Plant | undefined): Plant => (p === undefined ? UTC_PLANT : typeof p === "number" ? { ...UTC_PLANT, dayStartHour: p } : p);

/** Is this local date (a UTC-midnight Date) a working day of the cell and the plant? */
export function isWorkingDay(d: Date, cal: WorkingCalendar, plant: Plant = UTC_PLANT): boolean {
  const iso = isoDate(d);
  return cal.workingWeekdays.includes(d.getUTCDay()) && !cal.holidays.includes(iso) && !plant.holidays.includes(iso);
}

function dayWindow(day: Date, cal: WorkingCalendar, plant: Plant): [number, number] {
  const start = zonedToUtc(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate(), plant.dayStartHour, plant.timeZone);
  const hours = Math.min(24 - plant.dayStartHour, cal.shiftsPerDay * cal.hoursPerShift);
  return [start, start + hours * HOUR];
}

const nextLocalMidnight = (day: Date, plant: Plant) => zonedToUtc(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate() + 1, 0, plant.timeZone);

/** The instant `hours` of working time after `from` (shifts in the plant's zone). */
export function addWorkingHours(from: Date, hours: number, cal: WorkingCalendar, plantOrStartHourUtc?: number | Plant): Date {
  const plant = asPlant(plantOrStartHourUtc);
  if (cal.workingWeekdays.length === 0 || cal.shiftsPerDay * cal.hoursPerShift <= 0) throw new RangeError("the calendar has no working time");
  let t = from.getTime();
  let left = Math.max(0, hours) * HOUR;
  for (let guard = 0; guard < 20_000; guard++) {
    const day = localDay(t, plant.timeZone);
    if (isWorkingDay(day, cal, plant)) {
      const [s, e] = dayWindow(day, cal, plant);
      const begin = Math.max(t, s);
      if (begin < e) {
        if (begin + left <= e) return new Date(begin + left);
        left -= e - begin;
      }
    }
    t = nextLocalMidnight(day, plant);
  }
  throw new RangeError("the schedule runs past the calendar's horizon");
}

/** Working hours of the calendar between two instants (shifts in the plant's zone); 0 when `to` is not after `from`. */
export function workingHoursBetween(from: Date, to: Date, cal: WorkingCalendar, plantOrStartHourUtc?: number | Plant): number {
  const plant = asPlant(plantOrStartHourUtc);
  let t = from.getTime();
  const end = to.getTime();
  let ms = 0;
  for (let guard = 0; guard < 20_000 && t < end; guard++) {
    const day = localDay(t, plant.timeZone);
    if (isWorkingDay(day, cal, plant)) {
      const [s, e] = dayWindow(day, cal, plant);
      const a = Math.max(t, s), b = Math.min(e, end);
      if (b > a) ms += b - a;
    }
    t = nextLocalMidnight(day, plant);
  }
  return ms / HOUR;
}

/** The end of the `days`-th working day after `from` (whole working days). */
export function addWorkingDays(from: Date, days: number, cal: WorkingCalendar, plantOrStartHourUtc?: number | Plant): Date {
  let t = from;
  for (let i = 0; i < days; i++) t = addWorkingHours(t, cal.shiftsPerDay * cal.hoursPerShift, cal, plantOrStartHourUtc);
  return t;
}

/** The first open day of the plant after the local day of `after` (YYYY-MM-DD). */
export function nextOpenDay(after: Date, cal: WorkingCalendar, plant: Plant): string {
  const day = localDay(after.getTime(), plant.timeZone);
  return isoDate(localDay(addWorkingHours(new Date(nextLocalMidnight(day, plant)), 0, cal, plant).getTime(), plant.timeZone));
}

export interface ShipSchedule {
  printStart: Date;
  printEnd: Date;
  coolingEnd: Date;
  machiningEnd: Date;
  shipDate: string;
}

/**
 * Earliest ship date with printing on working time (the old form, kept for the capacity
 * planner's callers): queue, print (deposition plus dwell) on shifts, cooling on calendar time,
 * machining on shifts, then finishing, inspection and packing in whole working days.
 */
export function shipSchedule(now: Date, cal: WorkingCalendar, p: { queueHours: number; printHours: number; coolingHours: number; machiningHours: number; finishingDays: number; inspectionDays: number; packingDays: number }): ShipSchedule {
  const printStart = addWorkingHours(now, p.queueHours, cal);
  const printEnd = addWorkingHours(printStart, p.printHours, cal);
  const coolingEnd = new Date(printEnd.getTime() + p.coolingHours * HOUR);
  const machiningEnd = addWorkingHours(coolingEnd, p.machiningHours, cal);
  const done = addWorkingDays(machiningEnd, p.finishingDays + p.inspectionDays + p.packingDays, cal);
  return { printStart, printEnd, coolingEnd, machiningEnd, shipDate: nextOpenDay(done, cal, UTC_PLANT) };
}

export interface ContinuousSchedule extends ShipSchedule {
  setupStart: Date;
  /** The first charge goes into its dryer hopper (equal to setupStart when no drying is planned). */
  dryingStart: Date;
}

/**
 * Earliest ship date as the plant runs: the queue ahead and the cell's set-up take working time
 * on shifts; once the first layer is down the cell prints on calendar time, through nights,
 * weekends and holidays, until the last layer (deposition and dwell only, common practice: a
 * large print cannot be paused overnight); the part cools in the cell on calendar time;
 * machining runs on shifts; finishing, inspection and packing take whole working days; the part
 * ships on the plant's next open day.
 */
export function continuousSchedule(
  now: Date, cal: WorkingCalendar, plant: Plant,
  p: { queueHours: number; setupHours: number; printHours: number; coolingHours: number; machiningHours: number; finishingDays: number; inspectionDays: number; packingDays: number; dryingHours?: number; machiningCalendar?: WorkingCalendar },
): ContinuousSchedule {
  const setupStart = addWorkingHours(now, p.queueHours, cal, plant);
  const setupEnd = addWorkingHours(setupStart, p.setupHours, cal, plant);
  // Drying: the first charge must be dry before the first layer. Its hopper is loaded at the set-up
  // (a material change waits for its hopper); with a job ahead on the cell the second hopper dries
  // it during that job's last hours. Dryers run unattended on calendar time; the first layer is
  // laid on a shift.
  const dryH = Math.max(0, p.dryingHours ?? 0);
  const dryingStart = dryH > 0 && p.queueHours > 0 ? new Date(Math.max(now.getTime(), setupStart.getTime() - dryH * HOUR)) : setupStart;
  const dryEnd = dryingStart.getTime() + dryH * HOUR;
  const printStart = dryEnd > setupEnd.getTime() ? addWorkingHours(new Date(dryEnd), 0, cal, plant) : setupEnd;
  const printEnd = new Date(printStart.getTime() + Math.max(0, p.printHours) * HOUR);
  const coolingEnd = new Date(printEnd.getTime() + Math.max(0, p.coolingHours) * HOUR);
  const machiningEnd = addWorkingHours(coolingEnd, p.machiningHours, p.machiningCalendar ?? cal, plant);
  const done = addWorkingDays(machiningEnd, p.finishingDays + p.inspectionDays + p.packingDays, cal, plant);
  return { setupStart, dryingStart, printStart, printEnd, coolingEnd, machiningEnd, shipDate: nextOpenDay(done, cal, plant) };
}
