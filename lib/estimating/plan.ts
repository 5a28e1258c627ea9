import type { CellParams, MaterialParams } from "./types";

export interface LayerPlanInput {
  /** Grown section area per layer, mm². */
  areaMm2: Float64Array;
  /** Grown contour length per layer, mm. */
  perimeterMm: Float64Array;
  layerHeightMm: number;
  beadWidthMm: number;
  /** null = solid print (area ÷ bead width); N = N walls along the contour. */
  shellWalls: number | null;
  cell: Pick<CellParams, "speedMinMmS" | "speedMaxMmS" | "extruderOutputKgPerH">;
  material: Pick<MaterialParams, "densityGPerCm3" | "minLayerTimeS" | "maxLayerTimeS">;
}

export interface LayerPlan {
  /** Speed the path is laid at before cooling adjustments, mm/s (cell maximum, capped by extruder output). */
  speedMmS: number;
  /** True when the extruder cannot feed even the cell's minimum speed. */
  extruderLimited: boolean;
  /** Seconds laying each layer (after any slow-down). */
  timeS: Float64Array;
  /** Seconds waiting before the next layer may go down. */
  dwellS: Float64Array;
  flagged: Uint8Array;
  pathMm: Float64Array;
  printS: number;
  dwellTotalS: number;
  flaggedCount: number;
  depositedMm3: number;
}

/**
 * Layer-time plan. Deposition rate is ρ · bead width · layer height · speed (arithmetic; e.g.
 * 20 × 5 mm at 100 mm/s and 1.15 g/cm³ is 41.4 kg/h), so the speed is the cell's maximum capped
 * at extruder output ÷ (ρ·w·h). Each layer is then held inside the material's cooling window:
 * shorter than the minimum layer time → slow down (not below the cell's minimum speed), then
 * dwell for the rest; longer than the maximum → flagged (the layer below cools too far and the
 * bond is weak; Compton et al., Additive Manufacturing 17 (2017) 77–86).
 */
export function planLayers(inp: LayerPlanInput): LayerPlan {
  const n = inp.areaMm2.length;
  const { cell, material } = inp;
  const w = inp.beadWidthMm, h = inp.layerHeightMm;
  const mm3PerS = (cell.extruderOutputKgPerH * 1e6) / 3600 / material.densityGPerCm3; // kg/h → g/h ÷ ρ → cm³/h → mm³/s
  const vCap = mm3PerS / (w * h);
  const v = Math.min(cell.speedMaxMmS, vCap);
  const extruderLimited = vCap < cell.speedMinMmS;
  const vMin = Math.min(cell.speedMinMmS, v);
  const timeS = new Float64Array(n), dwellS = new Float64Array(n), pathMm = new Float64Array(n);
  const flagged = new Uint8Array(n);
  let printS = 0, dwellTotal = 0, flaggedCount = 0, dep = 0;
  const minT = material.minLayerTimeS, maxT = material.maxLayerTimeS;
  for (let k = 0; k < n; k++) {
    const a = Math.max(0, inp.areaMm2[k]!), per = Math.max(0, inp.perimeterMm[k]!);
    const path = inp.shellWalls === null ? a / w : Math.min(per * inp.shellWalls, a / w);
    pathMm[k] = path;
    dep += path * w * h;
    let t = path / v;
    let dwell = 0;
    if (t < minT) {
      const tSlow = path / vMin; // slowest allowed
      if (tSlow >= minT) t = minT; else { t = tSlow; dwell = minT - tSlow; }
    } else if (t > maxT) {
      flagged[k] = 1;
      flaggedCount++;
    }
    timeS[k] = t; dwellS[k] = dwell;
    printS += t; dwellTotal += dwell;
  }
  return { speedMmS: v, extruderLimited, timeS, dwellS, flagged, pathMm, printS, dwellTotalS: dwellTotal, flaggedCount, depositedMm3: dep };
}

/** Per-layer series reduced to at most `maxPoints` buckets: mean time and dwell, flagged if any layer is. */
export function downsampleLayers(z0: number, h: number, plan: LayerPlan, maxPoints = 2000) {
  const n = plan.timeS.length;
  const stride = Math.max(1, Math.ceil(n / maxPoints));
  const zMm: number[] = [], timeS: number[] = [], dwellS: number[] = [], flagged: boolean[] = [];
  for (let s = 0; s < n; s += stride) {
    const e = Math.min(n, s + stride);
    let t = 0, d = 0, f = false;
    for (let k = s; k < e; k++) { t += plan.timeS[k]!; d += plan.dwellS[k]!; f ||= plan.flagged[k] === 1; }
    zMm.push(round3(z0 + ((s + e) / 2) * h)); timeS.push(round3(t / (e - s))); dwellS.push(round3(d / (e - s))); flagged.push(f);
  }
  return { zMm, timeS, dwellS, flagged, stride };
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}
