import { pow2AtLeast, toIndexed, workArena, type IndexedMesh } from "./indexed";
import type { Mesh } from "./types";

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

export interface Topology {
  openEdges: number;
  nonManifoldEdges: number;
  /** Edges shared by two triangles that run it the same way (one of them is flipped). */
  inconsistentEdges: number;
  degenerateTriangles: number;
  shells: number;
  /** M = ½ Σ edge length × signed exterior dihedral angle (positive convex, negative concave), mm. */
  meanCurvatureIntegral: number;
}

/**
 * Edge use and dihedral angles from the welded corners. Each vertex keeps the list of its
 * triangles (compressed rows), so an edge's triangles are found among the few around one end;
 * an edge is handled once, by its lowest-numbered triangle.
 */
export function topology(m: IndexedMesh, w: Welded): Topology {
  const { corner, vertexCount: nv } = w;
  const n = m.triangleCount;
  // start[v] counts v's triangles, then (prefix sums) the end of its run in `star`; filling
  // each run backwards leaves start[v] at its beginning, so no second offsets array is needed.
  // Each long loop is a function of its own: a one-off run of a long loop is optimized while it
  // runs, and code after it in the same function would be compiled before it ever ran.
  const [start, star, parent] = workArena(m).int32(nv + 1, 3 * n, nv) as [Int32Array, Int32Array, Int32Array];
  const degenerate = countStars(corner, n, start);
  runEnds(start, nv);
  fillStars(corner, n, start, star);
  // union-find over vertices for shells
  for (let v = 0; v < nv; v++) parent[v] = v;
  const edges = edgeUse(m.vertices, m.indices, corner, n, start, star, parent);
  const shells = countShells(start, parent, nv);
  return { openEdges: edges.openEdges, nonManifoldEdges: edges.nonManifoldEdges, inconsistentEdges: edges.inconsistentEdges, degenerateTriangles: degenerate, shells, meanCurvatureIntegral: edges.meanCurvatureIntegral };
}

/** Each vertex's count of (non-degenerate) triangles in start[v]; the count of degenerate ones returned. */
function countStars(corner: Uint32Array, n: number, start: Int32Array): number {
  start.fill(0);
  let degenerate = 0;
  for (let t = 0; t < n; t++) {
    const a = corner[t * 3]!, b = corner[t * 3 + 1]!, c = corner[t * 3 + 2]!;
    if (a === b || b === c || c === a) { degenerate++; continue; }
    start[a]!++; start[b]!++; start[c]!++;
  }
  return degenerate;
}

/** Counts to prefix sums: start[v] the end of v's run, start[nv] the total. */
function runEnds(start: Int32Array, nv: number): void {
  for (let v = 1; v < nv; v++) start[v] = start[v]! + start[v - 1]!;
  start[nv] = nv > 0 ? start[nv - 1]! : 0;
}

/** The sets of the union-find that hold a vertex in use. */
function countShells(start: Int32Array, parent: Int32Array, nv: number): number {
  let shells = 0;
  for (let v = 0; v < nv; v++) if (start[v + 1]! > start[v]! && root(parent, v) === v) shells++;
  return shells;
}

/** Each vertex's triangles into its run of `star`, in ascending order (start[v] ends at the run's beginning). */
function fillStars(corner: Uint32Array, n: number, start: Int32Array, star: Int32Array): void {
  for (let t = n - 1; t >= 0; t--) {
    const a = corner[t * 3]!, b = corner[t * 3 + 1]!, c = corner[t * 3 + 2]!;
    if (a === b || b === c || c === a) continue;
    star[--start[a]!] = t; star[--start[b]!] = t; star[--start[c]!] = t;
  }
}

/** The root of v's set (union-find, halving the path as it goes). */
function root(parent: Int32Array, v: number): number {
  while (parent[v] !== v) { const g = parent[parent[v]!]!; parent[v] = g; v = g; }
  return v;
}

/** Every edge once (by its lowest triangle): open, non-manifold, inconsistent, and the mean curvature; shells joined in `parent`. */
function edgeUse(p: Float32Array, ix: Uint32Array, corner: Uint32Array, n: number, start: Int32Array, star: Int32Array, parent: Int32Array): Omit<Topology, "degenerateTriangles" | "shells"> {
  let open = 0, nonManifold = 0, inconsistent = 0, m2 = 0;
  for (let t = 0; t < n; t++) {
    const t3 = t * 3;
    const c0 = corner[t3]!, c1 = corner[t3 + 1]!, c2 = corner[t3 + 2]!;
    if (c0 === c1 || c1 === c2 || c2 === c0) continue;
    const r0 = root(parent, c0), r1 = root(parent, c1), r2 = root(parent, c2);
    if (r0 !== r1) parent[r1] = r0;
    const r0b = root(parent, r0);
    if (r0b !== r2) parent[r2] = r0b;
    for (let e = 0; e < 3; e++) {
      const u = corner[t3 + e]!, v = corner[t3 + (e === 2 ? 0 : e + 1)]!;
      // the edge's triangles are those of its end with fewer triangles that hold the other end;
      // a vertex's triangles run in ascending order, so the first one found is the edge's lowest:
      // when it is not t, an earlier triangle handled the edge and the scan stops there
      const a = start[u + 1]! - start[u]! <= start[v + 1]! - start[v]! ? u : v, b = a === u ? v : u;
      let uses = 0, lowest = t, other = -1;
      for (let k = start[a]!, end = start[a + 1]!; k < end; k++) {
        const s = star[k]!;
        const s3 = s * 3;
        const d0 = corner[s3]!, d1 = corner[s3 + 1]!, d2 = corner[s3 + 2]!;
        if (d0 !== b && d1 !== b && d2 !== b) continue;
        if (uses === 0 && s < t) { lowest = s; break; }
        uses++;
        if (s !== t) other = s;
      }
      if (lowest !== t) continue;
      if (uses === 1) { open++; continue; }
      if (uses > 2) { nonManifold++; continue; }
      // two triangles: orientation and signed dihedral angle
      const s3 = other * 3;
      const d0 = corner[s3]!, d1 = corner[s3 + 1]!, d2 = corner[s3 + 2]!;
      const same = (d0 === u && d1 === v) || (d1 === u && d2 === v) || (d2 === u && d0 === v);
      if (same) inconsistent++;
      // normal of t (the corners' own coordinates: the mesh's vertices, not the welded ones)
      const t0 = ix[t3]! * 3, t1 = ix[t3 + 1]! * 3, t2 = ix[t3 + 2]! * 3;
      let ax = p[t1]! - p[t0]!, ay = p[t1 + 1]! - p[t0 + 1]!, az = p[t1 + 2]! - p[t0 + 2]!;
      let bx = p[t2]! - p[t0]!, by = p[t2 + 1]! - p[t0 + 1]!, bz = p[t2 + 2]! - p[t0 + 2]!;
      const n1x = ay * bz - az * by, n1y = az * bx - ax * bz, n1z = ax * by - ay * bx;
      const s0 = ix[s3]! * 3, s1 = ix[s3 + 1]! * 3, s2 = ix[s3 + 2]! * 3;
      ax = p[s1]! - p[s0]!; ay = p[s1 + 1]! - p[s0 + 1]!; az = p[s1 + 2]! - p[s0 + 2]!;
      bx = p[s2]! - p[s0]!; by = p[s2 + 1]! - p[s0 + 1]!; bz = p[s2 + 2]! - p[s0 + 2]!;
      let n2x = ay * bz - az * by, n2y = az * bx - ax * bz, n2z = ax * by - ay * bx;
      if (same) { n2x = -n2x; n2y = -n2y; n2z = -n2z; }
      // edge u→v as t runs it
      const ub = e === 0 ? t0 : e === 1 ? t1 : t2, vb = e === 0 ? t1 : e === 1 ? t2 : t0;
      const ex = p[vb]! - p[ub]!, ey = p[vb + 1]! - p[ub + 1]!, ez = p[vb + 2]! - p[ub + 2]!;
      const len = Math.sqrt(ex * ex + ey * ey + ez * ez);
      const cx = n1y * n2z - n1z * n2y, cy = n1z * n2x - n1x * n2z, cz = n1x * n2y - n1y * n2x;
      // exterior angle: positive where the edge is convex ((n1 × n2) · e > 0)
      const theta = Math.atan2((cx * ex + cy * ey + cz * ez), (n1x * n2x + n1y * n2y + n1z * n2z) * len);
      m2 += len * theta;
    }
  }
  return { openEdges: open, nonManifoldEdges: nonManifold, inconsistentEdges: inconsistent, meanCurvatureIntegral: m2 / 2 };
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
