import type { Axis, CellFit, CellParams, Orientation, SplitSuggestion } from "./types";

const AXES: Axis[] = ["x", "y", "z"];

/** The six axis-aligned build orientations: each file axis up, the other two either way round. */
export const ORIENTATIONS: Orientation[] = AXES.flatMap((up) => [{ up, swapped: false }, { up, swapped: true }]);

/** Sizes (cell x, cell y, build height) of a box of `size` (file x, y, z) in an orientation. */
export function orientedSize(size: [number, number, number], o: Orientation): [number, number, number] {
  const [x, y, z] = size;
  const plan: [number, number] = o.up === "z" ? [x, y] : o.up === "y" ? [z, x] : [y, z];
  const [a, b] = o.swapped ? [plan[1], plan[0]] : plan;
  return [a, b, o.up === "z" ? z : o.up === "y" ? y : x];
}

/**
 * Maps a file-space point to build space for an orientation (a proper rotation: cyclic axis
 * order, and a swap paired with a mirror of one plan axis, so windings and volumes keep their sign).
 * Pass `out = p` to turn the points in place (no second copy of a large mesh).
 */
export function orientPositions(p: Float32Array, o: Orientation, out: Float32Array = new Float32Array(p.length)): Float32Array {
  if (o.up === "z" && !o.swapped) return p;
  // `out` may be `p` itself: each point is read whole before it is written
  for (let i = 0; i < p.length; i += 3) {
    const x = p[i]!, y = p[i + 1]!, z = p[i + 2]!;
    let a: number, b: number, c: number;
    if (o.up === "z") { a = x; b = y; c = z; } else if (o.up === "y") { a = z; b = x; c = y; } else { a = y; b = z; c = x; }
    if (o.swapped) { const t = a; a = b; b = -t; }
    out[i] = a; out[i + 1] = b; out[i + 2] = c;
  }
  return out;
}

/** Smallest clearance of a box in a cell envelope, mm (negative when it does not fit). */
export function clearance(s: [number, number, number], cell: CellParams): number {
  return Math.min(cell.envelopeMm.x - s[0], cell.envelopeMm.y - s[1], cell.envelopeMm.z - s[2]);
}

/**
 * Orientations a cell accepts. A cell that cannot print vertically does not stand a part on
 * its longest axis (a tall slender build needs the frame's support; bureau practice).
 */
export function allowedOrientations(size: [number, number, number], cell: CellParams): Orientation[] {
  if (cell.canPrintVertical) return ORIENTATIONS;
  const longest = size.indexOf(Math.max(...size));
  const slender = Math.max(...size) > 2 * Math.min(...size);
  return ORIENTATIONS.filter((o) => !(slender && AXES.indexOf(o.up) === longest));
}

/** The allowed orientation with the lowest build height that fits (ties: larger clearance), else the largest clearance. */
export function bestOrientation(size: [number, number, number], cell: CellParams): { orientation: Orientation; marginMm: number; heightMm: number } {
  let best: { orientation: Orientation; marginMm: number; heightMm: number } | null = null;
  for (const o of allowedOrientations(size, cell)) {
    const s = orientedSize(size, o);
    const margin = clearance(s, cell);
    const cand = { orientation: o, marginMm: margin, heightMm: s[2] };
    if (!best) { best = cand; continue; }
    const fits = margin >= 0, bestFits = best.marginMm >= 0;
    if (fits && !bestFits) best = cand;
    else if (fits && bestFits && (s[2] < best.heightMm - 1e-9 || (Math.abs(s[2] - best.heightMm) <= 1e-9 && margin > best.marginMm))) best = cand;
    else if (!fits && !bestFits && margin > best.marginMm) best = cand;
  }
  return best!;
}

/**
 * A cell's vertical build as an envelope: layers stacked along its long axis (the build
 * direction), each layer inside its cross travel. Null for a cell that prints horizontally only.
 */
export function verticalCellOf(cell: CellParams): CellParams | null {
  const v = cell.verticalPrint;
  if (!v) return null;
  return { ...cell, envelopeMm: { x: v.sectionMm.x, y: v.sectionMm.y, z: v.longAxisMm }, canPrintVertical: true };
}

/**
 * A long part built vertically: its longest axis along the cell's long axis, so its layers run
 * across its length (the section turned whichever way leaves more room). Null when the cell has no
 * vertical build.
 */
export function verticalFit(size: [number, number, number], cell: CellParams): { cell: CellParams; orientation: Orientation; marginMm: number; heightMm: number } | null {
  const vc = verticalCellOf(cell);
  if (!vc) return null;
  const up = AXES[size.indexOf(Math.max(...size))]!;
  let best: { cell: CellParams; orientation: Orientation; marginMm: number; heightMm: number } | null = null;
  for (const swapped of [false, true]) {
    const o = { up, swapped };
    const s = orientedSize(size, o);
    const m = clearance(s, vc);
    if (!best || m > best.marginMm) best = { cell: vc, orientation: o, marginMm: m, heightMm: s[2] };
  }
  return best;
}

/**
 * Fit of the grown box `size` in every cell, in its best orientation and in the chosen one. A cell
 * the part fits only when built vertically reports that fit (`vertical`).
 */
export function fitCells(size: [number, number, number], cells: CellParams[], chosen: Orientation, chosenVertical?: { cell: string }): CellFit[] {
  return cells.map((cell) => {
    let b: { orientation: Orientation; marginMm: number; heightMm: number } = bestOrientation(size, cell);
    let vertical = false;
    const vf = b.marginMm < 0 ? verticalFit(size, cell) : null;
    if (vf && vf.marginMm >= 0) { b = vf; vertical = true; }
    const chosenHere = chosenVertical?.cell === cell.key ? verticalCellOf(cell) : null;
    const allowedChosen = chosenHere ? true : allowedOrientations(size, cell).some((o) => o.up === chosen.up && o.swapped === chosen.swapped);
    const mc = clearance(orientedSize(size, chosen), chosenHere ?? cell);
    return {
      cell: cell.key, cellName: cell.name, fits: b.marginMm >= 0, marginMm: b.marginMm,
      bestOrientation: b.orientation, buildHeightMm: b.heightMm,
      fitsChosen: allowedChosen && mc >= 0, marginChosenMm: mc,
      ...(vertical ? { vertical: true } : {}),
    };
  });
}

/**
 * When no cell takes the part whole: the fewest equal pieces along the longest axis that fit
 * some cell, each piece keeping the allowance on its cut faces (`allowanceMm` per side).
 */
export function suggestSplit(netSize: [number, number, number], allowanceMm: number, cells: CellParams[], maxPieces = 40): SplitSuggestion | null {
  const axisIndex = netSize.indexOf(Math.max(...netSize));
  for (let pieces = 2; pieces <= maxPieces; pieces++) {
    const s = netSize.map((v, i) => (i === axisIndex ? v / pieces : v) + 2 * allowanceMm) as [number, number, number];
    let bestCell: { cell: string; margin: number; vertical: boolean } | null = null;
    for (const cell of cells) {
      const b = bestOrientation(s, cell);
      if (b.marginMm >= 0 && (!bestCell || b.marginMm > bestCell.margin)) bestCell = { cell: cell.key, margin: b.marginMm, vertical: false };
      const v = b.marginMm < 0 ? verticalFit(s, cell) : null;
      if (v && v.marginMm >= 0 && (!bestCell || v.marginMm > bestCell.margin)) bestCell = { cell: cell.key, margin: v.marginMm, vertical: true };
    }
    if (bestCell) return { axis: AXES[axisIndex]!, pieces, pieceLengthMm: netSize[axisIndex]! / pieces, cell: bestCell.cell, marginMm: bestCell.margin, ...(bestCell.vertical ? { vertical: true } : {}) };
  }
  return null;
}
