import { describe, expect, it } from "vitest";
import { box, bracket, toMesh, torus, uvSphere } from "../../mocks/fixtures/meshes";
import { slice } from "./slice";

describe("slicing by a z sweep", () => {
  it("box 10×20×30: every section is 200 mm² with a 60 mm contour (closed form)", () => {
    const m = toMesh(box(10, 20, 30));
    const s = slice(m, 0, 1, 30);
    for (let k = 0; k < 30; k++) { expect(s.area[k]).toBeCloseTo(200, 9); expect(s.perimeter[k]).toBeCloseTo(60, 9); }
  });

  it("the L-bracket's sections are its profile: area 3200, contour 360", () => {
    const m = toMesh(bracket());
    const s = slice(m, 0, 5, 10);
    for (let k = 0; k < 10; k++) { expect(s.area[k]).toBeCloseTo(100 * 20 + 60 * 20, 6); expect(s.perimeter[k]).toBeCloseTo(360, 6); }
  });

  it("sphere sections converge to π(r² − z²) and their sum to the volume (closed form)", () => {
    const m = toMesh(uvSphere(10, 256, 128));
    const h = 0.5;
    const s = slice(m, -10, h, 40);
    let v = 0;
    for (let k = 0; k < 40; k++) {
      const z = -10 + (k + 0.5) * h;
      expect(s.area[k]! / (Math.PI * (100 - z * z))).toBeCloseTo(1, 2);
      v += s.area[k]! * h;
    }
    expect(v / ((4 / 3) * Math.PI * 1000)).toBeCloseTo(1, 2);
  });

  it("the torus's section at its mid-plane is an annulus π((R+r)² − (R−r)²) with both contours", () => {
    const m = toMesh(torus(20, 5, 256, 128));
    const s = slice(m, -0.25, 0.5, 1);
    expect(s.area[0]! / (Math.PI * (25 ** 2 - 15 ** 2))).toBeCloseTo(1, 2);
    expect(s.perimeter[0]! / (2 * Math.PI * 40)).toBeCloseTo(1, 2);
  });

  it("matches a brute-force cut of every triangle at every plane", () => {
    const m = toMesh(torus(20, 5, 32, 16));
    const s = slice(m, -6, 0.7, 17);
    const p = m.positions;
    for (let k = 0; k < 17; k++) {
      const zp = -6 + (k + 0.5) * 0.7;
      let per = 0;
      for (let t = 0; t < m.triangleCount; t++) {
        const pts: number[][] = [];
        for (let e = 0; e < 3; e++) {
          const a = t * 9 + e * 3, b = t * 9 + ((e + 1) % 3) * 3;
          const da = p[a + 2]! - zp, db = p[b + 2]! - zp;
          if ((da >= 0) !== (db >= 0)) { const u = da / (da - db); pts.push([p[a]! + u * (p[b]! - p[a]!), p[a + 1]! + u * (p[b + 1]! - p[a + 1]!)]); }
        }
        if (pts.length === 2) per += Math.hypot(pts[0]![0]! - pts[1]![0]!, pts[0]![1]! - pts[1]![1]!);
      }
      expect(s.perimeter[k]).toBeCloseTo(per, 6);
    }
  });
});
