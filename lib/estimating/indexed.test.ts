import { describe, expect, it } from "vitest";
import { box, bracket, layupMold, merge, toMesh, torus, translate, uvSphere } from "../../mocks/fixtures/meshes";
import { indexSoup, scaleIndexed, toSoup, VertexIndexer } from "./indexed";
import { WorkArena } from "./work-arena";
import { measure, weld } from "./measure";
import type { Mesh } from "./types";

const bitsOf = (a: Float32Array) => Array.from(new Int32Array(a.buffer, a.byteOffset, a.length));

/** A soup whose corners are each moved a little (so no two corners share their bits), seeded. */
function jittered(s: Mesh, amount: number, seed = 7): Mesh {
  const p = s.positions.slice();
  for (let i = 0; i < p.length; i++) { seed = (seed * 1103515245 + 12345) % 2 ** 31; p[i] = p[i]! + ((seed / 2 ** 31) - 0.5) * amount; }
  return { positions: p, triangleCount: s.triangleCount };
}

/**
 * The weld as it ran over the triangle soup before the mesh was indexed (exact bits first, then
 * the spatial hash over new coordinates), kept here as the reference the indexed weld must equal.
 */
function soupWeld(p: Float32Array, n: number, tol: number): { corner: Uint32Array; vertexCount: number } {
  const refs = n * 3;
  const bits = new Int32Array(p.buffer, p.byteOffset, refs * 3);
  const corner = new Uint32Array(refs);
  const firstWith = new Map<string, number>();
  let cellSize = 16;
  while (cellSize < Math.max(16, n >> 1)) cellSize *= 2;
  const heads = new Int32Array(cellSize).fill(-1);
  const rep: number[] = [], next: number[] = [];
  const inv = 1 / (16 * tol), near = 1 / 16;
  const cell = (ix: number, iy: number, iz: number) => (Math.imul(ix | 0, 73856093) ^ Math.imul(iy | 0, 19349663) ^ Math.imul(iz | 0, 83492791)) & (cellSize - 1);
  for (let r = 0; r < refs; r++) {
    const key = `${bits[r * 3]},${bits[r * 3 + 1]},${bits[r * 3 + 2]}`;
    const seen = firstWith.get(key);
    if (seen !== undefined) { corner[r] = corner[seen]!; continue; }
    firstWith.set(key, r);
    const x = p[r * 3]!, y = p[r * 3 + 1]!, z = p[r * 3 + 2]!;
    const fx = x * inv, fy = y * inv, fz = z * inv;
    const ix = Math.floor(fx), iy = Math.floor(fy), iz = Math.floor(fz);
    const side = (d: number) => (d <= near ? -1 : d >= 1 - near ? 1 : 0);
    const sx = side(fx - ix), sy = side(fy - iy), sz = side(fz - iz);
    const probes = (sx === 0 ? 0 : 1) | (sy === 0 ? 0 : 2) | (sz === 0 ? 0 : 4);
    let found = -1;
    for (let probe = 0; probe < 8 && found < 0; probe++) {
      if ((probe & probes) !== probe) continue;
      const h = cell(ix + (probe & 1 ? sx : 0), iy + (probe & 2 ? sy : 0), iz + (probe & 4 ? sz : 0));
      for (let v = heads[h]!; v >= 0; v = next[v]!) {
        const c = rep[v]! * 3;
        if (Math.abs(p[c]! - x) <= tol && Math.abs(p[c + 1]! - y) <= tol && Math.abs(p[c + 2]! - z) <= tol) { found = v; break; }
      }
    }
    if (found < 0) {
      found = rep.length;
      const own = cell(ix, iy, iz);
      rep.push(r); next.push(heads[own]!); heads[own] = found;
    }
    corner[r] = found;
  }
  return { corner, vertexCount: rep.length };
}

describe("the indexed mesh (distinct corners and three indices a triangle)", () => {
  it("gives back the soup bit for bit, with vertices numbered in order of first use", () => {
    for (const soup of [toMesh(box(10, 20, 30)), toMesh(uvSphere(10)), toMesh(bracket()), jittered(toMesh(torus(20, 5)), 1e-4)]) {
      const m = indexSoup(soup);
      expect(bitsOf(toSoup(m).positions)).toEqual(bitsOf(soup.positions));
      let highest = -1;
      for (const v of m.indices) { expect(v).toBeLessThanOrEqual(highest + 1); highest = Math.max(highest, v); }
      expect(highest + 1).toBe(m.vertexCount);
      expect(m.vertices.length).toBe(m.vertexCount * 3);
    }
    // a closed box: 8 corners shared by 12 triangles
    expect(indexSoup(toMesh(box(10, 20, 30))).vertexCount).toBe(8);
  });

  it("tells −0 from +0, as a comparison of the coordinates' bits does", () => {
    const soup: Mesh = { positions: new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0, -0, 0, 0, 1, 0, 0, 0, 1, 0]), triangleCount: 2 };
    expect(indexSoup(soup).vertexCount).toBe(4);
  });

  it("is the same fed a chunk at a time (as the streaming reader does) as fed whole, past the table's growth", () => {
    const soup = toMesh(layupMold(60, 30));
    const whole = indexSoup(soup);
    const ix = new VertexIndexer(soup.triangleCount);
    const bits = new Int32Array(soup.positions.buffer);
    for (let t = 0; t < soup.triangleCount; t += 7) {
      const c = Math.min(7, soup.triangleCount - t);
      ix.add(soup.positions, bits, t * 9, c * 3);
    }
    const chunked = ix.finish();
    expect(chunked.vertexCount).toBe(whole.vertexCount);
    expect(Array.from(chunked.indices)).toEqual(Array.from(whole.indices));
    expect(bitsOf(chunked.vertices)).toEqual(bitsOf(whole.vertices));
    // a soup with no shared corner at all: the table grows from half the triangles to 3 vertices a triangle
    const apart = jittered(soup, 0.5);
    expect(indexSoup(apart).vertexCount).toBe(apart.triangleCount * 3);
    expect(() => ix.add(soup.positions, bits, 0, 3)).toThrow(RangeError);
  });

  it("scaled to millimetres, equals the indexing of the scaled soup, merging coordinates that round together", () => {
    // two float32 neighbours whose products by 25.4 round to the same float32
    const f = new Float32Array(2), u = new Uint32Array(f.buffer);
    f[0] = 1.9;
    for (u[1] = u[0]! + 1; Math.fround(f[0] * 25.4) !== Math.fround(f[1]! * 25.4); u[1] = u[1] + 1) u[0] = u[1]!;
    const a = f[0], b = f[1]!;
    expect(a).not.toBe(b);
    expect(Math.fround(a * 25.4)).toBe(Math.fround(b * 25.4));
    const soup: Mesh = {
      positions: new Float32Array([a, 0, 0, 3, 0, 0, 0, 3, 0, /**/ 0, 0, 5, b, 0, 0, 0, 3, 0, /**/ a, 1, 1, b, 0, 0, 3, 3, 3]),
      triangleCount: 3,
    };
    const scaledSoup = soup.positions.map((v) => v * 25.4);
    const expected = indexSoup({ positions: scaledSoup, triangleCount: 3 });
    const got = scaleIndexed(indexSoup(soup), 25.4);
    expect(got.vertexCount).toBe(expected.vertexCount);
    expect(got.vertexCount).toBe(indexSoup(soup).vertexCount - 1);
    expect(Array.from(got.indices)).toEqual(Array.from(expected.indices));
    expect(bitsOf(got.vertices)).toEqual(bitsOf(expected.vertices));
    // and on a real part: the scaled mesh rebuilds the scaled soup
    const sphere = toMesh(uvSphere(3));
    const scaled = scaleIndexed(indexSoup(sphere), 25.4);
    expect(bitsOf(toSoup(scaled).positions)).toEqual(bitsOf(sphere.positions.map((v) => v * 25.4)));
  });

  it("the work arena hands out arrays of the lengths asked, reusing its memory and growing when asked for more", () => {
    const arena = new WorkArena(10);
    const [a, b] = arena.int32(4, 6);
    expect([a!.length, b!.length]).toEqual([4, 6]);
    a!.fill(1); b!.fill(2);
    const [c] = arena.int32(10);
    expect(Array.from(c!)).toEqual([1, 1, 1, 1, 2, 2, 2, 2, 2, 2]); // the same memory, as the previous stage left it
    const [d] = arena.int32(20);
    expect(d!.length).toBe(20);
  });
});

describe("welding the indexed mesh equals welding the soup", () => {
  const cases: [string, Mesh, number][] = [
    ["sphere (exact shared corners)", toMesh(uvSphere(10)), 1e-5],
    ["jittered torus (every corner apart, welded within tolerance)", jittered(toMesh(torus(20, 5)), 2e-4), 1e-3],
    ["jittered sphere, tolerance below the jitter (partly welded)", jittered(toMesh(uvSphere(10, 24, 12)), 2e-4), 5e-5],
    ["two parts, one far from the origin", toMesh(merge(box(10, 10, 10), translate(bracket(), [5e4, -2e4, 3e3]))), 1e-4],
  ];
  it.each(cases)("%s", (_name, soup, tol) => {
    const reference = soupWeld(soup.positions, soup.triangleCount, tol);
    const w = weld(indexSoup(soup), tol);
    expect(w.vertexCount).toBe(reference.vertexCount);
    expect(Array.from(w.corner)).toEqual(Array.from(reference.corner));
  });

  it("volume and area over the indexed mesh are the soup's sums, to the last bit", () => {
    for (const soup of [toMesh(bracket()), jittered(toMesh(torus(20, 5)), 2e-4), toMesh(translate(uvSphere(10), [5e4, 0, 0]))]) {
      const m = measure(indexSoup(soup));
      const c = [0, 1, 2].map((i) => (m.bounds.min[i]! + m.bounds.max[i]!) / 2);
      // the divergence-theorem sums in the soup's order, as they ran before the mesh was indexed
      const p = soup.positions;
      let v6 = 0, a2 = 0;
      for (let b = 0; b < p.length; b += 9) {
        const [x1, y1, z1, x2, y2, z2, x3, y3, z3] = [0, 1, 2, 3, 4, 5, 6, 7, 8].map((j) => p[b + j]! - c[j % 3]!) as [number, number, number, number, number, number, number, number, number];
        v6 += x1 * (y2 * z3 - z2 * y3) - y1 * (x2 * z3 - z2 * x3) + z1 * (x2 * y3 - y2 * x3);
        const ux = x2 - x1, uy = y2 - y1, uz = z2 - z1, vx = x3 - x1, vy = y3 - y1, vz = z3 - z1;
        const cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
        a2 += Math.sqrt(cx * cx + cy * cy + cz * cz);
      }
      expect(m.volumeMm3).toBe(v6 / 6);
      expect(m.areaMm2).toBe(a2 / 2);
    }
  });
});
