import { placeJob, type JobPlacement, type JobSpec } from "./placement";
import { ROUTER_KEY, spanId, Timeline, type BookedSpan, type Ledger } from "./ledger";

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
