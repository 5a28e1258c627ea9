import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Module from "manifold-3d";
import { binaryStl, box, bracket, openBox, toMesh, torus, uvSphere, type IndexedMesh } from "../../mocks/fixtures/meshes";
import { measure } from "./measure";
import { slice } from "./slice";
import { steinerVolume } from "./grow";

/**
 * Checks against outside references: Debian's `admesh` 0.98.4 (volume, size, facets,
 * disconnected edges, parts; it has no surface area) and npm `manifold-3d` 3.5.x
 * (volume, surface area, slices, Minkowski sums). See /work/shared/reference/checks.md.
 */
const shapes: [string, IndexedMesh][] = [
  ["box", box(10, 20, 30)],
  ["sphere", uvSphere(10)],
  ["torus", torus(20, 5)],
  ["bracket", bracket()],
];

const hasAdmesh = spawnSync("admesh", ["--version"], { encoding: "utf8" }).status === 0;
if (!hasAdmesh) console.warn("SKIPPED: admesh is not installed (apt-get install -y admesh); the admesh reference checks did not run.");

function admesh(mesh: IndexedMesh, name: string) {
  const dir = mkdtempSync(path.join(tmpdir(), "lw-admesh-"));
  const f = path.join(dir, `${name}.stl`);
  writeFileSync(f, binaryStl(mesh));
  const out = execFileSync("admesh", [f], { encoding: "utf8" });
  const g = (re: RegExp) => { const m = out.match(re); if (!m) throw new Error(`admesh output lacks ${re}`); return m.slice(1).map(Number); };
  const [minX, maxX] = g(/Min X = +(-?[\d.]+), Max X = +(-?[\d.]+)/);
  const [minY, maxY] = g(/Min Y = +(-?[\d.]+), Max Y = +(-?[\d.]+)/);
  const [minZ, maxZ] = g(/Min Z = +(-?[\d.]+), Max Z = +(-?[\d.]+)/);
  const [facets] = g(/Number of facets\s+:\s+(\d+)/);
  const [d1] = g(/Facets with 1 disconnected edge\s+:\s+(\d+)/);
  const [d2] = g(/Facets with 2 disconnected edges\s+:\s+(\d+)/);
  const [d3] = g(/Facets with 3 disconnected edges\s+:\s+(\d+)/);
  const [parts] = g(/Number of parts\s+:\s+(\d+)/);
  const [volume] = g(/Volume\s+:\s+(-?[\d.]+)/);
  return { min: [minX, minY, minZ], max: [maxX, maxY, maxZ], facets, disconnectedEdges: d1! + 2 * d2! + 3 * d3!, parts, volume };
}

describe.skipIf(!hasAdmesh)("against Debian admesh 0.98.4", () => {
  it.each(shapes)("%s: volume (float32, rel 1e-5), size, facets and parts agree", (name, mesh) => {
    const a = admesh(mesh, name);
    const m = measure(toMesh(mesh));
    expect(Math.abs(m.volumeMm3 - a.volume!) / m.volumeMm3).toBeLessThan(1e-5);
    for (let i = 0; i < 3; i++) {
      expect(m.bounds.min[i]).toBeCloseTo(a.min[i]!, 5);
      expect(m.bounds.max[i]).toBeCloseTo(a.max[i]!, 5);
    }
    expect(m.triangles).toBe(a.facets);
    expect(m.shells).toBe(a.parts);
    expect(m.openEdges).toBe(a.disconnectedEdges);
  });

  it("a box with a hole: the same disconnected edges (admesh's repaired volume is not compared)", () => {
    const a = admesh(openBox(10, 20, 30), "open");
    const m = measure(toMesh(openBox(10, 20, 30)));
    expect(m.openEdges).toBe(4);
    expect(a.disconnectedEdges).toBe(4);
    expect(m.triangles).toBe(a.facets);
  });
});

describe("against manifold-3d (npm, WASM)", () => {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- the WASM module's types are loose
  let w: any;
  beforeAll(async () => { w = await Module(); w.setup(); });
  const free: { delete(): void }[] = [];
  afterAll(() => { for (const o of free) o.delete(); });

  const toManifold = (m: IndexedMesh) => {
    const soup = toMesh(m);
    const mesh = new w.Mesh({ numProp: 3, vertProperties: soup.positions, triVerts: Uint32Array.from({ length: soup.triangleCount * 3 }, (_, i) => i) });
    mesh.merge();
    const man = w.Manifold.ofMesh(mesh);
    free.push(man);
    return man;
  };

  it.each(shapes)("%s: volume and surface area agree (rel 1e-6)", (_name, mesh) => {
    const man = toManifold(mesh);
    const m = measure(toMesh(mesh));
    expect(Math.abs(m.volumeMm3 - man.volume()) / m.volumeMm3).toBeLessThan(1e-6);
    expect(Math.abs(m.areaMm2 - man.surfaceArea()) / m.areaMm2).toBeLessThan(1e-6);
    expect(man.genus()).toBe(_name === "torus" ? 1 : 0);
  });

  it("section areas of the sphere and torus agree with Manifold.slice(z).area()", () => {
    for (const mesh of [uvSphere(10), torus(20, 5)]) {
      const man = toManifold(mesh);
      const soup = toMesh(mesh);
      const s = slice(soup, -4.1, 0.8, 10);
      for (let k = 0; k < 10; k++) {
        const cs = man.slice(-4.1 + (k + 0.5) * 0.8);
        const ref = cs.area();
        cs.delete();
        expect(Math.abs(s.area[k]! - ref) / ref).toBeLessThan(1e-5);
      }
    }
  });

  it("cube(10) ⊕ sphere(1, 64) = 1698.2616, within 0.02 % of Steiner's 1698.43657 (checks.md)", () => {
    const cube = w.Manifold.cube([10, 10, 10]);
    const ball = w.Manifold.sphere(1, 64);
    const sum = cube.minkowskiSum(ball);
    free.push(cube, ball, sum);
    const m = measure(toMesh(box(10, 10, 10)));
    const steiner = steinerVolume(m.volumeMm3, m.areaMm2, m.meanCurvatureIntegral, 1);
    expect(sum.volume()).toBeCloseTo(1698.2616, 3);
    expect(Math.abs(sum.volume() - steiner) / steiner).toBeLessThan(2e-4);
  });

  it("non-convex bracket: the signed-angle Steiner estimate is near the true Minkowski sum and not below it by much (checks.md: an estimate there)", () => {
    const man = toManifold(bracket());
    const ball = w.Manifold.sphere(2, 48);
    const sum = man.minkowskiSum(ball);
    free.push(ball, sum);
    const m = measure(toMesh(bracket()));
    const steiner = steinerVolume(m.volumeMm3, m.areaMm2, m.meanCurvatureIntegral, 2);
    const convexM = steinerVolume(m.volumeMm3, m.areaMm2, m.meanCurvatureIntegral + 2 * 0.5 * 50 * (Math.PI / 2), 2);
    // the polygonal ball is a little smaller than the true ball; allow 0.3 %
    expect(Math.abs(steiner - sum.volume()) / sum.volume()).toBeLessThan(3e-3);
    // counting the concave edge as convex overestimates more than the signed formula
    expect(Math.abs(convexM - sum.volume())).toBeGreaterThan(Math.abs(steiner - sum.volume()));
  });
});
