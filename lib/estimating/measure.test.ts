import { describe, expect, it } from "vitest";
import { box, bracket, merge, openBox, toMesh, torus, translate, uvSphere } from "../../mocks/fixtures/meshes";
import { measure } from "./measure";
import type { Mesh } from "./types";

describe("measures against closed forms", () => {
  it("box 10×20×30: V = 6000, A = 2200, 12 facets (closed form)", () => {
    const m = measure(toMesh(box(10, 20, 30)));
    expect(m.triangles).toBe(12);
    expect(m.volumeMm3).toBeCloseTo(6000, 9);
    expect(m.areaMm2).toBeCloseTo(2200, 9);
    expect(m.bounds.max).toEqual([10, 20, 30]);
    expect(m).toMatchObject({ watertight: true, openEdges: 0, nonManifoldEdges: 0, inconsistentEdges: 0, shells: 1 });
  });

  it("volume is invariant to translation far from the origin (computed about the box centre)", () => {
    const m = measure(toMesh(translate(box(10, 20, 30), [50000, -20000, 3000])));
    expect(m.volumeMm3).toBeCloseTo(6000, 3);
  });

  it("UV sphere r=10, 64×32: V = 4171.99576, A = 1254.11536 (checks.md, float64; manifold-3d agrees)", () => {
    const m = measure(toMesh(uvSphere(10)));
    expect(m.triangles).toBe(3968);
    expect(m.volumeMm3).toBeCloseTo(4171.99576, 3);
    expect(m.areaMm2).toBeCloseTo(1254.11536, 3);
    expect(m.watertight).toBe(true);
  });

  it("torus R=20, r=5, 64×32: V = 9790.56408, A = 3937.54783 (checks.md; Pappus)", () => {
    const m = measure(toMesh(torus(20, 5)));
    expect(m.triangles).toBe(4096);
    expect(m.volumeMm3).toBeCloseTo(9790.56408, 2);
    expect(m.areaMm2).toBeCloseTo(3937.54783, 2);
    expect(m.shells).toBe(1);
  });

  it("refined spheres and tori converge to 4/3·π·r³ and 2·π²·R·r² (closed forms; Pappus's theorems)", () => {
    let lastS = Infinity, lastT = Infinity;
    for (const k of [16, 32, 64, 128]) {
      const es = Math.abs(measure(toMesh(uvSphere(10, k, k / 2))).volumeMm3 - (4 / 3) * Math.PI * 1000);
      const et = Math.abs(measure(toMesh(torus(20, 5, k, k / 2))).volumeMm3 - 2 * Math.PI ** 2 * 20 * 25);
      expect(es).toBeLessThan(lastS / 3); // second-order convergence: ×4 per doubling, allow ×3
      expect(et).toBeLessThan(lastT / 3);
      lastS = es; lastT = et;
    }
    expect(lastS / ((4 / 3) * Math.PI * 1000)).toBeLessThan(1.1e-3); // 128 × 64: 1.0e-3 short of the sphere
  });
});

describe("topology", () => {
  it("an open box has 4 open edges and is not watertight", () => {
    const m = measure(toMesh(openBox()));
    expect(m.openEdges).toBe(4);
    expect(m.watertight).toBe(false);
  });

  it("a flipped triangle shows as inconsistently oriented edges", () => {
    const b = box(10, 20, 30);
    const idx = b.indices.slice();
    [idx[1], idx[2]] = [idx[2]!, idx[1]!];
    const m = measure(toMesh({ vertices: b.vertices, indices: idx }));
    expect(m.inconsistentEdges).toBe(3);
    expect(m.watertight).toBe(false);
  });

  it("three triangles on one edge make it non-manifold", () => {
    const m: Mesh = { positions: new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0, 1, 0, 0, 0, 0, 0, 0, -1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1]), triangleCount: 3 };
    expect(measure(m).nonManifoldEdges).toBe(1);
  });

  it("counts shells (connected components)", () => {
    const m = measure(toMesh(merge(box(10, 10, 10), translate(box(5, 5, 5), [20, 0, 0]), translate(uvSphere(3), [40, 0, 0]))));
    expect(m.shells).toBe(3);
    expect(m.volumeMm3).toBeGreaterThan(1125);
  });

  it("welds corners within the tolerance (jittered copies still close)", () => {
    const s = toMesh(uvSphere(10));
    const p = s.positions;
    let seed = 7;
    for (let i = 0; i < p.length; i++) { seed = (seed * 1103515245 + 12345) % 2 ** 31; p[i] = p[i]! + ((seed / 2 ** 31) - 0.5) * 2e-4; }
    expect(measure(s, { weldToleranceMm: 1e-3 }).openEdges).toBe(0);
    expect(measure(s, { weldToleranceMm: 1e-9 }).openEdges).toBeGreaterThan(0);
  });

  it("M = ½ Σ l·θ: cube a → 3πa, box → π(a+b+c) (Stoyan, Kendall & Mecke 1995, p. 26)", () => {
    expect(measure(toMesh(box(10, 10, 10))).meanCurvatureIntegral).toBeCloseTo(30 * Math.PI, 9);
    expect(measure(toMesh(box(10, 20, 30))).meanCurvatureIntegral).toBeCloseTo(60 * Math.PI, 9);
  });

  it("concave edges count negative: the L-bracket's M is the convex edges' less the inner edge's", () => {
    // L profile legs 100, 80, thickness 20, depth 50: profile corners 5 convex (+π/2), 1 concave (−π/2)
    // vertical edges: 5·50·π/2 − 50·π/2; cap edges: perimeter 360 at π/2 each on two caps
    const expected = 0.5 * ((5 * 50 - 50) * (Math.PI / 2) + 2 * 360 * (Math.PI / 2));
    expect(measure(toMesh(bracket())).meanCurvatureIntegral).toBeCloseTo(expected, 6);
  });
});
