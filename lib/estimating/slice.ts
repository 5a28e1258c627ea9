import { toIndexed, workArena, type IndexedMesh } from "./indexed";
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

export function slice(mesh: Mesh | IndexedMesh, z0: number, h: number, count: number, up: "x" | "y" | "z" = "z"): Sections {
  const m = toIndexed(mesh);
  const p = m.vertices, ix = m.indices, n = m.triangleCount;
  const [ia, ib, ic] = AXIS_OFFSETS[up];
  const area = new Float64Array(count);
  const perimeter = new Float64Array(count);
  const segments = new Uint32Array(count);
  // work arrays from the mesh's arena, so a second and third axis reuse the first's memory
  // (the active list holds places in `order`, whose last planes `lastAt` keeps in the same
  // order, so the sweep reads them from a few nearby runs rather than all over `last`)
  const [first, last, order, lastAt, active] = workArena(m).int32(n, n, n, n, n) as [Int32Array, Int32Array, Int32Array, Int32Array, Int32Array];
  const bucket = new Uint32Array(count + 1);
  // x–y origin for the shoelace sums (precision): the first corner
  let ox = 0, oy = 0;
  if (n > 0) { ox = p[ix[0]! * 3 + ia]!; oy = p[ix[0]! * 3 + ib]!; }
  for (let t = 0, i = 0; t < n; t++, i += 3) {
    const za = p[ix[i]! * 3 + ic]!, zb = p[ix[i + 1]! * 3 + ic]!, zc = p[ix[i + 2]! * 3 + ic]!;
    const lo = za < zb ? (za < zc ? za : zc) : (zb < zc ? zb : zc);
    const hi = za > zb ? (za > zc ? za : zc) : (zb > zc ? zb : zc);
    // A corner on a plane counts as above it (d >= 0 below), so the triangle is cut by the
    // planes with lo < z_k <= hi; one plane of slack each side absorbs rounding of the index,
    // the exact side test below decides.
    let k0 = Math.floor((lo - z0) / h - 0.5);
    let k1 = Math.floor((hi - z0) / h - 0.5) + 1;
    if (k0 < 0) k0 = 0;
    if (k1 > count - 1) k1 = count - 1;
    if (k1 < k0) { first[t] = -1; continue; }
    first[t] = k0; last[t] = k1;
    bucket[k0 + 1]!++;
  }
  for (let k = 0; k < count; k++) bucket[k + 1] = bucket[k + 1]! + bucket[k]!;
  const fill = bucket.slice(0, count);
  for (let t = 0; t < n; t++) { const k = first[t]!; if (k >= 0) { const at = fill[k]!++; order[at] = t; lastAt[at] = last[t]!; } }
  // `first` and `last` are done with: their memory now holds each entry's lowest and highest
  // height (float32, as the file gives them), in sweep order, so a plane the triangle does not
  // reach is passed over without reading its corners (cut ⇔ lo < z_k ≤ hi, the side test's own rule)
  const placed = bucket[count]!;
  const loAt = new Float32Array(first.buffer, first.byteOffset, n), hiAt = new Float32Array(last.buffer, last.byteOffset, n);
  for (let at = 0; at < placed; at++) {
    const i = order[at]! * 3;
    const za = p[ix[i]! * 3 + ic]!, zb = p[ix[i + 1]! * 3 + ic]!, zc = p[ix[i + 2]! * 3 + ic]!;
    loAt[at] = za < zb ? (za < zc ? za : zc) : (zb < zc ? zb : zc);
    hiAt[at] = za > zb ? (za > zc ? za : zc) : (zb > zc ? zb : zc);
  }

  let na = 0;
  for (let k = 0; k < count; k++) {
    for (let i = bucket[k]!, e = bucket[k + 1]!; i < e; i++) active[na++] = i;
    const zp = z0 + (k + 0.5) * h;
    let a2 = 0, per = 0, cuts = 0;
    for (let i = 0; i < na; ) {
      const at = active[i]!;
      if (lastAt[at]! < k) { active[i] = active[--na]!; continue; }
      i++;
      const zl = loAt[at]!, zh = hiAt[at]!;
      if (!(zl < zp && zh >= zp)) continue;
      const t = order[at]!;
      const b1 = ix[t * 3]! * 3, b2 = ix[t * 3 + 1]! * 3, b3 = ix[t * 3 + 2]! * 3;
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
  }
  return { z0, layerHeight: h, count, area, perimeter, segments };
}
