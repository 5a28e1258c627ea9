import { EstimateInputError, LIMITS } from "../errors";
import type { Mesh } from "../types";
import type { OcctNode, OcctResult } from "./step-occt";

/**
 * Turning the kernel's indexed meshes (one per body: a part of the file's product tree,
 * instances expanded) into the engine's triangle soup, with sanity checks on what came out.
 */

/** Largest part extent accepted, mm. The biggest printing cell is 9 m long; a model 100 m
 * across is a unit mix-up or a broken file, and its analysis would be meaningless. */
export const MAX_EXTENT_MM = 100_000;

export interface StepBody {
  /** Index in the file's body list: the numbers `opts.bodies` takes. */
  index: number;
  /** Product-tree path and body name, made unique with " [2]", " [3]" where the file repeats one. */
  name: string;
  triangleCount: number;
  /** Axis-aligned size, mm. */
  sizeMm: [number, number, number];
  isKept: boolean;
}

/** Product-tree path ("assembly / sub-assembly") of every body, by body index. */
function bodyPaths(root: OcctNode | undefined, bodyCount: number): string[] {
  const paths = new Array<string>(bodyCount).fill("");
  const walk = (node: OcctNode, prefix: string[], depth: number) => {
    if (depth > 64) return;
    const here = node.name ? [...prefix, node.name] : prefix;
    for (const m of node.meshes ?? []) if (m >= 0 && m < bodyCount) paths[m] = here.join(" / ");
    for (const c of node.children ?? []) walk(c, here, depth + 1);
  };
  if (root) walk(root, [], 0);
  return paths;
}

export function bodyNamesOf(result: OcctResult): string[] {
  const meshes = result.meshes ?? [];
  const paths = bodyPaths(result.root, meshes.length);
  const raw = meshes.map((m, i) => {
    const path = paths[i] ?? "";
    const own = (m.name ?? "").trim();
    if (!own) return path || `Body ${i + 1}`;
    if (!path || path === own || path.endsWith(` / ${own}`)) return path || own;
    return `${path} / ${own}`;
  });
  const seen = new Map<string, number>();
  return raw.map((n) => {
    const k = (seen.get(n) ?? 0) + 1;
    seen.set(n, k);
    return k === 1 ? n : `${n} [${k}]`;
  });
}

function bad(format: string, code: string, message: string): never {
  throw new EstimateInputError(`${format}:${code}`, message);
}

/**
 * The kept bodies as one soup, `bodyOfTriangle` indexing `mesh.bodyNames` (kept bodies only,
 * in file order). Throws when the result is empty, malformed, absurdly large or absurdly sized.
 */
export function toMesh(result: OcctResult, format: "step" | "iges", keep: ((i: number) => boolean) | null) {
  const label = format === "step" ? "STEP" : "IGES";
  const meshes = result.meshes ?? [];
  const names = bodyNamesOf(result);
  let total = 0;
  for (let b = 0; b < meshes.length; b++) {
    const m = meshes[b]!;
    const nv = m.attributes?.position?.array?.length ?? 0;
    const ni = m.index?.array?.length ?? 0;
    if (nv % 3 !== 0 || ni % 3 !== 0) bad(format, "kernel-output", `The CAD kernel returned a malformed mesh for body ${b + 1} of this ${label} file.`);
    if (!keep || keep(b)) total += ni / 3;
  }
  if (total > LIMITS.maxTriangles) bad(format, "too-many-triangles", `The ${label} file tessellates into ${total} triangles, more than the ${LIMITS.maxTriangles} the estimator accepts; use a coarser tolerance or send fewer bodies.`);

  const positions = new Float32Array(total * 9);
  const bodyOfTriangle = new Uint32Array(total);
  const bodies: StepBody[] = [];
  const keptNames: string[] = [];
  const keptIndices: number[] = [];
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  let t = 0;
  for (let b = 0; b < meshes.length; b++) {
    const m = meshes[b]!;
    const p = m.attributes.position.array;
    const ix = m.index.array;
    const nv = p.length / 3;
    const bl = [Infinity, Infinity, Infinity];
    const bh = [-Infinity, -Infinity, -Infinity];
    for (let k = 0; k < p.length; k++) {
      const v = p[k]!;
      if (!(v <= LIMITS.maxCoordinate && v >= -LIMITS.maxCoordinate)) bad("mesh", "bad-coordinate", `The ${label} file gives body ${b + 1} a coordinate that is not a finite number or is absurdly large.`);
      const a = k % 3;
      if (v < bl[a]!) bl[a] = v;
      if (v > bh[a]!) bh[a] = v;
    }
    const isKept = !keep || keep(b);
    const size: [number, number, number] = nv > 0 ? [bh[0]! - bl[0]!, bh[1]! - bl[1]!, bh[2]! - bl[2]!] : [0, 0, 0];
    bodies.push({ index: b, name: names[b]!, triangleCount: ix.length / 3, sizeMm: size, isKept });
    if (!isKept || ix.length === 0) continue;
    const body = keptNames.length;
    keptNames.push(names[b]!);
    keptIndices.push(b);
    for (let a = 0; a < 3; a++) {
      lo[a] = Math.min(lo[a]!, bl[a]!);
      hi[a] = Math.max(hi[a]!, bh[a]!);
    }
    for (let k = 0; k < ix.length; k += 3, t++) {
      for (let c = 0; c < 3; c++) {
        const v = ix[k + c]!;
        if (!(v >= 0 && v < nv) || v !== Math.floor(v)) bad(format, "kernel-output", `The CAD kernel returned a triangle with a vertex index out of range in body ${b + 1}.`);
        const o = t * 9 + c * 3;
        positions[o] = p[v * 3]!;
        positions[o + 1] = p[v * 3 + 1]!;
        positions[o + 2] = p[v * 3 + 2]!;
      }
      bodyOfTriangle[t] = body;
    }
  }
  if (meshes.length === 0 || bodies.every((b) => b.triangleCount === 0)) {
    bad(format, "no-solids", `The ${label} file holds no solid or surface the CAD kernel could tessellate (it may carry only curves, points or drawing data).`);
  }
  if (t === 0) bad(format, "no-bodies-kept", `None of the chosen bodies of this ${label} file has any geometry; choose at least one body with triangles.`);
  const extent = Math.max(hi[0]! - lo[0]!, hi[1]! - lo[1]!, hi[2]! - lo[2]!);
  if (extent > MAX_EXTENT_MM) bad(format, "absurd-size", `The ${label} model is ${(extent / 1000).toFixed(0)} m across, far beyond any part the bureau prints: check the file's units or the export.`);

  const mesh: Mesh = { positions, triangleCount: t, bodyOfTriangle, bodyNames: keptNames };
  return { mesh, bodies, bodyNames: names, keptIndices };
}

/** Mean of the three bounding-box sides of every body, mm: the size the kernel's ratio mode uses. */
export function meanSideMm(result: OcctResult): number {
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (const m of result.meshes ?? []) {
    const p = m.attributes?.position?.array ?? [];
    for (let k = 0; k < p.length; k++) {
      const v = p[k]!;
      const a = k % 3;
      if (v < lo[a]!) lo[a] = v;
      if (v > hi[a]!) hi[a] = v;
    }
  }
  const s = (hi[0]! - lo[0]! + hi[1]! - lo[1]! + hi[2]! - lo[2]!) / 3;
  return Number.isFinite(s) ? s : 0;
}
