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
  cell: Pick<CellParams, "speedMinMmS" | "speedMaxMmS" | "extruderOutputKgPerH" | "accelerationMmS2">;
  material: Pick<MaterialParams, "densityGPerCm3" | "minLayerTimeS" | "maxLayerTimeS">;
  /** Shell build with ribs and skins; when absent a shell is walls only (path = walls × contour). */
  shell?: ShellSpec;
  /** Straight pieces of each layer's contour (from the slicer); with an acceleration, the mean speed follows from them. */
  segments?: Uint32Array;
  /** Parts laid side by side in each layer (default 1). */
  copies?: number;
}

/** A thin-walled shell: walls along the contour, a rib grid inside, solid skins where the part has tops and bottoms. */
export interface ShellSpec {
  ribSpacingMm: number;
  ribBeads: number;
  /** Skin area per layer (exposed top or bottom within the skin depth), mm². */
  skinMm2: Float64Array;
  /** Area under a flat top that needs support ribs at `supportSpacingMm`, per layer, mm². */
  supportMm2: Float64Array;
  supportSpacingMm: number;
}

/**
 * Time to lay `n` straight segments of length ℓ at programmed speed v with acceleration a, each
 * starting and ending at rest at its corners: trapezoidal profile ℓ/v + v/a when ℓ ≥ v²/a,
 * else triangular 2√(ℓ/a) (kinematics of uniform acceleration; common practice for motion
 * planning estimates).
 */
export function segmentTimeS(lengthMm: number, n: number, vMmS: number, aMmS2: number | undefined): number {
  if (n <= 0 || lengthMm <= 0) return 0;
  if (!aMmS2 || aMmS2 <= 0) return (n * lengthMm) / vMmS;
  return n * (lengthMm >= (vMmS * vMmS) / aMmS2 ? lengthMm / vMmS + vMmS / aMmS2 : 2 * Math.sqrt(lengthMm / aMmS2));
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
  /** Mean laying speed over the whole path (deposition time only), mm/s. */
  meanSpeedMmS: number;
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
  const acc = cell.accelerationMmS2, copies = Math.max(1, inp.copies ?? 1), sh = inp.shell, seg = inp.segments;
  let layTotal = 0, pathTotal = 0;
  for (let k = 0; k < n; k++) {
    const a = Math.max(0, inp.areaMm2[k]!), per = Math.max(0, inp.perimeterMm[k]!);
    const solidPath = a / w;
    let path: number, tLay: number;
    const raster = (area: number) => segmentTimeS(Math.max(w, Math.sqrt(area)), area / w / Math.max(w, Math.sqrt(area)), v, acc);
    const walls = (count: number) => {
      const nSeg = Math.max(1, seg?.[k] ?? 1);
      return segmentTimeS(per / nSeg, nSeg * count, v, acc);
    };
    if (inp.shellWalls === null) {
      path = solidPath; tLay = raster(a);
    } else if (!sh) {
      path = Math.min(per * inp.shellWalls, solidPath);
      tLay = path < solidPath ? walls(inp.shellWalls) : raster(a);
    } else {
      const wallPath = per * inp.shellWalls;
      const skin = Math.min(a, sh.skinMm2[k] ?? 0);
      const inner = Math.max(0, a - wallPath * w - skin);
      const support = Math.min(inner, sh.supportMm2[k] ?? 0);
      const ribLines = sh.ribBeads * (2 * (inner - support) / sh.ribSpacingMm + 2 * support / sh.supportSpacingMm);
      const shellPath = wallPath + ribLines + skin / w;
      if (shellPath >= solidPath) { path = solidPath; tLay = raster(a); }
      else {
        path = shellPath;
        const ribLen = Math.max(w, Math.sqrt(inner));
        tLay = walls(inp.shellWalls) + segmentTimeS(ribLen, ribLines / ribLen, v, acc) + raster(skin);
      }
    }
    // the mean speed stays inside the cell's range
    tLay = Math.min(Math.max(tLay, path / v), path / vMin);
    path *= copies; tLay *= copies;
    pathMm[k] = path;
    dep += path * w * h;
    layTotal += tLay; pathTotal += path;
    let t = tLay;
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
  return { speedMmS: v, extruderLimited, timeS, dwellS, flagged, pathMm, printS, dwellTotalS: dwellTotal, flaggedCount, depositedMm3: dep, meanSpeedMmS: layTotal > 0 ? pathTotal / layTotal : v };
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
