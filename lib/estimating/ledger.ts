import { addWorkingHours, workingHoursBetween, type Plant } from "./schedule";
import type { WorkingCalendar } from "./types";

/**
 * The calendars' busy time, as placement (./placement.ts) reads and writes it: what is booked on
 * each cell and the router, maintenance blocks, and the backlog hours not yet on the calendar.
 * Pure: the booked work and `now` are passed in.
 */

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
export const spanId = (key: string, i: number) => `${key}#${i}`;

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

/** Booked share of a resource's working hours in [fromMs, toMs), 0–1. */
export function loadShare(ledger: Ledger, key: string, cal: WorkingCalendar, fromMs: number, toMs: number): number {
  const avail = workingHoursBetween(new Date(fromMs), new Date(toMs), cal, ledger.plant);
  if (avail <= 0) return 1;
  const tl = ledger.timeline(key, cal);
  let busy = 0;
  for (const [a, b] of tl.intervals()) if (b > fromMs && a < toMs) busy += workingHoursBetween(new Date(Math.max(a, fromMs)), new Date(Math.min(b, toMs)), cal, ledger.plant);
  return Math.min(1, busy / avail);
}
