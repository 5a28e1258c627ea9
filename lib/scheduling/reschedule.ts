import { addWorkingDays, addWorkingHours, isWorkingDay, workingHoursBetween, type Plant } from "../estimating/schedule";
import type { WorkingCalendar } from "../estimating/types";
import { firstFreeStart, holdsCell, overlaps, planBlocks, type Block, type ExistingBlock, type JobDurations } from "./blocks";

/** A job on the cell's calendar: its blocks now and what it needs (to plan it again). */
export interface CalendarJob {
  orderId: string;
  blocks: Block[];
  durations: JobDurations;
}

/** A job's blocks after a move: the moved job's, and each job pushed back behind it. */
export interface Replanned {
  orderId: string;
  blocks: Block[];
  /** End of the last block before and after (the planned ship). */
  fromShip: Date;
  toShip: Date;
}

const endOf = (blocks: Block[]) => blocks.reduce((m, b) => (b.endsAt > m ? b.endsAt : m), blocks[0]!.endsAt);

/**
 * Move one job to `start` on its cell and push back, in their order, the jobs on the cell whose
 * print or cooling would then overlap it (or a job pushed before them): each is planned again at
 * the first free start from where it was. Jobs clear of the moved one keep their blocks. Pure:
 * answers the jobs whose blocks changed, the moved one first.
 */
export function moveJob(moved: CalendarJob, start: Date, others: CalendarJob[], cal: WorkingCalendar): Replanned[] {
  return withPushed(moved, planBlocks(start, moved.durations, cal), others, cal);
}

/**
 * A block of a booked job ends at another time than planned (the print finished early, the
 * cooling ran long): the blocks after it follow from that end with their own durations (cooling
 * in calendar hours, machining on shifts, finishing in working days), and jobs on the cell the
 * job now overlaps are pushed back as in `moveJob`. Throws a RangeError when the end is before
 * the block's start or the job has no such block.
 */
export function endBlockAt(job: CalendarJob, kind: "print" | "cooling" | "machining", endsAt: Date, others: CalendarJob[], cal: WorkingCalendar): Replanned[] {
  const i = job.blocks.findIndex((b) => b.kind === kind);
  const block = job.blocks[i];
  if (!block) throw new RangeError(`the job has no ${kind} block`);
  if (endsAt.getTime() <= block.startsAt.getTime()) throw new RangeError(`the ${kind} cannot end before it started`);
  const d = job.durations;
  const out: Block[] = job.blocks.slice(0, i).map((b) => ({ ...b }));
  out.push({ ...block, endsAt });
  let t = endsAt;
  if (kind === "print") { const c = new Date(t.getTime() + d.coolingHours * 3_600_000); out.push({ kind: "cooling", startsAt: t, endsAt: c }); t = c; }
  if (kind !== "machining") { const ms = addWorkingHours(t, 0, cal), me = addWorkingHours(ms, d.machiningHours, cal); out.push({ kind: "machining", startsAt: ms, endsAt: me }); t = me; }
  out.push({ kind: "finishing", startsAt: t, endsAt: addWorkingDays(t, d.finishingDays, cal) });
  return withPushed(job, out, others, cal);
}

function withPushed(moved: CalendarJob, blocks: Block[], others: CalendarJob[], cal: WorkingCalendar): Replanned[] {
  const placed: ExistingBlock[] = blocks.map((b) => ({ ...b, orderId: moved.orderId }));
  const out: Replanned[] = [{ orderId: moved.orderId, blocks, fromShip: endOf(moved.blocks), toShip: endOf(blocks) }];
  const rest = others.filter((o) => o.orderId !== moved.orderId && o.blocks.length > 0).sort((a, b) => a.blocks[0]!.startsAt.getTime() - b.blocks[0]!.startsAt.getTime());
  for (const o of rest) {
    const clash = o.blocks.some((b) => holdsCell(b.kind) && placed.some((p) => holdsCell(p.kind) && overlaps(b, p)));
    if (!clash) {
      // it keeps its time; later jobs must clear it as they are
      placed.push(...o.blocks.map((b) => ({ ...b, orderId: o.orderId })));
      continue;
    }
    const from = firstFreeStart(o.orderId, o.blocks[0]!.startsAt, o.durations, cal, placed);
    const nb = planBlocks(from, o.durations, cal);
    placed.push(...nb.map((b) => ({ ...b, orderId: o.orderId })));
    out.push({ orderId: o.orderId, blocks: nb, fromShip: endOf(o.blocks), toShip: endOf(nb) });
  }
  return out;
}

/** The plant's local date (YYYY-MM-DD) of an instant. */
export function plantDay(d: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(d);
}

/**
 * How many working days a ship date moved: the cell's and the plant's open days after the
 * earlier local date up to and including the later one (0 when both fall on one day).
 */
export function workingDaysMoved(from: Date, to: Date, cal: WorkingCalendar, plant: Plant): number {
  const [a, b] = [plantDay(from, plant.timeZone), plantDay(to, plant.timeZone)].sort();
  let n = 0;
  for (let d = new Date(`${a}T00:00:00Z`); ; ) {
    d = new Date(d.getTime() + 86_400_000);
    if (d.toISOString().slice(0, 10) > b!) break;
    if (isWorkingDay(d, cal, plant)) n++;
  }
  return n;
}

/**
 * What a booked job needs, read back from its blocks on the calendar they were planned on
 * (print and machining in working hours, cooling in calendar hours); finishing from the card.
 */
export function durationsFromBlocks(blocks: Block[], cal: WorkingCalendar, finishingDays: number): JobDurations {
  const of = (k: Block["kind"]) => blocks.find((b) => b.kind === k);
  const work = (b: Block | undefined) => (b ? workingHoursBetween(b.startsAt, b.endsAt, cal) : 0);
  const cooling = of("cooling");
  return { printHours: work(of("print")), coolingHours: cooling ? (cooling.endsAt.getTime() - cooling.startsAt.getTime()) / 3_600_000 : 0, machiningHours: work(of("machining")), finishingDays };
}
