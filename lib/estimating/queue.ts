import { ROUTER_KEY, type BookedSpan, type CapacityQueue } from "./ledger";
import type { EstimateResult } from "./types";

/** A booked block as the calendar stores it: a job's print, cooling or machining, or a maintenance block. */
export interface BookedRow {
  /** The cell's key for print and cooling; machining is the router's. */
  cellKey: string;
  kind: "print" | "cooling" | "machining" | "finishing" | "maintenance";
  startsAt: number;
  endsAt: number;
  /** The order's reference, or the block's reason. */
  ref: string;
  /** The order's planned ship (end of its last block) and the date promised on its quote, ms. */
  plannedShipMs?: number | null;
  promisedShipMs?: number | null;
}

/** Accepted work not yet on the calendar, from its parts' estimates (whole-order hours). */
export interface UnscheduledRow {
  cellKey: string;
  /** Printing, dwell and cooling: the cell's hours. */
  cellHours: number;
  machiningHours: number;
}

/**
 * The queue the engine places a new job around, from the calendar's rows. Print and cooling hold
 * their cell, machining holds the router, finishing holds neither. A job may be pushed back by as
 * much as its promised date is after its planned ship (its slack, never negative); a maintenance
 * block never moves. Unscheduled work counts at its estimated hours, with no slack.
 */
export function queueFromRows(nowMs: number, booked: BookedRow[], unscheduled: UnscheduledRow[] = []): CapacityQueue {
  const out: Record<string, BookedSpan[]> = {};
  const hours: Record<string, number> = {};
  for (const r of booked) {
    if (r.endsAt <= nowMs || r.kind === "finishing") continue;
    const key = r.kind === "machining" ? ROUTER_KEY : r.cellKey;
    const slack = r.promisedShipMs != null && r.plannedShipMs != null ? Math.max(0, r.promisedShipMs - r.plannedShipMs) : 0;
    const span: BookedSpan = r.kind === "maintenance"
      ? { startMs: r.startsAt, endMs: r.endsAt, kind: "block", ref: r.ref }
      : { startMs: r.startsAt, endMs: r.endsAt, kind: "job", ref: r.ref, ...(slack > 0 ? { latestEndMs: r.endsAt + slack } : {}) };
    (out[key] ??= []).push(span);
  }
  for (const u of unscheduled) {
    if (u.cellHours > 0) hours[u.cellKey] = (hours[u.cellKey] ?? 0) + u.cellHours;
    if (u.machiningHours > 0) hours[ROUTER_KEY] = (hours[ROUTER_KEY] ?? 0) + u.machiningHours;
  }
  return { booked: out, hours };
}

/**
 * `--queue CELL=HOURS` of the command line (repeatable; `router` for the router): booked hours
 * with no slack. Throws a RangeError naming the bad entry: not CELL=HOURS, an unknown cell, hours
 * not a number, negative.
 */
export function parseQueueArgs(args: string[], cellKeys: string[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const a of args) {
    const m = /^([^=]+)=(.*)$/.exec(a.trim());
    if (!m) throw new RangeError(`--queue takes CELL=HOURS (e.g. long-bed=40 or router=12), not "${a.slice(0, 40)}".`);
    const key = m[1]!.trim(), raw = m[2]!.trim();
    if (key !== ROUTER_KEY && !cellKeys.includes(key)) throw new RangeError(`--queue names an unknown cell "${key.slice(0, 40)}"; the cells are ${cellKeys.join(", ")}, and "${ROUTER_KEY}".`);
    const h = raw === "" ? NaN : Number(raw);
    if (!Number.isFinite(h)) throw new RangeError(`--queue ${key}= needs a number of hours, not "${raw.slice(0, 20)}".`);
    if (h < 0) throw new RangeError(`--queue ${key}=${raw}: hours cannot be negative.`);
    out[key] = (out[key] ?? 0) + h;
  }
  return out;
}

/** An accepted part's hours from its estimate: printing, dwell and each build's cooling on its cell, machining on the router. */
export function unscheduledOf(e: Partial<EstimateResult>): UnscheduledRow | null {
  if (!e.cell) return null;
  const f = (v: unknown) => (typeof v === "number" && Number.isFinite(v) && v > 0 ? v : 0);
  return { cellKey: e.cell, cellHours: f(e.printHours) + f(e.dwellHours) + f(e.coolingHours) * Math.max(1, e.batch?.builds ?? 1), machiningHours: f(e.machiningHours) };
}

/** The queue kept to the catalogue's cells and the router (work booked on a cell since retired is dropped). */
export function forCells(q: CapacityQueue, cellKeys: string[]): CapacityQueue {
  const keep = (k: string) => k === ROUTER_KEY || cellKeys.includes(k);
  return {
    booked: Object.fromEntries(Object.entries(q.booked ?? {}).filter(([k]) => keep(k))),
    hours: Object.fromEntries(Object.entries(q.hours ?? {}).filter(([k]) => keep(k))),
  };
}
