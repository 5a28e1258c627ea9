import { grownSection } from "../grow";
import { slice, type Sections } from "../slice";
import type { SliceJob } from "../slice-ahead";
import type { IndexedMesh } from "../indexed";
import type { Axis } from "../types";
import { bad } from "./read";
import type { Measured } from "./measure";

/** Most layers a plan may have (a 9 m build at 1 mm layers is 9 000). */
export const MAX_LAYERS = 200_000;
const AXIS_INDEX: Record<Axis, number> = { x: 0, y: 1, z: 2 };

export interface GrownSections {
  /** Height of the first layer's bottom, mm (build space). */
  z0: number;
  layerHeightMm: number;
  layerCount: number;
  /** Build height of the near-net part, mm. */
  heightMm: number;
  /** Grown (near-net) section area, contour length and contour pieces per layer. */
  areaMm2: Float64Array;
  perimeterMm: Float64Array;
  segments: Uint32Array;
  /** Σ grown areas × layer height, before rescaling to the Steiner volume. */
  slicedVolumeMm3: number;
  /** Net section area of the first layer inside the part: the face on the bed (exact for a flat bottom), mm². */
  bedFaceMm2: number;
  /** Longest net contour of any layer: an open mold's edge, where its trim line runs, mm. */
  outlineMm: number;
  /** A piece's slab (sliced with a range): its net volume and side area from the sections, and its end sections. */
  slab?: PieceSlab;
}

export interface PieceSlab {
  netVolumeMm3: number;
  sideAreaMm2: number;
  lowAreaMm2: number;
  lowPerimeterMm: number;
  highAreaMm2: number;
  highPerimeterMm: number;
}

/**
 * Stage 4: the part cut once per up axis at a fine layer height, each net section grown by the
 * finish allowance (beyond the net part's ends, the nearest section grown by √(t² − d²)). The
 * candidates' coarser layers then sample these sections (`sectionsAt`), so a part is sliced at
 * most three times however many bead/layer presets are planned. A swap of the plan axes turns a
 * section in its plane and changes neither its area nor its contour.
 */
export function sliceStage(mesh: IndexedMesh, ms: Measured, up: Axis, fineHeightMm: number, allowanceMm: number, range?: [number, number], cut?: Sections): GrownSections {
  const t = allowanceMm, h = fineHeightMm;
  const ai = AXIS_INDEX[up];
  // a piece of a split part: the slab between two cuts, each cut face keeping the allowance
  const zMin = range ? range[0] : ms.m.bounds.min[ai]!, zMax = range ? range[1] : ms.m.bounds.max[ai]!;
  const job = fineSliceJob(zMin, zMax, up, h, t);
  if (!job) bad("mesh:too-tall", `The part would need ${layerCountOf(zMin, zMax, h, t)} layers, more than the ${MAX_LAYERS} the planner accepts; check the units.`);
  const { z0, count: layerCount } = job;
  const height = zMax - zMin + 2 * t;
  // the same planes cut already (on the slicing helper, ../slice-ahead), or cut now
  const sec = cut && cut.z0 === z0 && cut.layerHeight === h && cut.count === layerCount ? cut : slice(mesh, z0, h, layerCount, up);
  const grownArea = new Float64Array(layerCount), grownPer = new Float64Array(layerCount), segs = new Uint32Array(layerCount);
  let firstIn = -1, lastIn = -1;
  for (let k = 0; k < layerCount; k++) {
    const z = z0 + (k + 0.5) * h;
    if (sec.area[k]! > 0 && z > zMin && z < zMax) { if (firstIn < 0) firstIn = k; lastIn = k; }
  }
  const planSum = ms.netSize[0] + ms.netSize[1] + ms.netSize[2] - ms.netSize[ai]!;
  const fallbackA = ms.volumeMm3 / Math.max(zMax - zMin, 1e-9), fallbackP = 2 * planSum;
  for (let k = 0; k < layerCount; k++) {
    const z = z0 + (k + 0.5) * h;
    let A: number, P: number, S: number, r = t;
    if (z > zMin && z < zMax && sec.area[k]! > 0) { A = sec.area[k]!; P = sec.perimeter[k]!; S = sec.segments[k]!; }
    else {
      const idx = z <= zMin || (firstIn >= 0 && k < firstIn) ? firstIn : lastIn;
      A = idx >= 0 ? sec.area[idx]! : fallbackA; P = idx >= 0 ? sec.perimeter[idx]! : fallbackP; S = idx >= 0 ? sec.segments[idx]! : 4;
      const d = z <= zMin ? zMin - z : z >= zMax ? z - zMax : 0;
      r = Math.sqrt(Math.max(0, t * t - d * d));
    }
    const g = grownSection(A, P, r);
    grownArea[k] = g.area; grownPer[k] = g.perimeter; segs[k] = S;
  }
  let slicedVolume = 0;
  for (let k = 0; k < layerCount; k++) slicedVolume += grownArea[k]! * h;
  let outline = 0;
  for (let k = Math.max(0, firstIn); k >= 0 && k <= lastIn; k++) if (sec.perimeter[k]! > outline) outline = sec.perimeter[k]!;
  const bedFace = firstIn >= 0 ? sec.area[firstIn]! : 0;
  let slab: PieceSlab | undefined;
  if (range) {
    let v = 0, side = 0;
    for (let k = Math.max(0, firstIn); k >= 0 && k <= lastIn; k++) { v += sec.area[k]! * h; side += sec.perimeter[k]! * h; }
    slab = {
      netVolumeMm3: v, sideAreaMm2: side,
      lowAreaMm2: firstIn >= 0 ? sec.area[firstIn]! : 0, lowPerimeterMm: firstIn >= 0 ? sec.perimeter[firstIn]! : 0,
      highAreaMm2: lastIn >= 0 ? sec.area[lastIn]! : 0, highPerimeterMm: lastIn >= 0 ? sec.perimeter[lastIn]! : 0,
    };
  }
  return { z0, layerHeightMm: h, layerCount, heightMm: height, areaMm2: grownArea, perimeterMm: grownPer, segments: segs, slicedVolumeMm3: slicedVolume, bedFaceMm2: bedFace, outlineMm: outline, ...(slab ? { slab } : {}) };
}

const layerCountOf = (zMin: number, zMax: number, h: number, t: number) => Math.max(1, Math.ceil((zMax - zMin + 2 * t) / h - 1e-9));

/**
 * The fine slicing of the part between zMin and zMax along `up` at layer height h with the
 * allowance t beyond each end (what `sliceStage` cuts), or null past MAX_LAYERS.
 */
export function fineSliceJob(zMin: number, zMax: number, up: Axis, h: number, t: number): SliceJob | null {
  const count = layerCountOf(zMin, zMax, h, t);
  return count > MAX_LAYERS ? null : { up, z0: zMin - t, h, count };
}

/** The fine sections sampled at a coarser layer height: each layer takes the fine section at its mid-height. */
export function sectionsAt(fine: GrownSections, layerHeightMm: number): GrownSections {
  if (Math.abs(layerHeightMm - fine.layerHeightMm) < 1e-9) return fine;
  const h = layerHeightMm, height = fine.heightMm;
  const n = Math.max(1, Math.ceil(height / h - 1e-9));
  if (n > MAX_LAYERS) bad("mesh:too-tall", `The part would need ${n} layers, more than the ${MAX_LAYERS} the planner accepts; check the units.`);
  const area = new Float64Array(n), per = new Float64Array(n), seg = new Uint32Array(n);
  let vol = 0;
  for (let k = 0; k < n; k++) {
    const j = Math.min(fine.layerCount - 1, Math.max(0, Math.floor(((k + 0.5) * h) / fine.layerHeightMm)));
    area[k] = fine.areaMm2[j]!; per[k] = fine.perimeterMm[j]!; seg[k] = fine.segments[j]!;
    vol += area[k]! * h;
  }
  return { z0: fine.z0, layerHeightMm: h, layerCount: n, heightMm: height, areaMm2: area, perimeterMm: per, segments: seg, slicedVolumeMm3: vol, bedFaceMm2: fine.bedFaceMm2, outlineMm: fine.outlineMm };
}
