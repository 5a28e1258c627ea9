import { measure, type Bounds, type Measures } from "../measure";
import type { EstimateWarning } from "../types";
import { bad } from "./read";

export type Vec3 = [number, number, number];

export interface Measured {
  m: Measures;
  /** Enclosed volume, mm³, turned positive for an inside-out mesh. */
  volumeMm3: number;
  /** Steiner's M, sign following the volume's. */
  meanCurvatureMm: number;
  netSize: Vec3;
  grownSize: Vec3;
}

/** Stage 2: volume, area, topology and Steiner's M; the net and grown boxes. */
export function measureStage(mesh: Parameters<typeof measure>[0], allowanceMm: number, weldToleranceMm: number | undefined, warnings: EstimateWarning[], box?: Bounds): Measured {
  const m = measure(mesh, { weldToleranceMm, bounds: box });
  let volume = m.volumeMm3, M = m.meanCurvatureIntegral;
  if (volume < 0) {
    warnings.push({ code: "inside-out", message: "The mesh is wound inside out (its volume came out negative); it was measured as if turned right way out." });
    volume = -volume; M = -M;
  }
  if (!m.watertight) {
    warnings.push({ code: "not-watertight", message: `The mesh is not watertight (${m.openEdges} open, ${m.nonManifoldEdges} non-manifold, ${m.inconsistentEdges} inconsistently oriented edges): volume, mass and price are unreliable until it is repaired.` });
  }
  if (volume <= 0) bad("mesh:no-volume", "The mesh encloses no volume, so there is nothing to print.");
  return { m, volumeMm3: volume, meanCurvatureMm: M, ...boxSizes(m.bounds, allowanceMm) };
}

/** The net box's sides and the grown (near-net) box's, the allowance t added each side. */
export function boxSizes(b: Bounds, allowanceMm: number): { netSize: Vec3; grownSize: Vec3 } {
  const netSize = [0, 1, 2].map((i) => b.max[i]! - b.min[i]!) as Vec3;
  const grownSize = netSize.map((v) => v + 2 * allowanceMm) as Vec3;
  return { netSize, grownSize };
}
