import { toIndexed, type IndexedMesh } from "./indexed";
import { workArena } from "./work-arena";
import type { Mesh } from "./types";

/**
 * Cross-sections of a triangle mesh at the planes z_k = z0 + (k + ½)·h, by a sweep: triangles
 * are bucketed by the first plane they reach (a counting sort on the layer index, O(n)), enter
 * an active list there and leave it after their last plane, so each triangle is cut only at the
 * planes it spans — never every triangle against every layer.
 *
 * Each cut gives one segment, directed by ẑ × n (solid on its left), so the section area is the
 * sum of the segments' shoelace terms and the contour length the sum of their lengths, with no
 * need to chain segments into loops. Exact for a closed, consistently wound mesh.
 */
export interface Sections {
  z0: number;
  layerHeight: number;
  count: number;
  /** Section area at each plane, mm². */
  area: Float64Array;
  /** Contour length at each plane, mm. */
  perimeter: Float64Array;
  /** Cut segments at each plane (the section's contour is made of this many straight pieces). */
  segments: Uint32Array;
}

/**
 * Which coordinates play plan-a, plan-b and height for each up axis: a cyclic permutation, so
 * the frame is a proper rotation (windings and areas keep their sign) and no rotated copy of the
 * triangles is needed.
 */
const AXIS_OFFSETS = { z: [0, 1, 2], y: [2, 0, 1], x: [1, 2, 0] } as const;
/** Words of an active-list entry. */
const ENTRY = 6;

/** Where a slicing writes its sections (arrays of `count`), and whom it tells of each plane done. */
export interface SliceInto {
  area: Float64Array;
  perimeter: Float64Array;
  segments: Uint32Array;
  /** Called after each plane k with k + 1 planes done. */
  progress?: (done: number) => void;
}

export function slice(mesh: Mesh | IndexedMesh, z0: number, h: number, count: number, up: "x" | "y" | "z" = "z", into?: SliceInto): Sections {
  const m = toIndexed(mesh);
  const p = m.vertices, ix = m.indices, n = m.triangleCount;
  const [ia, ib, ic] = AXIS_OFFSETS[up];
  const area = into?.area ?? new Float64Array(count);
  const perimeter = into?.perimeter ?? new Float64Array(count);
  const segments = into?.segments ?? new Uint32Array(count);
  // the sweep order of the triangles, from the mesh's arena (a word a triangle), so a second and
  // third axis reuse the first's memory
  const [order] = workArena(m).int32(n) as [Int32Array];
  // Two passes over the triangles: count each first plane, then place each triangle in its
  // plane's run (in file order within a run). Each pass is a function of its own, as is the
  // sweep: a one-off run of a long loop is optimized while it runs, and code after it in the same
  // function would be compiled before it ever ran, then thrown away when it does.
  const bucket = new Uint32Array(count + 1);
  const live = new Int32Array(count + 1);
  countFirstPlanes(p, ix, n, ic, z0, h, count, bucket, live);
  // bucket[k]: where plane k's run starts; `most`: the largest active list the sweep will hold
  let most = 0;
  for (let k = 0, alive = 0; k < count; k++) {
    bucket[k + 1] = bucket[k + 1]! + bucket[k]!;
    alive += live[k]!;
    if (alive > most) most = alive;
  }
  placeInSweepOrder(p, ix, n, ic, z0, h, count, bucket.slice(0, count), order);
  // x–y origin for the shoelace sums (precision): the first corner
  const ox = n > 0 ? p[ix[0]! * 3 + ia]! : 0, oy = n > 0 ? p[ix[0]! * 3 + ib]! : 0;
  sweep(p, ix, order, bucket, count, most, ia, ib, ic, ox, oy, z0, h, area, perimeter, segments, into?.progress);
  return { z0, layerHeight: h, count, area, perimeter, segments };
}

/**
 * The planes a triangle's corners span: a corner on a plane counts as above it (d >= 0 in the
 * sweep), so the triangle is cut by the planes with lo < z_k <= hi; one plane of slack each side
 * absorbs rounding of the index, the sweep's exact side test decides. The same arithmetic in
 * both passes and the sweep, so the same indices come out of the same heights.
 */
const firstPlane = (lo: number, z0: number, h: number) => Math.floor((lo - z0) / h - 0.5);
const lastPlane = (hi: number, z0: number, h: number) => Math.floor((hi - z0) / h - 0.5) + 1;

/**
 * Pass 1: how many triangles first reach each plane (bucket[k + 1]), and in `live` the change in
 * the active list's length at each plane (an entry is held from its first plane to the one after
 * its last, where it is dropped).
 */
function countFirstPlanes(p: Float32Array, ix: Uint32Array, n: number, ic: number, z0: number, h: number, count: number, bucket: Uint32Array, live: Int32Array): void {
  for (let t = 0, i = 0; t < n; t++, i += 3) {
    const za = p[ix[i]! * 3 + ic]!, zb = p[ix[i + 1]! * 3 + ic]!, zc = p[ix[i + 2]! * 3 + ic]!;
    const lo = za < zb ? (za < zc ? za : zc) : (zb < zc ? zb : zc);
    const hi = za > zb ? (za > zc ? za : zc) : (zb > zc ? zb : zc);
    let k0 = firstPlane(lo, z0, h), k1 = lastPlane(hi, z0, h);
    if (k0 < 0) k0 = 0;
    if (k1 > count - 1) k1 = count - 1;
    if (k1 < k0) continue;
    bucket[k0 + 1]!++;
    live[k0]!++;
    live[k1 + 2 < count ? k1 + 2 : count]!--;
  }
}

/** Pass 2: each triangle placed in its first plane's run (`fill[k]`: the run's next place). */
function placeInSweepOrder(p: Float32Array, ix: Uint32Array, n: number, ic: number, z0: number, h: number, count: number, fill: Uint32Array, order: Int32Array): void {
  for (let t = 0, i = 0; t < n; t++, i += 3) {
    const za = p[ix[i]! * 3 + ic]!, zb = p[ix[i + 1]! * 3 + ic]!, zc = p[ix[i + 2]! * 3 + ic]!;
    const lo = za < zb ? (za < zc ? za : zc) : (zb < zc ? zb : zc);
    const hi = za > zb ? (za > zc ? za : zc) : (zb > zc ? zb : zc);
    let k0 = firstPlane(lo, z0, h), k1 = lastPlane(hi, z0, h);
    if (k0 < 0) k0 = 0;
    if (k1 > count - 1) k1 = count - 1;
    if (k1 < k0) continue;
    order[fill[k0]!++] = t;
  }
}

/**
 * The sweep, plane by plane. The active list holds the triangles that reach the plane, ENTRY
 * words each (its last plane, its lowest and highest height, float32 as the file gives them, and
 * its three vertices), filled when the sweep reaches its first plane, so the sweep reads it in
 * one run rather than all over the mesh, and passes over a plane the triangle does not reach
 * without reading its corners (cut ⇔ lo < z_k ≤ hi, the side test's own rule). Leaving, an entry
 * is replaced by the list's last. Sized for the longest the list gets (`most` entries).
 */
function sweep(
  p: Float32Array, ix: Uint32Array, order: Int32Array, bucket: Uint32Array, count: number, most: number,
  ia: number, ib: number, ic: number, ox: number, oy: number, z0: number, h: number,
  area: Float64Array, perimeter: Float64Array, segments: Uint32Array, progress: ((done: number) => void) | undefined,
): void {
  const active = new Int32Array(Math.max(1, most) * ENTRY);
  const activeF = new Float32Array(active.buffer);
  let na = 0;
  for (let k = 0; k < count; k++) {
    for (let at = bucket[k]!, e = bucket[k + 1]!; at < e; at++) {
      const o = na++ * ENTRY, t3 = order[at]! * 3;
      const b1 = ix[t3]! * 3, b2 = ix[t3 + 1]! * 3, b3 = ix[t3 + 2]! * 3;
      const za = p[b1 + ic]!, zb = p[b2 + ic]!, zc = p[b3 + ic]!;
      const lo = za < zb ? (za < zc ? za : zc) : (zb < zc ? zb : zc);
      const hi = za > zb ? (za > zc ? za : zc) : (zb > zc ? zb : zc);
      active[o] = lastPlane(hi, z0, h);
      activeF[o + 1] = lo; activeF[o + 2] = hi;
      active[o + 3] = b1; active[o + 4] = b2; active[o + 5] = b3;
    }
    const zp = z0 + (k + 0.5) * h;
    let a2 = 0, per = 0, cuts = 0;
    for (let i = 0; i < na; ) {
      const o = i * ENTRY;
      if (active[o]! < k) {
        const l = --na * ENTRY;
        for (let w = 0; w < ENTRY; w++) active[o + w] = active[l + w]!;
        continue;
      }
      i++;
      if (!(activeF[o + 1]! < zp && activeF[o + 2]! >= zp)) continue;
      const b1 = active[o + 3]!, b2 = active[o + 4]!, b3 = active[o + 5]!;
      const x1 = p[b1 + ia]! - ox, y1 = p[b1 + ib]! - oy, d1 = p[b1 + ic]! - zp;
      const x2 = p[b2 + ia]! - ox, y2 = p[b2 + ib]! - oy, d2 = p[b2 + ic]! - zp;
      const x3 = p[b3 + ia]! - ox, y3 = p[b3 + ib]! - oy, d3 = p[b3 + ic]! - zp;
      const u1 = d1 >= 0, u2 = d2 >= 0, u3 = d3 >= 0;
      // the two edges whose ends lie on opposite sides
      let px = 0, py = 0, qx = 0, qy = 0, got = 0;
      if (u1 !== u2) { const s = d1 / (d1 - d2); px = x1 + s * (x2 - x1); py = y1 + s * (y2 - y1); got = 1; }
      if (u2 !== u3) {
        const s = d2 / (d2 - d3); const x = x2 + s * (x3 - x2), y = y2 + s * (y3 - y2);
        if (got) { qx = x; qy = y; } else { px = x; py = y; } got++;
      }
      if (u3 !== u1 && got < 2) { const s = d3 / (d3 - d1); qx = x3 + s * (x1 - x3); qy = y3 + s * (y1 - y3); got++; }
      if (got < 2) continue;
      // direction ẑ × n = (−n_y, n_x); n from the winding
      const ex = x2 - x1, ey = y2 - y1, ez = d2 - d1, fx = x3 - x1, fy = y3 - y1, fz = d3 - d1;
      const nx = ey * fz - ez * fy, ny = ez * fx - ex * fz;
      let dx = qx - px, dy = qy - py;
      if (dx * -ny + dy * nx < 0) { const tx = px, ty = py; px = qx; py = qy; qx = tx; qy = ty; dx = -dx; dy = -dy; }
      a2 += px * qy - qx * py;
      per += Math.sqrt(dx * dx + dy * dy);
      cuts++;
    }
    area[k] = a2 / 2;
    perimeter[k] = per;
    segments[k] = cuts;
    if (progress) progress(k + 1);
  }
}
