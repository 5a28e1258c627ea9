import { grownSection } from "../grow";
import { bounds, type Bounds } from "../measure";
import { orientPositions, orientedSize } from "../orient";
import { slice } from "../slice";
import type { Mesh, Orientation } from "../types";
import { bad } from "./read";
import type { Measured } from "./measure";

/** Most layers a plan may have (a 9 m build at 1 mm layers is 9 000). */
export const MAX_LAYERS = 200_000;

export interface GrownSections {
  /** Height of the first layer's bottom, mm (build space). */
  z0: number;
  layerHeightMm: number;
  layerCount: number;
  /** Net part's bounds in build space. */
  buildBounds: Bounds;
  /** Grown (near-net) section area and contour length per layer. */
  areaMm2: Float64Array;
  perimeterMm: Float64Array;
  /** Σ grown areas × layer height, before rescaling to the Steiner volume. */
  slicedVolumeMm3: number;
}

/**
 * Stage 4: the part turned into the build orientation and cut at every layer; each net section
 * grown by the finish allowance (beyond the net part's ends, the nearest section grown by
 * √(t² − d²)).
 * With `turnInPlace` the mesh's own positions are turned into build space (memory: no copy).
 */
export function sliceStage(mesh: Mesh, ms: Measured, orientation: Orientation, layerHeightMm: number, allowanceMm: number, opts: { turnInPlace?: boolean } = {}): GrownSections {
  const t = allowanceMm, h = layerHeightMm;
  const upright = orientation.up === "z" && !orientation.swapped;
  // turnInPlace: the caller is done with the file-space mesh, so it is turned where it lies
  const p = orientPositions(mesh.positions, orientation, opts.turnInPlace ? mesh.positions : undefined);
  const ob = upright ? ms.m.bounds : bounds(p);
  const zMin = ob.min[2], zMax = ob.max[2];
  const height = zMax - zMin + 2 * t;
  const layerCount = Math.max(1, Math.ceil(height / h - 1e-9));
  if (layerCount > MAX_LAYERS) bad("mesh:too-tall", `The part would need ${layerCount} layers, more than the ${MAX_LAYERS} the planner accepts; check the units.`);
  const z0 = zMin - t;
  const sec = slice(p, mesh.triangleCount, z0, h, layerCount);
  const grownArea = new Float64Array(layerCount), grownPer = new Float64Array(layerCount);
  let firstIn = -1, lastIn = -1;
  for (let k = 0; k < layerCount; k++) if (sec.area[k]! > 0) { if (firstIn < 0) firstIn = k; lastIn = k; }
  const plan = orientedSize(ms.netSize, orientation);
  const fallbackA = ms.volumeMm3 / Math.max(zMax - zMin, 1e-9), fallbackP = 2 * (plan[0] + plan[1]);
  for (let k = 0; k < layerCount; k++) {
    const z = z0 + (k + 0.5) * h;
    let A: number, P: number, r = t;
    if (z > zMin && z < zMax && sec.area[k]! > 0) { A = sec.area[k]!; P = sec.perimeter[k]!; }
    else {
      const idx = z <= zMin || (firstIn >= 0 && k < firstIn) ? firstIn : lastIn;
      A = idx >= 0 ? sec.area[idx]! : fallbackA; P = idx >= 0 ? sec.perimeter[idx]! : fallbackP;
      const d = z <= zMin ? zMin - z : z >= zMax ? z - zMax : 0;
      r = Math.sqrt(Math.max(0, t * t - d * d));
    }
    const g = grownSection(A, P, r);
    grownArea[k] = g.area; grownPer[k] = g.perimeter;
  }
  let slicedVolume = 0;
  for (let k = 0; k < layerCount; k++) slicedVolume += grownArea[k]! * h;
  return { z0, layerHeightMm: h, layerCount, buildBounds: ob, areaMm2: grownArea, perimeterMm: grownPer, slicedVolumeMm3: slicedVolume };
}
