import { pow2AtLeast, toIndexed, type IndexedMesh } from "./indexed";
import { workArena } from "./work-arena";
import type { Mesh } from "./types";
import { topology, type Topology } from "./topology";

/**
 * Measures of a triangle mesh, taken over its indexed form (./indexed: the soup's distinct
 * corners and three indices a triangle, so every value equals the one taken over the soup).
 * Hot loops read the typed arrays directly and allocate nothing per triangle; sums are float64.
 */

export interface Bounds { min: [number, number, number]; max: [number, number, number] }

export function bounds(p: Float32Array): Bounds {
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  for (let i = 0; i < p.length; i += 3) {
    const x = p[i]!, y = p[i + 1]!, z = p[i + 2]!;
    if (x < x0) x0 = x; if (x > x1) x1 = x;
    if (y < y0) y0 = y; if (y > y1) y1 = y;
    if (z < z0) z0 = z; if (z > z1) z1 = z;
  }
  return { min: [x0, y0, z0], max: [x1, y1, z1] };
}

/**
 * Volume by the divergence theorem, V = Σ p1·(p2 × p3) / 6 (Zhang & Chen, ICIP 2001),
 * negative when the mesh is inside out; and surface area Σ ½|(p2−p1)×(p3−p1)|.
 * Coordinates are taken relative to `origin` (the box centre) so large offsets lose no precision.
 */
export function volumeAndArea(m: IndexedMesh, origin: [number, number, number]): { volume: number; area: number } {
  const [ox, oy, oz] = origin;
  const p = m.vertices, ix = m.indices, n = m.triangleCount;
  let v6 = 0, a2 = 0;
  for (let t = 0, i = 0; t < n; t++, i += 3) {
    const b1 = ix[i]! * 3, b2 = ix[i + 1]! * 3, b3 = ix[i + 2]! * 3;
    const x1 = p[b1]! - ox, y1 = p[b1 + 1]! - oy, z1 = p[b1 + 2]! - oz;
    const x2 = p[b2]! - ox, y2 = p[b2 + 1]! - oy, z2 = p[b2 + 2]! - oz;
    const x3 = p[b3]! - ox, y3 = p[b3 + 1]! - oy, z3 = p[b3 + 2]! - oz;
    v6 += x1 * (y2 * z3 - z2 * y3) - y1 * (x2 * z3 - z2 * x3) + z1 * (x2 * y3 - y2 * x3);
    const ux = x2 - x1, uy = y2 - y1, uz = z2 - z1, vx = x3 - x1, vy = y3 - y1, vz = z3 - z1;
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    a2 += Math.sqrt(cx * cx + cy * cy + cz * cz);
  }
  return { volume: v6 / 6, area: a2 / 2 };
}

export interface Welded {
  /** Welded vertex index of each of the 3n corners (the mesh's own indices when nothing welded). */
  corner: Uint32Array;
  vertexCount: number;
  toleranceMm: number;
}

/**
 * Welds vertices whose coordinates lie within `tol` (per axis) of each other. Corners with the
 * same bits already share a vertex in the indexed mesh (the usual case in STL: every vertex is
 * written once per triangle around it), so only its distinct vertices are looked up, in order,
 * in a spatial hash on cells of size 16·tol: a neighbour within tol lies in the vertex's own cell
 * or, on an axis where the point is within tol of its cell's side, the cell across that side; so
 * one cell is probed for most points (8 at most, near a cell's corner); none within tol makes a
 * new welded vertex, represented by the first vertex of its kind. Memory: a few arrays sized to
 * the vertices; the corners get an array of their own only when some vertices did weld.
 */
export function weld(m: IndexedMesh, tol: number): Welded {
  const p = m.vertices, nv = m.vertexCount;
  // as many buckets as half the triangles (about one per vertex): which neighbour is met first
  // among several within tol depends on the bucket count, so it stays what it has always been
  const cellSize = pow2AtLeast(Math.max(16, m.triangleCount >> 1));
  const cellMask = cellSize - 1;
  // work arrays from the mesh's arena (every slot read is written first; heads filled here)
  const [heads, rep, next, to] = workArena(m).int32(cellSize, nv, nv, nv) as [Int32Array, Int32Array, Int32Array, Int32Array];
  heads.fill(-1);
  const inv = 1 / (16 * tol);
  const near = 1 / 16; // tol in cell units
  let count = 0;
  for (let r = 0; r < nv; r++) {
    const b = r * 3;
    const x = p[b]!, y = p[b + 1]!, z = p[b + 2]!;
    const fx = x * inv, fy = y * inv, fz = z * inv;
    const ix = Math.floor(fx), iy = Math.floor(fy), iz = Math.floor(fz);
    // the side cell to probe on each axis (0: the point is farther than tol from both sides)
    const dx = fx - ix, dy = fy - iy, dz = fz - iz;
    const sx = dx <= near ? -1 : dx >= 1 - near ? 1 : 0, sy = dy <= near ? -1 : dy >= 1 - near ? 1 : 0, sz = dz <= near ? -1 : dz >= 1 - near ? 1 : 0;
    const probes = (sx === 0 ? 0 : 1) | (sy === 0 ? 0 : 2) | (sz === 0 ? 0 : 4);
    let found = -1;
    const own = (Math.imul(ix | 0, 73856093) ^ Math.imul(iy | 0, 19349663) ^ Math.imul(iz | 0, 83492791)) & cellMask;
    for (let probe = 0; probe < 8 && found < 0; probe++) {
      if ((probe & probes) !== probe) continue;
      const h = probe === 0 ? own
        : (Math.imul((ix + (probe & 1 ? sx : 0)) | 0, 73856093) ^ Math.imul((iy + (probe & 2 ? sy : 0)) | 0, 19349663) ^ Math.imul((iz + (probe & 4 ? sz : 0)) | 0, 83492791)) & cellMask;
      for (let v = heads[h]!; v >= 0; v = next[v]!) {
        const c = rep[v]! * 3;
        if (Math.abs(p[c]! - x) <= tol && Math.abs(p[c + 1]! - y) <= tol && Math.abs(p[c + 2]! - z) <= tol) { found = v; break; }
      }
    }
    if (found < 0) {
      found = count++;
      rep[found] = r;
      next[found] = heads[own]!;
      heads[own] = found;
    }
    to[r] = found;
  }
  // vertices are numbered in order of first use, so nothing welded ⇔ every vertex is its own
  if (count === nv) return { corner: m.indices, vertexCount: count, toleranceMm: tol };
  const ix = m.indices, corner = new Uint32Array(ix.length);
  for (let i = 0; i < ix.length; i++) corner[i] = to[ix[i]!]!;
  return { corner, vertexCount: count, toleranceMm: tol };
}

export interface Measures extends Topology {
  triangles: number;
  bounds: Bounds;
  volumeMm3: number;
  areaMm2: number;
  watertight: boolean;
  weldToleranceMm: number;
  vertices: number;
}

/**
 * All measures of a mesh in millimetres. The welding tolerance defaults to 1e-6 of the box
 * diagonal: above float32 rounding of coordinates (≈1.2e-7 relative), below any real feature.
 */
export function measure(mesh: Mesh | IndexedMesh, opts: { weldToleranceMm?: number; bounds?: Bounds } = {}): Measures {
  const m = toIndexed(mesh), n = m.triangleCount;
  // the box, when the caller took it already (`bounds` of the same vertices)
  const bb = opts.bounds ?? bounds(m.vertices);
  const diag = Math.hypot(bb.max[0] - bb.min[0], bb.max[1] - bb.min[1], bb.max[2] - bb.min[2]);
  const centre: [number, number, number] = [(bb.min[0] + bb.max[0]) / 2, (bb.min[1] + bb.max[1]) / 2, (bb.min[2] + bb.max[2]) / 2];
  const { volume, area } = volumeAndArea(m, centre);
  const tol = opts.weldToleranceMm ?? Math.max(diag * 1e-6, 1e-9);
  const w = weld(m, tol);
  const topo = topology(m, w);
  const watertight = topo.openEdges === 0 && topo.nonManifoldEdges === 0 && topo.inconsistentEdges === 0 && topo.degenerateTriangles < n;
  return { ...topo, triangles: n, bounds: bb, volumeMm3: volume, areaMm2: area, watertight, weldToleranceMm: tol, vertices: w.vertexCount };
}
