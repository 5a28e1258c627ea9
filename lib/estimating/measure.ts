import type { Mesh } from "./types";

/**
 * Measures of a triangle soup. Hot loops read the Float32Array directly and allocate nothing
 * per triangle; sums are float64.
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
export function volumeAndArea(p: Float32Array, n: number, origin: [number, number, number]): { volume: number; area: number } {
  const [ox, oy, oz] = origin;
  let v6 = 0, a2 = 0;
  for (let t = 0, b = 0; t < n; t++, b += 9) {
    const x1 = p[b]! - ox, y1 = p[b + 1]! - oy, z1 = p[b + 2]! - oz;
    const x2 = p[b + 3]! - ox, y2 = p[b + 4]! - oy, z2 = p[b + 5]! - oz;
    const x3 = p[b + 6]! - ox, y3 = p[b + 7]! - oy, z3 = p[b + 8]! - oz;
    v6 += x1 * (y2 * z3 - z2 * y3) - y1 * (x2 * z3 - z2 * x3) + z1 * (x2 * y3 - y2 * x3);
    const ux = x2 - x1, uy = y2 - y1, uz = z2 - z1, vx = x3 - x1, vy = y3 - y1, vz = z3 - z1;
    const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
    a2 += Math.sqrt(cx * cx + cy * cy + cz * cz);
  }
  return { volume: v6 / 6, area: a2 / 2 };
}

export interface Welded {
  /** Welded vertex index of each of the 3n corners. */
  corner: Uint32Array;
  vertexCount: number;
  toleranceMm: number;
}

/** Smallest power of two ≥ v (v ≥ 1). */
function pow2AtLeast(v: number): number {
  let s = 16;
  while (s < v) s *= 2;
  return s;
}

/**
 * Welds corners whose coordinates lie within `tol` (per axis) of each other, in two steps:
 * 1. a corner whose float32 coordinates are bit for bit those of an earlier corner (the usual
 *    case in STL: every vertex is written once per triangle around it) takes that corner's
 *    vertex, found in an open-addressing table keyed on the raw bits;
 * 2. a new coordinate triple is looked up in a spatial hash on cells of size 16·tol: a neighbour
 *    within tol lies in its own cell or, on an axis where the point is within tol of its cell's
 *    side, the cell across that side; so one cell is probed for most points (8 at most, near a
 *    cell's corner); none within tol makes a new vertex.
 * Memory beside the 3n corner indices: two tables sized to the vertices (about n/2 for a
 * closed mesh), not to the corners; nothing is allocated per corner.
 */
export function weld(p: Float32Array, n: number, tol: number): Welded {
  const refs = n * 3;
  const bits = new Int32Array(p.buffer, p.byteOffset, refs * 3);
  const corner = new Uint32Array(refs);
  // step 1 table: slot → 1 + a corner holding that bit pattern (0 = empty); grows at half full
  let exactSize = pow2AtLeast(n);
  let exact = new Int32Array(exactSize);
  let exactMask = exactSize - 1, exactUsed = 0;
  const exactSlot = (c: number, table: Int32Array, mask: number): number => {
    const b = c * 3;
    const x = bits[b]!, y = bits[b + 1]!, z = bits[b + 2]!;
    let h = (Math.imul(x, 0x9e3779b1) ^ Math.imul(y, 0x85ebca77) ^ Math.imul(z, 0xc2b2ae3d)) >>> 0;
    h = (h ^ (h >>> 15)) & mask;
    for (;;) {
      const e = table[h]!;
      if (e === 0) return h;
      const o = (e - 1) * 3;
      if (bits[o] === x && bits[o + 1] === y && bits[o + 2] === z) return h;
      h = (h + 1) & mask;
    }
  };
  // step 2: chained spatial hash over vertices; rep = a vertex's first corner
  const cellSize = pow2AtLeast(Math.max(16, n >> 1));
  const cellMask = cellSize - 1;
  const heads = new Int32Array(cellSize).fill(-1);
  let cap = Math.max(1024, n);
  let rep = new Uint32Array(cap);
  let next = new Int32Array(cap);
  const inv = 1 / (16 * tol);
  const near = 1 / 16; // tol in cell units
  let count = 0;
  for (let r = 0; r < refs; r++) {
    const slot = exactSlot(r, exact, exactMask);
    const seen = exact[slot]!;
    if (seen !== 0) { corner[r] = corner[seen - 1]!; continue; }
    exact[slot] = r + 1;
    if (++exactUsed * 2 > exactSize) {
      const bigger = new Int32Array(exactSize * 2);
      const mask = exactSize * 2 - 1;
      for (let i = 0; i < exactSize; i++) { const e = exact[i]!; if (e !== 0) bigger[exactSlot(e - 1, bigger, mask)] = e; }
      exact = bigger; exactSize *= 2; exactMask = mask;
    }
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
      if (count === cap) {
        cap = Math.min(refs, cap * 2);
        const r2 = new Uint32Array(cap); r2.set(rep); rep = r2;
        const n2 = new Int32Array(cap); n2.set(next); next = n2;
      }
      found = count++;
      rep[found] = r;
      next[found] = heads[own]!;
      heads[own] = found;
    }
    corner[r] = found;
  }
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
export function topology(p: Float32Array, n: number, w: Welded): Topology {
  const { corner, vertexCount: nv } = w;
  // start[v] counts v's triangles, then (prefix sums) the end of its run in `star`; filling
  // each run backwards leaves start[v] at its beginning, so no second offsets array is needed
  const start = new Uint32Array(nv + 1);
  let degenerate = 0;
  for (let t = 0; t < n; t++) {
    const a = corner[t * 3]!, b = corner[t * 3 + 1]!, c = corner[t * 3 + 2]!;
    if (a === b || b === c || c === a) { degenerate++; continue; }
    start[a]!++; start[b]!++; start[c]!++;
  }
  for (let v = 1; v < nv; v++) start[v] = start[v]! + start[v - 1]!;
  start[nv] = nv > 0 ? start[nv - 1]! : 0;
  const star = new Uint32Array(start[nv]!);
  for (let t = n - 1; t >= 0; t--) {
    const a = corner[t * 3]!, b = corner[t * 3 + 1]!, c = corner[t * 3 + 2]!;
    if (a === b || b === c || c === a) continue;
    star[--start[a]!] = t; star[--start[b]!] = t; star[--start[c]!] = t;
  }
  // union-find over vertices for shells
  const parent = new Int32Array(nv);
  for (let v = 0; v < nv; v++) parent[v] = v;
  const find = (v: number): number => {
    while (parent[v] !== v) { const g = parent[parent[v]!]!; parent[v] = g; v = g; }
    return v;
  };

  let open = 0, nonManifold = 0, inconsistent = 0, m2 = 0;
  for (let t = 0; t < n; t++) {
    const t3 = t * 3;
    const c0 = corner[t3]!, c1 = corner[t3 + 1]!, c2 = corner[t3 + 2]!;
    if (c0 === c1 || c1 === c2 || c2 === c0) continue;
    const r0 = find(c0), r1 = find(c1), r2 = find(c2);
    if (r0 !== r1) parent[r1] = r0;
    const r0b = find(r0);
    if (r0b !== r2) parent[r2] = r0b;
    for (let e = 0; e < 3; e++) {
      const u = corner[t3 + e]!, v = corner[t3 + (e === 2 ? 0 : e + 1)]!;
      const a = u < v ? u : v, b = u < v ? v : u;
      let uses = 0, lowest = t, other = -1;
      for (let k = start[a]!, end = start[a + 1]!; k < end; k++) {
        const s = star[k]!;
        const s3 = s * 3;
        const d0 = corner[s3]!, d1 = corner[s3 + 1]!, d2 = corner[s3 + 2]!;
        if (d0 !== b && d1 !== b && d2 !== b) continue;
        uses++;
        if (s < lowest) lowest = s;
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
      const tb = t * 9, sb = other * 9;
      // normal of t
      let ax = p[tb + 3]! - p[tb]!, ay = p[tb + 4]! - p[tb + 1]!, az = p[tb + 5]! - p[tb + 2]!;
      let bx = p[tb + 6]! - p[tb]!, by = p[tb + 7]! - p[tb + 1]!, bz = p[tb + 8]! - p[tb + 2]!;
      const n1x = ay * bz - az * by, n1y = az * bx - ax * bz, n1z = ax * by - ay * bx;
      ax = p[sb + 3]! - p[sb]!; ay = p[sb + 4]! - p[sb + 1]!; az = p[sb + 5]! - p[sb + 2]!;
      bx = p[sb + 6]! - p[sb]!; by = p[sb + 7]! - p[sb + 1]!; bz = p[sb + 8]! - p[sb + 2]!;
      let n2x = ay * bz - az * by, n2y = az * bx - ax * bz, n2z = ax * by - ay * bx;
      if (same) { n2x = -n2x; n2y = -n2y; n2z = -n2z; }
      // edge u→v as t runs it
      const ub = (t3 + e) * 3, vb = (t3 + (e === 2 ? 0 : e + 1)) * 3;
      const ex = p[vb]! - p[ub]!, ey = p[vb + 1]! - p[ub + 1]!, ez = p[vb + 2]! - p[ub + 2]!;
      const len = Math.sqrt(ex * ex + ey * ey + ez * ez);
      const cx = n1y * n2z - n1z * n2y, cy = n1z * n2x - n1x * n2z, cz = n1x * n2y - n1y * n2x;
      // exterior angle: positive where the edge is convex ((n1 × n2) · e > 0)
      const theta = Math.atan2((cx * ex + cy * ey + cz * ez), (n1x * n2x + n1y * n2y + n1z * n2z) * len);
      m2 += len * theta;
    }
  }
  let shells = 0;
  for (let v = 0; v < nv; v++) if (start[v + 1]! > start[v]! && find(v) === v) shells++;
  return { openEdges: open, nonManifoldEdges: nonManifold, inconsistentEdges: inconsistent, degenerateTriangles: degenerate, shells, meanCurvatureIntegral: m2 / 2 };
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
export function measure(mesh: Mesh, opts: { weldToleranceMm?: number } = {}): Measures {
  const p = mesh.positions, n = mesh.triangleCount;
  const bb = bounds(p);
  const diag = Math.hypot(bb.max[0] - bb.min[0], bb.max[1] - bb.min[1], bb.max[2] - bb.min[2]);
  const centre: [number, number, number] = [(bb.min[0] + bb.max[0]) / 2, (bb.min[1] + bb.max[1]) / 2, (bb.min[2] + bb.max[2]) / 2];
  const { volume, area } = volumeAndArea(p, n, centre);
  const tol = opts.weldToleranceMm ?? Math.max(diag * 1e-6, 1e-9);
  const w = weld(p, n, tol);
  const topo = topology(p, n, w);
  const watertight = topo.openEdges === 0 && topo.nonManifoldEdges === 0 && topo.inconsistentEdges === 0 && topo.degenerateTriangles < n;
  return { ...topo, triangles: n, bounds: bb, volumeMm3: volume, areaMm2: area, watertight, weldToleranceMm: tol, vertices: w.vertexCount };
}
