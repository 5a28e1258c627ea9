import type { WorkingCalendar } from "./types";

/**
 * Working time on a cell's calendar. Each working day's shifts run back to back from
 * `dayStartHourUtc` (06:00 UTC by default: two 8-hour shifts end at 22:00). Dates are UTC so
 * results do not depend on the server's zone.
 */
const HOUR = 3_600_000;

function isoDate(d: Date): string {
  return d.toISOString().slice(0, 10);
}

export function isWorkingDay(d: Date, cal: WorkingCalendar): boolean {
  return cal.workingWeekdays.includes(d.getUTCDay()) && !cal.holidays.includes(isoDate(d));
}

function dayWindow(d: Date, cal: WorkingCalendar, dayStartHourUtc: number): [number, number] {
  const start = Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate(), dayStartHourUtc);
  const hours = Math.min(24 - dayStartHourUtc, cal.shiftsPerDay * cal.hoursPerShift);
  return [start, start + hours * HOUR];
}

/** The instant `hours` of working time after `from`. */
export function addWorkingHours(from: Date, hours: number, cal: WorkingCalendar, dayStartHourUtc = 6): Date {
  if (cal.workingWeekdays.length === 0 || cal.shiftsPerDay * cal.hoursPerShift <= 0) throw new RangeError("the calendar has no working time");
  let t = from.getTime();
  let left = Math.max(0, hours) * HOUR;
  for (let guard = 0; guard < 20_000; guard++) {
    const day = new Date(t);
    if (isWorkingDay(day, cal)) {
      const [s, e] = dayWindow(day, cal, dayStartHourUtc);
      const begin = Math.max(t, s);
      if (begin < e) {
        if (begin + left <= e) return new Date(begin + left);
        left -= e - begin;
      }
    }
    t = Date.UTC(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate() + 1);
  }
  throw new RangeError("the schedule runs past the calendar's horizon");
}

/** The end of the `days`-th working day after `from` (whole working days). */
export function addWorkingDays(from: Date, days: number, cal: WorkingCalendar, dayStartHourUtc = 6): Date {
  let t = from;
  for (let i = 0; i < days; i++) t = addWorkingHours(t, cal.shiftsPerDay * cal.hoursPerShift, cal, dayStartHourUtc);
  return t;
}

export interface ShipSchedule {
  printStart: Date;
  printEnd: Date;
  coolingEnd: Date;
  machiningEnd: Date;
  shipDate: string;
}

/**
 * Earliest ship date: the cell is busy for `queueHours` of jobs ahead, then prints
 * (`printHours`, deposition plus dwell, on working time); the part cools in calendar time
 * (it cools over nights and weekends); machining runs on working time; then finishing,
 * inspection and packing take whole working days. Shipped on the next working day after that.
 */
export function shipSchedule(now: Date, cal: WorkingCalendar, p: { queueHours: number; printHours: number; coolingHours: number; machiningHours: number; finishingDays: number; inspectionDays: number; packingDays: number }): ShipSchedule {
  const printStart = addWorkingHours(now, p.queueHours, cal);
  const printEnd = addWorkingHours(printStart, p.printHours, cal);
  const coolingEnd = new Date(printEnd.getTime() + p.coolingHours * HOUR);
  const machiningEnd = addWorkingHours(coolingEnd, p.machiningHours, cal);
  const done = addWorkingDays(machiningEnd, p.finishingDays + p.inspectionDays + p.packingDays, cal);
  // ship at the start of the next working day's window
  const ship = addWorkingHours(new Date(Date.UTC(done.getUTCFullYear(), done.getUTCMonth(), done.getUTCDate() + 1)), 0, cal);
  return { printStart, printEnd, coolingEnd, machiningEnd, shipDate: isoDate(ship) };
}
