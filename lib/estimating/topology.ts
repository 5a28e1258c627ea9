import type { IndexedMesh } from "./indexed";
import type { Welded } from "./measure";
import { workArena } from "./work-arena";

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
