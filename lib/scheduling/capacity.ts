import { workingHoursBetween, zonedToUtc, type Plant } from "../estimating/schedule";
import type { WorkingCalendar } from "../estimating/types";
import { plantDay } from "./reschedule";

/** A cell or the router as the capacity view draws it. */
export interface CapacityResource {
  key: string;
  name: string;
  calendar: WorkingCalendar;
}

/** Time a job holds a resource (a cell's print and cooling, the router's machining). */
export interface HeldSpan {
  resourceKey: string;
  orderId: string;
  reference: string;
  startsAt: Date;
  endsAt: Date;
}

/** Accepted work not yet on the calendar: its hours, due to run before its promised ship date. */
export interface WaitingWork {
  resourceKey: string;
  orderId: string;
  reference: string;
  hours: number;
  promisedShip: Date | null;
}

export interface MaintenanceSpan {
  resourceKey: string;
  startsAt: Date;
  endsAt: Date;
  reason: string;
}

export interface WeekBar {
  /** Monday of the week, plant's date (YYYY-MM-DD). */
  weekStart: string;
  /** Working hours of the resource's calendar in the week. */
  availableHours: number;
  bookedHours: number;
  /** Accepted work not yet booked that must run this week to keep its promised date. */
  waitingHours: number;
  blockedHours: number;
  /** Booked, waiting and blocked hours exceed the week's working hours. */
  isOverloaded: boolean;
  jobs: { orderId: string; reference: string; hours: number; isWaiting: boolean }[];
  blocks: { reason: string; hours: number }[];
}

export interface ResourceWeeks {
  key: string;
  name: string;
  weeks: WeekBar[];
}

const DAY = 86_400_000;
const r1 = (v: number) => Math.round(v * 10) / 10;

/** The Monday (plant's date, YYYY-MM-DD) of the week holding `now` in the plant's zone. */
export function plantMonday(now: Date, plant: Plant): string {
  const day = new Date(`${plantDay(now, plant.timeZone)}T00:00:00Z`);
  return new Date(day.getTime() - ((day.getUTCDay() + 6) % 7) * DAY).toISOString().slice(0, 10);
}

/**
 * Booked against available hours, week by week from `fromMonday` for `weeks` weeks, for each
 * resource. Hours are working hours of the resource's calendar (the staffed time the view plans
 * by): a hold across a night counts its shift hours. Waiting work counts in the week before its
 * promised ship date (the last it can run in; this week when that has passed). A week is
 * overloaded when booked, waiting and blocked hours together exceed its working hours.
 */
export function capacityWeeks(p: {
  fromMonday: string; weeks: number; now: Date; plant: Plant;
  resources: CapacityResource[]; held: HeldSpan[]; waiting: WaitingWork[]; blocks: MaintenanceSpan[];
}): ResourceWeeks[] {
  const [y, m, d] = p.fromMonday.split("-").map(Number) as [number, number, number];
  const starts = Array.from({ length: p.weeks + 1 }, (_, i) => zonedToUtc(y, m - 1, d + 7 * i, 0, p.plant.timeZone));
  const weekOf = (t: number) => starts.findIndex((s, i) => i < p.weeks && t >= s && t < starts[i + 1]!);
  return p.resources.map((r) => {
    const hrs = (a: number, b: number) => workingHoursBetween(new Date(a), new Date(b), r.calendar, p.plant);
    const weeks: WeekBar[] = starts.slice(0, p.weeks).map((s, i) => ({
      weekStart: new Date(Date.UTC(y, m - 1, d + 7 * i)).toISOString().slice(0, 10),
      availableHours: r1(hrs(s, starts[i + 1]!)), bookedHours: 0, waitingHours: 0, blockedHours: 0, isOverloaded: false, jobs: [], blocks: [],
    }));
    weeks.forEach((w, i) => {
      const a = starts[i]!, b = starts[i + 1]!;
      const jobs = new Map<string, { orderId: string; reference: string; hours: number; isWaiting: boolean }>();
      for (const h of p.held) {
        if (h.resourceKey !== r.key || h.endsAt.getTime() <= a || h.startsAt.getTime() >= b) continue;
        const x = hrs(Math.max(a, h.startsAt.getTime()), Math.min(b, h.endsAt.getTime()));
        const j = jobs.get(h.orderId) ?? { orderId: h.orderId, reference: h.reference, hours: 0, isWaiting: false };
        j.hours += x;
        jobs.set(h.orderId, j);
      }
      for (const wk of p.waiting) {
        if (wk.resourceKey !== r.key) continue;
        const due = wk.promisedShip ? wk.promisedShip.getTime() - 7 * DAY : p.now.getTime();
        const at = Math.max(due, p.now.getTime(), starts[0]!);
        if (weekOf(at) !== i) continue;
        jobs.set(`waiting:${wk.orderId}`, { orderId: wk.orderId, reference: wk.reference, hours: wk.hours, isWaiting: true });
      }
      for (const bl of p.blocks) {
        if (bl.resourceKey !== r.key || bl.endsAt.getTime() <= a || bl.startsAt.getTime() >= b) continue;
        w.blocks.push({ reason: bl.reason, hours: r1(hrs(Math.max(a, bl.startsAt.getTime()), Math.min(b, bl.endsAt.getTime()))) });
      }
      w.jobs = [...jobs.values()].map((j) => ({ ...j, hours: r1(j.hours) })).filter((j) => j.hours > 0).sort((x, y2) => y2.hours - x.hours);
      w.bookedHours = r1(w.jobs.filter((j) => !j.isWaiting).reduce((s2, j) => s2 + j.hours, 0));
      w.waitingHours = r1(w.jobs.filter((j) => j.isWaiting).reduce((s2, j) => s2 + j.hours, 0));
      w.blockedHours = r1(w.blocks.reduce((s2, x) => s2 + x.hours, 0));
      w.isOverloaded = w.bookedHours + w.waitingHours + w.blockedHours > w.availableHours + 1e-6;
    });
    return { key: r.key, name: r.name, weeks };
  });
}
