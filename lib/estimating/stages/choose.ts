import { steinerVolume } from "../grow";
import { bestOrientation, fitCells, orientedSize, suggestSplit } from "../orient";
import type { Axis, CellFit, CellParams, EstimateWarning, MaterialParams, Orientation, SplitSuggestion } from "../types";
import type { Measured } from "./measure";

const r2 = (v: number) => Math.round(v * 100) / 100;

export interface Choice {
  cell: CellParams;
  orientation: Orientation;
  chosenBy: "user" | "min-height";
  fits: CellFit[];
  fitsAny: boolean;
  split: SplitSuggestion | null;
}

/**
 * Stage 3: the cell and the build orientation. A forced orientation takes the first cell it
 * fits; otherwise the lowest build that fits, and among those the smallest cell whose extruder
 * lays a mean layer inside the material's cooling window (a rough Steiner-volume check).
 */
export function chooseStage(
  ms: Measured,
  cells: CellParams[],
  material: MaterialParams,
  allowanceMm: number,
  o: { cellKey?: string; orientation?: Axis | Orientation },
  warnings: EstimateWarning[],
): Choice {
  const { grownSize, netSize, m } = ms;
  const t = allowanceMm;
  let orientation: Orientation;
  let chosenBy: "user" | "min-height";
  let cell: CellParams;
  const candidates = o.cellKey ? cells.filter((c) => c.key === o.cellKey) : cells;
  if (o.orientation) {
    orientation = typeof o.orientation === "string" ? { up: o.orientation, swapped: false } : o.orientation;
    chosenBy = "user";
    if (o.cellKey) cell = candidates[0]!;
    else {
      const fitting = cells.filter((c) => Math.min(c.envelopeMm.x - orientedSize(grownSize, orientation)[0], c.envelopeMm.y - orientedSize(grownSize, orientation)[1], c.envelopeMm.z - orientedSize(grownSize, orientation)[2]) >= 0);
      cell = fitting[0] ?? cells[0]!;
    }
  } else {
    chosenBy = "min-height";
    const ranked = candidates.map((c) => ({ c, b: bestOrientation(grownSize, c) }));
    const fitting = ranked.filter((r) => r.b.marginMm >= 0);
    const envVol = (c: CellParams) => c.envelopeMm.x * c.envelopeMm.y * c.envelopeMm.z;
    fitting.sort((a, b) => a.b.heightMm - b.b.heightMm || envVol(a.c) - envVol(b.c));
    const grownGuess = steinerVolume(Math.abs(m.volumeMm3), m.areaMm2, Math.abs(m.meanCurvatureIntegral), t);
    const meanLayerS = (c: CellParams, heightMm: number) => {
      const mm3PerS = Math.min((c.extruderOutputKgPerH * 1e6) / 3600 / material.densityGPerCm3, c.speedMaxMmS * c.defaultBeadWidthMm * c.defaultLayerHeightMm);
      return (grownGuess * (c.defaultLayerHeightMm / heightMm)) / mm3PerS;
    };
    const lowest = fitting.length ? fitting[0]!.b.heightMm : 0;
    const pick = fitting.find((r) => r.b.heightMm <= lowest + 1e-6 && meanLayerS(r.c, r.b.heightMm) <= material.maxLayerTimeS)
      ?? fitting[0] ?? ranked.sort((a, b) => b.b.marginMm - a.b.marginMm)[0]!;
    cell = pick.c; orientation = pick.b.orientation;
  }
  const fits = fitCells(grownSize, cells, orientation);
  const fitsAny = fits.some((f) => f.fits);
  const split = fitsAny ? null : suggestSplit(netSize, t, cells);
  if (!fitsAny) {
    const over = Math.max(...fits.map((f) => f.marginMm));
    warnings.push({
      code: "fits-no-cell",
      message: split
        ? `The part fits no printing cell (short by ${r2(-over)} mm at best); split it along ${split.axis} into ${split.pieces} pieces of ${r2(split.pieceLengthMm)} mm for the ${split.cell} cell. The estimate prices it as one print on ${cell.name}.`
        : `The part fits no printing cell (short by ${r2(-over)} mm at best) and no split along its longest axis fits either.`,
    });
  } else if (!fits.find((f) => f.cell === cell.key)?.fitsChosen) {
    warnings.push({ code: "fits-not-chosen", message: `The part does not fit the ${cell.name} cell in the chosen orientation.` });
  }
  return { cell, orientation, chosenBy, fits, fitsAny, split };
}
