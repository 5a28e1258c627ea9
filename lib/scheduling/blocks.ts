import { addWorkingDays, addWorkingHours } from "../estimating/schedule";
import type { WorkingCalendar } from "../estimating/types";

export type BlockKind = "print" | "cooling" | "machining" | "finishing";

export interface Block {
  kind: BlockKind;
  startsAt: Date;
  endsAt: Date;
}

/** What an order needs, summed over its parts from their estimates (hours, working days). */
export interface JobDurations {
  /** Deposition plus dwell, on the cell's working time. */
  printHours: number;
  /** In the cell after printing, calendar time (a print cools over nights and weekends). */
  coolingHours: number;
  /** On the router, working time. */
  machiningHours: number;
  /** Finishing, inspection and packing, whole working days. */
  finishingDays: number;
}

/** Per-part estimate figures, as analyses.result carries them. */
export interface PartDurations {
  printHours: number;
  dwellHours: number;
  coolingHours: number;
  machiningHours: number;
  quantity: number;
}

/**
 * An order's durations from its parts: parts print one after another (print + dwell × quantity),
 * the longest cool-down governs, machining adds up; finishing days come from the rate card.
 */
export function jobDurations(parts: PartDurations[], finishingDays: number): JobDurations {
  if (parts.length === 0) throw new RangeError("an order needs at least one estimated part to schedule");
  let printHours = 0, coolingHours = 0, machiningHours = 0;
  for (const p of parts) {
    const q = Math.max(1, Math.floor(p.quantity));
    printHours += (p.printHours + p.dwellHours) * q;
    coolingHours = Math.max(coolingHours, p.coolingHours);
    machiningHours += p.machiningHours * q;
  }
  return { printHours, coolingHours, machiningHours, finishingDays };
}

/**
 * The four blocks of a job starting at `start` on a cell's working calendar: print on working
 * time, cooling in calendar time, machining on working time, then whole working days of finishing.
 */
export function planBlocks(start: Date, d: JobDurations, cal: WorkingCalendar): Block[] {
  for (const [k, v] of Object.entries(d)) {
    if (!Number.isFinite(v) || v < 0) throw new RangeError(`${k} must be a non-negative number`);
  }
  const printStart = addWorkingHours(start, 0, cal);
  const printEnd = addWorkingHours(printStart, d.printHours, cal);
  const coolingEnd = new Date(printEnd.getTime() + d.coolingHours * 3_600_000);
  const machiningStart = addWorkingHours(coolingEnd, 0, cal);
  const machiningEnd = addWorkingHours(machiningStart, d.machiningHours, cal);
  const finishingEnd = addWorkingDays(machiningEnd, d.finishingDays, cal);
  return [
    { kind: "print", startsAt: printStart, endsAt: printEnd },
    { kind: "cooling", startsAt: printEnd, endsAt: coolingEnd },
    { kind: "machining", startsAt: machiningStart, endsAt: machiningEnd },
    { kind: "finishing", startsAt: machiningEnd, endsAt: finishingEnd },
  ];
}

/**
 * Print and cooling hold the printing cell (the part stays on the bed until it may be lifted);
 * machining and finishing happen off the cell and do not block it.
 */
export function holdsCell(kind: BlockKind): boolean {
  return kind === "print" || kind === "cooling";
}

export interface ExistingBlock extends Block {
  orderId: string;
}

export interface Conflict {
  block: Block;
  with: ExistingBlock;
}

/** Half-open intervals [start, end) overlap when each starts before the other ends. */
export function overlaps(a: { startsAt: Date; endsAt: Date }, b: { startsAt: Date; endsAt: Date }): boolean {
  return a.startsAt.getTime() < b.endsAt.getTime() && b.startsAt.getTime() < a.endsAt.getTime();
}

/** The cell-holding blocks of a new job that overlap another order's cell-holding blocks on the same cell. */
export function findConflicts(orderId: string, blocks: Block[], existing: ExistingBlock[]): Conflict[] {
  const theirs = existing.filter((e) => e.orderId !== orderId && holdsCell(e.kind));
  const out: Conflict[] = [];
  for (const b of blocks) {
    if (!holdsCell(b.kind)) continue;
    for (const e of theirs) if (overlaps(b, e)) out.push({ block: b, with: e });
  }
  return out;
}

/** The first start at or after `from` whose blocks clear every other job on the cell. */
export function firstFreeStart(orderId: string, from: Date, d: JobDurations, cal: WorkingCalendar, existing: ExistingBlock[]): Date {
  let start = from;
  for (let guard = 0; guard < 1_000; guard++) {
    const conflicts = findConflicts(orderId, planBlocks(start, d, cal), existing);
    if (conflicts.length === 0) return addWorkingHours(start, 0, cal);
    start = new Date(Math.max(...conflicts.map((c) => c.with.endsAt.getTime())));
  }
  throw new RangeError("no free slot found on this cell's calendar");
}
