import { describe, expect, it } from "vitest";
import { binaryStl, box, drillFixture, hullPlugInches, layupMold, objFile, openBox, threeMf, tooLongBeam } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { isEstimateInputError } from "./errors";
import { addWorkingHours } from "./schedule";
import { plantOf } from "./stages/schedule";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (bytes: Uint8Array, fileName: string, options: AnalyseOptions = {}) => analyse({ bytes, fileName, options, catalogue, now });

const CLI_KEYS = ["format", "triangles", "units", "unitsGuessed", "bboxMm", "volumeMm3", "areaMm2", "watertight", "openEdges", "nonManifoldEdges", "shells", "allowanceMm", "nearNetVolumeMm3", "fits", "layers", "flaggedLayers", "printHours", "dwellHours", "massKg", "machiningHours", "totalCents", "depositCents"];

describe("analyse", () => {
  it("a box 1000×2000×500 mm: Steiner near-net volume 1.044894442e9 at 6.35 mm (checks.md) and a complete JSON result", async () => {
    // solid: the deposited volume is the near-net volume
    const r = await run(binaryStl(box(1000, 2000, 500)), "box.stl", { printMode: "solid" });
    for (const k of CLI_KEYS) expect(r).toHaveProperty(k);
    expect(r.nearNetVolumeMm3 / 1.044894442e9).toBeCloseTo(1, 7);
    expect(r.allowanceVolumeMm3).toBeCloseTo(r.nearNetVolumeMm3 - 1e9, 0);
    // the slicer's own volume of the grown box agrees with Steiner to within a layer's worth
    // (the last layer rounds the build height up to whole layers of the chosen preset)
    const buildH = r.fits.find((f) => f.cell === r.cell)!.buildHeightMm;
    expect(Math.abs(r.slicedVolumeMm3 - r.nearNetVolumeMm3) / r.nearNetVolumeMm3).toBeLessThan(r.layerHeightMm / buildH);
    expect(r.format).toBe("stl-binary");
    expect(r.bboxMm).toEqual([1000, 2000, 500]);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    // mass = ρ·V(t) + purge + scrap
    const dep = r.nearNetVolumeMm3 * 1.15e-6;
    expect(r.massKg).toBeCloseTo(dep * (1 + defaultRateCard.startupScrapFraction) + defaultRateCard.purgeKg, 2);
    expect(r.liftingCaution).toBe(true);
    expect(r.cautions.join(" ")).toMatch(/local codes/);
    expect(r.shipDate >= "2027-03-01").toBe(true);
    expect(r.depositCents).toBe(Math.round(r.totalCents / 2));
  });

  it("the search picks the cheapest printable candidate, and every cell reports its margin", async () => {
    const r = await run(binaryStl(box(1000, 2000, 500)), "box.stl");
    expect(r.status).toBe("priced");
    expect(r.orientationChosenBy).toBe("cost");
    for (const a of r.alternatives) expect(a.totalCents).toBeGreaterThanOrEqual(r.totalCents);
    expect(r.fits).toHaveLength(defaultCells.length);
    const compact = r.fits.find((f) => f.cell === "compact")!;
    // grown 1012.7 × 2012.7 × 512.7 in 1800 × 3000 × 1200: margin min(787.3, 987.3, 687.3)
    expect(compact.fits).toBe(true);
    expect(compact.marginMm).toBeCloseTo(687.3, 6);
  });

  it("a part too long for any cell is split, and priced as its pieces", async () => {
    const r = await run(binaryStl(tooLongBeam()), "spar.stl");
    expect(r.fitsAny).toBe(false);
    expect(r.split).not.toBeNull();
    expect(r.split!.pieces).toBe(2);
    // priced as its pieces, each built on its own, with the joining
    expect(r.pieces).toHaveLength(2);
    expect(r.warnings.some((w) => w.code === "priced-as-pieces")).toBe(true);
    expect(r.lines.some((l) => l.key === "joining")).toBe(true);
  });

  it("the demo parts analyse in every format with plausible figures", async () => {
    const hull = await run(binaryStl(hullPlugInches()), "hull.stl");
    expect(hull.units).toBe("in");
    expect(hull.unitsGuessed).toBe(true);
    expect(hull.bboxMm[0]).toBeCloseTo(144 * 25.4, 1);
    const mold = await run(objFile(layupMold()), "mold.obj", { materialKey: "pps-cf", cureTempC: 177 });
    expect(mold.format).toBe("obj");
    // PPS/CF is rated to 180 °C here, so a 177 °C autoclave cure warns only that it is close
    expect(mold.warnings.map((w) => w.code)).toContain("material-temperature-near");
    expect(mold.warnings.map((w) => w.code)).not.toContain("material-temperature");
    const fix = await run(threeMf(drillFixture()), "fixture.3mf", { shellWalls: 3 });
    expect(fix.format).toBe("3mf");
    expect(fix.shellWalls).toBe(3);
    for (const r of [hull, mold, fix]) {
      expect(r.watertight).toBe(true);
      expect(r.printHours).toBeGreaterThan(0);
      expect(r.layers).toBe(Math.ceil((r.bboxMm[{ x: 0, y: 1, z: 2 }[r.orientation.up]]! + 2 * r.allowanceMm) / r.layerHeightMm - 1e-9));
      // deposition never beats the extruder: kg / print hours ≤ output (trade outputs 45–230 kg/h
      // are upper bounds, checks.md).
      const cell = defaultCells.find((c) => c.key === r.cell)!;
      expect(r.depositedKg / r.printHours).toBeLessThanOrEqual(cell.extruderOutputKgPerH * 1.0001);
      expect(r.depositedKg / r.printHours).toBeGreaterThan(1);
      expect(r.totalCents).toBeGreaterThan(0);
      expect(Number.isInteger(r.totalCents)).toBe(true);
    }
    expect(fix.depositedKg).toBeLessThan((fix.nearNetVolumeMm3 * fix.material.densityGPerCm3) / 1e6);
  });

  it("warns when the cure temperature is above the material's service limit, and cautions about it", async () => {
    const r = await run(binaryStl(box(500, 400, 300)), "tool.stl", { materialKey: "abs-cf", cureTempC: 177, partCtePpmPerK: 3 });
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["material-temperature"]));
    expect(r.cautions.some((c) => /autoclave/.test(c))).toBe(true);
  });

  it("an open mesh is analysed with a plain warning", async () => {
    const r = await run(binaryStl(openBox(1000, 800, 600)), "open.stl");
    expect(r.watertight).toBe(false);
    expect(r.openEdges).toBe(4);
    expect(r.warnings.some((w) => w.code === "not-watertight")).toBe(true);
  });

  it("reports progress in order and stays deterministic with `now` passed in", async () => {
    const seen: number[] = [];
    const a = await analyse({ bytes: binaryStl(box(1000, 500, 400)), fileName: "a.stl", options: {}, catalogue, now }, (f) => seen.push(f));
    const b = await run(binaryStl(box(1000, 500, 400)), "a.stl");
    expect(seen[seen.length - 1]).toBe(1);
    expect([...seen].sort((x, y) => x - y)).toEqual(seen);
    expect(a).toEqual(b);
  });

  it("a queue ahead on the cell moves the ship date", async () => {
    const bytes = binaryStl(box(1000, 500, 400));
    const a = await run(bytes, "a.stl", { cellKey: "compact" });
    const b = await analyse({ bytes, fileName: "a.stl", options: { cellKey: "compact" }, catalogue, now, queue: { compact: 200 } });
    expect(b.shipDate > a.shipDate).toBe(true);
  });

  it("booked work on the chosen cell pushes the first set-up back by about its working hours; expedite is earlier or equal and dearer", async () => {
    const bytes = binaryStl(box(1000, 500, 400));
    const idle = await run(bytes, "a.stl", { cellKey: "compact" });
    // 80 working hours booked on the compact cell from Monday 09:00 (five 16 h days), no slack
    const start = now.getTime(), end = addWorkingHours(now, 80, defaultCells.find((c) => c.key === "compact")!.calendar, plantOf(defaultRateCard)).getTime();
    const busy = await analyse({ bytes, fileName: "a.stl", options: { cellKey: "compact" }, catalogue, now, booked: { compact: [{ startMs: start, endMs: end, ref: "R-1" }] } });
    expect(busy.schedule.queueHours).toBeCloseTo(80 + idle.schedule.queueHours, 0);
    expect(busy.shipDate > idle.shipDate).toBe(true);
    expect(busy.leadTimes[0]).toEqual({ key: "standard", shipDate: busy.shipDate, totalCents: busy.totalCents, adjustmentCents: 0 });
    for (const r of [idle, busy]) {
      const ex = r.leadTimes.find((l) => l.key === "expedite")!;
      expect(ex.shipDate <= r.shipDate).toBe(true);
      expect(ex.totalCents).toBeGreaterThan(r.totalCents);
    }
  });

  it("a queue naming an unknown cell, or negative hours, is an input error", async () => {
    const bytes = binaryStl(box(1000, 500, 400));
    for (const queue of [{ nope: 4 }, { compact: -1 }, { router: Number.NaN }] as Record<string, number>[]) {
      const e = await analyse({ bytes, fileName: "a.stl", options: {}, catalogue, now, queue }).catch((x: unknown) => x);
      expect(isEstimateInputError(e)).toBe(true);
    }
  });

  it("bad options are input errors", async () => {
    const bytes = binaryStl(box(1000, 500, 400));
    for (const o of [{ materialKey: "unobtainium" }, { cellKey: "nope" }, { allowanceMm: -1 }, { shellWalls: 0 }]) {
      const e = await run(bytes, "a.stl", o).catch((x: unknown) => x);
      expect(isEstimateInputError(e)).toBe(true);
    }
  });
});
