import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { binaryStl, drillFixture } from "../../mocks/fixtures/meshes";

const root = path.resolve(import.meta.dirname, "../..");
const dir = mkdtempSync(path.join(tmpdir(), "lw-cli-"));
// as `npm run estimate` runs it: the launcher, which bundles the command line when a source changed
const cli = (...args: string[]) => spawnSync(process.execPath, [path.join(root, "lib/scripts/estimate.mjs"), ...args], { cwd: root, encoding: "utf8", env: { ...process.env, DATABASE_URL: `file:${path.join(dir, "none.db")}` } });

describe("estimate CLI", () => {
  it("--json prints one object with the issue's keys", () => {
    const f = path.join(dir, "fixture.stl");
    writeFileSync(f, binaryStl(drillFixture()));
    const r = cli(f, "--json", "--material", "pc-cf", "--allowance", "8", "--cell", "long-bed", "--shell-walls", "2", "--units", "mm");
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    for (const k of ["format", "triangles", "units", "unitsGuessed", "bboxMm", "volumeMm3", "areaMm2", "watertight", "openEdges", "nonManifoldEdges", "shells", "allowanceMm", "nearNetVolumeMm3", "fits", "layers", "flaggedLayers", "printHours", "dwellHours", "massKg", "machiningHours", "totalCents", "depositCents"]) expect(j).toHaveProperty(k);
    expect(j).toMatchObject({ format: "stl-binary", units: "mm", unitsGuessed: false, allowanceMm: 8, cell: "long-bed", shellWalls: 2 });
    expect(j.material.key).toBe("pc-cf");
  }, 60_000);

  it("a bad file exits 2 with one plain line on stderr", () => {
    const f = path.join(dir, "broken.stl");
    writeFileSync(f, new Uint8Array(300).fill(0x41));
    const r = cli(f, "--json");
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).not.toMatch(/at .*\.ts:\d+/);
  }, 60_000);

  it("a missing file and a bad option also exit 2", () => {
    expect(cli(path.join(dir, "nope.stl")).status).toBe(2);
    const f = path.join(dir, "fixture2.stl");
    writeFileSync(f, binaryStl(drillFixture()));
    const r = cli(f, "--units", "furlong");
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe("--units must be mm or in.");
  }, 60_000);

  it("--queue moves the ship date later; an unknown cell or negative hours exit 2 with a plain line", () => {
    const f = path.join(dir, "fixture3.stl");
    writeFileSync(f, binaryStl(drillFixture()));
    const idle = JSON.parse(cli(f, "--json", "--cell", "compact").stdout);
    const busy = cli(f, "--json", "--cell", "compact", "--queue", "compact=120", "--queue", "router=10");
    expect(busy.status).toBe(0);
    const b = JSON.parse(busy.stdout);
    expect(b.shipDate > idle.shipDate).toBe(true);
    expect(b.schedule.queueHours).toBeGreaterThanOrEqual(120);
    expect(b.leadTimes.map((l: { key: string }) => l.key)).toContain("expedite");
    for (const bad of [["--queue", "lathe=4"], ["--queue", "compact=-2"]]) {
      const r = cli(f, "--json", ...bad);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe("");
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toMatch(/--queue/);
    }
  }, 90_000);
});
