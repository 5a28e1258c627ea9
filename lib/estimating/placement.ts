import { addWorkingDays, addWorkingHours, nextOpenDay, workingHoursBetween, type Plant } from "./schedule";
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

/** The queue's key for the router (machining), beside the cells' keys. */
export const ROUTER_KEY = "router";

/** Time already taken on a cell or the router. */
export interface BookedSpan {
  startMs: number;
  endMs: number;
  /**
   * The latest this span may end without its own job missing its promised date (an expedited job
   * may push it back until then); absent or not after `endMs`: it cannot move.
   */
  latestEndMs?: number;
  /** A maintenance block never moves; a booked job may when it has slack. */
  kind?: "job" | "block";
  /** What the span is (an order's reference, a block's reason), for reports. */
  ref?: string;
}

/** What is already on the calendars, by resource: a cell's key, or `router`. */
export interface CapacityQueue {
  /** Booked jobs and maintenance blocks. */
  booked?: Record<string, BookedSpan[]>;
  /** Working hours of work not yet on the calendar (accepted, unscheduled), taken first-fit from now, with no slack. */
  hours?: Record<string, number>;
}

/** Busy time on one resource: sorted, merged half-open intervals [start, end), ms. */
export class Timeline {
  private s: number[] = [];
  private e: number[] = [];

  clone(): Timeline {
    const t = new Timeline();
    t.s = this.s.slice();
    t.e = this.e.slice();
    return t;
  }

  /** Index of the first interval ending after `t`. */
  private after(t: number): number {
    let lo = 0, hi = this.e.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.e[mid]! > t) hi = mid; else lo = mid + 1;
    }
    return lo;
  }

  /** The first busy interval overlapping [a, b), or null. */
  overlap(a: number, b: number): [number, number] | null {
    if (b <= a) return null;
    const i = this.after(a);
    return i < this.s.length && this.s[i]! < b ? [this.s[i]!, this.e[i]!] : null;
  }

  add(a: number, b: number): void {
    if (b <= a) return;
    // merge every interval touching [a, b]: the first ending at or after a, on while they start by b
    const i = this.after(a - 1);
    let start = a, end = b, j = i;
    while (j < this.s.length && this.s[j]! <= b) { start = Math.min(start, this.s[j]!); end = Math.max(end, this.e[j]!); j++; }
    this.s.splice(i, j - i, start);
    this.e.splice(i, j - i, end);
  }

  /** Busy ms inside [a, b). */
  busyWithin(a: number, b: number): number {
    let ms = 0;
    for (let i = this.after(a); i < this.s.length && this.s[i]! < b; i++) ms += Math.min(b, this.e[i]!) - Math.max(a, this.s[i]!);
    return ms;
  }

  intervals(): [number, number][] {
    return this.s.map((s, i) => [s, this.e[i]!]);
  }
}

/** Take `hours` of working time first-fit into the free time from `fromMs` (backlog work, split across gaps). */
function fillHours(tl: Timeline, fromMs: number, hours: number, cal: WorkingCalendar, plant: Plant): void {
  let t = fromMs, left = hours;
  for (let guard = 0; left > 1e-9 && guard < 10_000; guard++) {
    const start = addWorkingHours(new Date(t), 0, cal, plant).getTime();
    const end = addWorkingHours(new Date(start), left, cal, plant).getTime();
    const hit = tl.overlap(start, end);
    if (!hit) { tl.add(start, end); return; }
    if (hit[0] > start) {
      left -= workingHoursBetween(new Date(start), new Date(hit[0]), cal, plant);
      tl.add(start, hit[0]);
    }
    t = hit[1];
  }
}

/** A span's identity in the queue, for the expedite's bookkeeping. */
const spanId = (key: string, i: number) => `${key}#${i}`;

/**
 * The calendars' busy time as a job sees it. Each resource's timeline is built on first use with
 * that resource's calendar (the backlog hours are laid on it); `fork()` gives a copy a job may
 * write its own holds into without touching this one.
 */
export class Ledger {
  private own = new Map<string, Timeline>();

  constructor(
    readonly queue: CapacityQueue,
    readonly nowMs: number,
    readonly plant: Plant,
    /** Spans left out (an expedite goes ahead of them), by `key#index`. */
    private readonly skipped: ReadonlySet<string> = new Set(),
    private readonly parent: Ledger | null = null,
  ) {}

  timeline(key: string, cal: WorkingCalendar): Timeline {
    let t = this.own.get(key);
    if (t) return t;
    if (this.parent) {
      t = this.parent.timeline(key, cal).clone();
    } else {
      t = new Timeline();
      (this.queue.booked?.[key] ?? []).forEach((b, i) => {
        if (b.endMs > this.nowMs && !this.skipped.has(spanId(key, i))) t!.add(Math.max(b.startMs, this.nowMs), b.endMs);
      });
      const h = this.queue.hours?.[key] ?? 0;
      if (h > 0) fillHours(t, this.nowMs, h, cal, this.plant);
    }
    this.own.set(key, t);
    return t;
  }

  fork(): Ledger {
    return new Ledger(this.queue, this.nowMs, this.plant, this.skipped, this);
  }

  /** A ledger over the same queue without some spans (built afresh, not forked). */
  without(skipped: ReadonlySet<string>): Ledger {
    return new Ledger(this.queue, this.nowMs, this.plant, skipped);
  }

  /** Is anything booked on the resource at all? */
  isEmpty(): boolean {
    const q = this.queue;
    return !Object.values(q.booked ?? {}).some((l) => l.some((b) => b.endMs > this.nowMs)) && !Object.values(q.hours ?? {}).some((h) => h > 0);
  }
}

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

/** The job's windows on each resource, for the expedite's check of the work it goes ahead of. */
function holdsOf(spec: JobSpec, pl: JobPlacement): Map<string, [number, number][]> {
  const m = new Map<string, [number, number][]>();
  const push = (k: string, a: number, b: number) => { if (b > a) m.set(k, [...(m.get(k) ?? []), [a, b]]); };
  pl.prints.forEach((p, i) => { push(spec.prints[i]!.cellKey, p.setupStart, p.holdEnd); push(ROUTER_KEY, p.machiningStart, p.machiningEnd); });
  const lastMach = Math.max(...pl.prints.map((p) => p.machiningEnd));
  if (pl.machiningEnd > lastMach) push(ROUTER_KEY, lastMach, pl.machiningEnd);
  return m;
}

/**
 * Push the movable spans of one resource back behind the new job's windows, in order, each keeping
 * its length. Answers the spans that would then end after their `latestEndMs` (broken promises:
 * each is kept where it is, and the rest pushed around it), and the spans that had to move.
 */
function pushBack(key: string, spans: BookedSpan[], skipped: ReadonlySet<string>, holds: [number, number][], nowMs: number): { broken: string[]; moved: string[] } {
  const fixed = new Timeline();
  spans.forEach((b, i) => { if (!skipped.has(spanId(key, i)) && b.endMs > nowMs) fixed.add(b.startMs, b.endMs); });
  for (const [a, b] of holds) fixed.add(a, b);
  const moving = spans.map((b, i) => ({ b, id: spanId(key, i) })).filter((x) => skipped.has(x.id)).sort((x, y) => x.b.startMs - y.b.startMs);
  const moved: string[] = [], broken: string[] = [];
  for (const { b, id } of moving) {
    const len = b.endMs - b.startMs;
    let start = b.startMs;
    for (let hit = fixed.overlap(start, start + len); hit; hit = fixed.overlap(start, start + len)) start = hit[1];
    if (start + len > Math.max(b.endMs, b.latestEndMs ?? b.endMs)) {
      broken.push(id);
      start = b.startMs;
    } else if (start !== b.startMs) moved.push(b.ref ?? id);
    fixed.add(start, start + len);
  }
  return { broken, moved };
}

export interface ExpeditePlacement extends JobPlacement {
  /** Booked jobs the job goes ahead of (each still meets its own promised date). */
  jumped: string[];
}

/**
 * The expedited placement: set-up, machining and the days after on overtime, and the job goes
 * ahead of booked work not yet started whose own promised date still holds once pushed back
 * behind it (never ahead of a maintenance block, of work under way or of work with no slack). A
 * span whose promise would break is kept in place and the placement tried again. Never later
 * than the standard placement.
 */
export function placeExpedited(base: Ledger, spec: JobSpec, standard: JobPlacement): ExpeditePlacement {
  const booked = base.queue.booked ?? {};
  const movable = new Set<string>();
  for (const [key, spans] of Object.entries(booked)) {
    spans.forEach((b, i) => { if (b.kind !== "block" && b.startMs > base.nowMs && (b.latestEndMs ?? 0) > b.endMs) movable.add(spanId(key, i)); });
  }
  for (let guard = 0; guard <= movable.size + 1; guard++) {
    const pl = placeJob(base.without(movable), spec, { overtime: true });
    const holds = holdsOf(spec, pl);
    const broken: string[] = [];
    const jumped: string[] = [];
    for (const [key, spans] of Object.entries(booked)) {
      const r = pushBack(key, spans, movable, holds.get(key) ?? [], base.nowMs);
      jumped.push(...r.moved);
      broken.push(...r.broken);
    }
    if (broken.length === 0) {
      if (pl.doneMs > standard.doneMs) break;
      return { ...pl, jumped: [...new Set(jumped)] };
    }
    // the spans whose promise would break stay where they are; place again around them
    for (const id of broken) movable.delete(id);
  }
  // no better slot: the standard one, with overtime after it
  const pl = placeJob(base.fork(), spec, { overtime: true });
  return pl.doneMs <= standard.doneMs ? { ...pl, jumped: [] } : { ...standard, jumped: [] };
}

/** Booked share of a resource's working hours in [fromMs, toMs), 0–1. */
export function loadShare(ledger: Ledger, key: string, cal: WorkingCalendar, fromMs: number, toMs: number): number {
  const avail = workingHoursBetween(new Date(fromMs), new Date(toMs), cal, ledger.plant);
  if (avail <= 0) return 1;
  const tl = ledger.timeline(key, cal);
  let busy = 0;
  for (const [a, b] of tl.intervals()) if (b > fromMs && a < toMs) busy += workingHoursBetween(new Date(Math.max(a, fromMs)), new Date(Math.min(b, toMs)), cal, ledger.plant);
  return Math.min(1, busy / avail);
}
