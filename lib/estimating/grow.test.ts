import { describe, expect, it } from "vitest";
import { box, toMesh, uvSphere } from "../../mocks/fixtures/meshes";
import { measure } from "./measure";
import { grownSection, steinerVolume } from "./grow";

function grow(a: number, b: number, c: number, t: number): number {
  const m = measure(toMesh(box(a, b, c)));
  return steinerVolume(m.volumeMm3, m.areaMm2, m.meanCurvatureIntegral, t);
}

describe("Steiner growth (Gruber, Convex and Discrete Geometry, 2007, p. 106)", () => {
  it("box 1×2×3 grown by 1 = 51.038346 (Putnam 1984, A1)", () => {
    expect(grow(1, 2, 3, 1)).toBeCloseTo(51.038346, 5);
  });
  it("cube a: a³ + 6a²t + 3πa·t² + 4/3·π·t³; a=10, t=1 → 1698.43657 (checks.md)", () => {
    expect(grow(10, 10, 10, 1)).toBeCloseTo(1698.43657, 4);
    const a = 37, t = 6.35;
    expect(grow(a, a, a, t)).toBeCloseTo(a ** 3 + 6 * a * a * t + 3 * Math.PI * a * t * t + (4 / 3) * Math.PI * t ** 3, 4);
  });
  it("box 10×20×30, t=6 → 26890.6188; box 1000×2000×500, t=6.35 → 1.044894442e9 (checks.md)", () => {
    expect(grow(10, 20, 30, 6)).toBeCloseTo(26890.6188, 3);
    expect(grow(1000, 2000, 500, 6.35) / 1.044894442e9).toBeCloseTo(1, 8);
  });
  it("a refined sphere r=10 grown by 6 approaches (4/3)π·16³ = 17157.2847 (checks.md)", () => {
    const err = (k: number) => {
      const m = measure(toMesh(uvSphere(10, k, k / 2)));
      return Math.abs(steinerVolume(m.volumeMm3, m.areaMm2, m.meanCurvatureIntegral, 6) - 17157.2847);
    };
    expect(err(128)).toBeLessThan(err(32) / 4);
    expect(err(128) / 17157.2847).toBeLessThan(2e-3);
  });
  it("2D sections grow by A + P·r + π·r² (Steiner in the plane)", () => {
    expect(grownSection(200, 60, 1)).toEqual({ area: 260 + Math.PI, perimeter: 60 + 2 * Math.PI });
  });
});
