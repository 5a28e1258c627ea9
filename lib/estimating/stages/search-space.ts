import { allowedOrientations, bestOrientation, clearance, orientedSize, verticalFit } from "../orient";
import type { Axis, CellParams, Orientation } from "../types";
import type { Vec3 } from "./measure";

/**
 * The candidate search's space (./choose.ts): which cells and orientations a part is planned on,
 * the bead/layer presets of a cell, and how many parts share a bed.
 */

/** Layer height between a quarter and a half of the bead width (common practice, checks.md). */
export const LAYER_TO_BEAD_MIN = 0.25;
export const LAYER_TO_BEAD_MAX = 0.5;
/** Gap between parts printed side by side, mm (common practice: room for the nozzle and for machining). */
export const SIDE_BY_SIDE_GAP_MM = 100;
/** A part this many times longer than its next side is a long part, tried vertically on a cell that prints so (bureau practice). */
export const LONG_PART_RATIO = 2.5;

/** Bead/layer presets of a cell: its default, and every pair whose layer is ¼–½ of the bead. */
export function presetsOf(cell: CellParams): { beadWidthMm: number; layerHeightMm: number }[] {
  const out = [{ beadWidthMm: cell.defaultBeadWidthMm, layerHeightMm: cell.defaultLayerHeightMm }];
  for (const w of cell.beadWidthsMm) for (const h of cell.layerHeightsMm) {
    const r = h / w;
    if (r >= LAYER_TO_BEAD_MIN - 1e-9 && r <= LAYER_TO_BEAD_MAX + 1e-9 && !out.some((p) => p.beadWidthMm === w && p.layerHeightMm === h)) out.push({ beadWidthMm: w, layerHeightMm: h });
  }
  return out;
}

/** How many grown footprints (with the gap) fit side by side on the cell's bed. */
export function sideBySide(cell: CellParams, plan: [number, number]): number {
  const g = SIDE_BY_SIDE_GAP_MM;
  const fit = (ex: number, ey: number) => Math.max(0, Math.floor((ex + g) / (plan[0] + g))) * Math.max(0, Math.floor((ey + g) / (plan[1] + g)));
  return Math.max(1, fit(cell.envelopeMm.x, cell.envelopeMm.y), fit(cell.envelopeMm.y, cell.envelopeMm.x));
}

/** The catalogue's finest layer height, at which each up axis is sliced once. */
export function finestLayerOf(cells: CellParams[]): number {
  return Math.min(...cells.flatMap((c) => [...c.layerHeightsMm, c.defaultLayerHeightMm]).filter((h) => h > 0));
}

export interface CandidatePair { cell: CellParams; orientation: Orientation; fits: boolean; vertical: boolean }

/**
 * The (cell, orientation) pairs the search plans, pruned before any slicing: on each cell searched,
 * the orientation with the most room per up axis that fits, and a long part (or one the cell cannot
 * take lying down) built vertically where a cell can; when nothing fits, the cell and orientation
 * with the most room, for review. Needs only the grown box, so the slicing can start before the
 * mesh is measured (../slice-ahead).
 */
export function candidatePairs(grown: Vec3, cells: CellParams[], cellKey: string | undefined, orientation: Orientation | undefined): CandidatePair[] {
  const searched = cellKey ? cells.filter((c) => c.key === cellKey) : cells;
  const pairs: CandidatePair[] = [];
  const sides = [...grown].sort((a, b) => b - a);
  const longPart = sides[0]! >= LONG_PART_RATIO * sides[1]!;
  for (const cell of searched) {
    const options = orientation ? [orientation] : allowedOrientations(grown, cell);
    const byUp = new Map<Axis, { o: Orientation; m: number }>();
    for (const o of options) {
      const m = clearance(orientedSize(grown, o), cell);
      if (m < 0) continue;
      const prev = byUp.get(o.up);
      if (!prev || m > prev.m) byUp.set(o.up, { o, m });
    }
    for (const { o } of byUp.values()) pairs.push({ cell, orientation: o, fits: true, vertical: false });
    // a long part (or one this cell cannot take lying down) built vertically, layers across its length
    if (longPart || byUp.size === 0) {
      const vf = verticalFit(grown, cell);
      const forced = orientation;
      if (vf && (!forced || forced.up === vf.orientation.up)) {
        const o = forced ?? vf.orientation;
        if (clearance(orientedSize(grown, o), vf.cell) >= 0) pairs.push({ cell: vf.cell, orientation: o, fits: true, vertical: true });
      }
    }
  }
  if (pairs.length === 0) {
    // Nothing fits whole: plan on the cell (and orientation) with the most room, for review.
    const ranked = searched.map((c) => ({ c, b: bestOrientation(grown, c) }));
    const best = orientation
      ? { c: searched[0]!, o: orientation }
      : ranked.sort((a, b) => b.b.marginMm - a.b.marginMm).map((r) => ({ c: r.c, o: r.b.orientation }))[0]!;
    pairs.push({ cell: best.c, orientation: best.o, fits: false, vertical: false });
  }
  return pairs;
}
