import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { clientEstimate } from "./client-view";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { stepoverForScallop } from "./machining";
import { JOIN_FALLBACKS } from "./stages/pieces";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (size: [number, number, number], options: AnalyseOptions = {}) => analyse({ bytes: binaryStl(box(...size)), fileName: "beam.stl", options, catalogue, now });
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

describe("a split part priced as pieces", () => {
  it("a 14 m beam is priced as two pieces with a joining line, and the top-level figures are their sums", async () => {
    const r = await run([14_000, 400, 300]);
    expect(r.fitsAny).toBe(false);
    expect(r.split!.pieces).toBe(2);
    expect(r.pieces).toHaveLength(2);
    expect(r.status).toBe("priced");
    const [a, b] = r.pieces!;
    // equal slabs along the length, each built vertically with its layers across its length
    expect([a!.fromMm, a!.toMm, b!.fromMm, b!.toMm]).toEqual([0, 7000, 7000, 14_000]);
    for (const p of r.pieces!) {
      expect(p.cell).toBe("long-axis");
      expect(p.printMode).toBe("vertical-shell");
      expect(p.orientation.up).toBe("x");
      // 7000 mm plus the allowance on both ends (the cut face keeps it too), in whole layers
      expect(p.layers).toBe(Math.ceil((7000 + 2 * 6.35) / p.layerHeightMm));
      expect(p.setupHours).toBe(defaultRateCard.printSetupHours);
      expect(p.subtotalCents).toBe(sum(p.lines.map((l) => l.amountCents)));
    }
    // each piece its own set-up: two set-up fees, two engineering charges
    expect(r.lines.find((l) => l.key === "setup")!.quantity).toBe(2);
    // sums
    expect(r.printHours).toBeCloseTo(sum(r.pieces!.map((p) => p.printHours)), 3);
    expect(r.massKg).toBeCloseTo(sum(r.pieces!.map((p) => p.massKg)), 3);
    expect(r.machiningHours).toBeCloseTo(sum(r.pieces!.map((p) => p.machiningHours)), 3);
    for (const key of ["material", "print", "machining"]) {
      expect(r.lines.find((l) => l.key === key)!.amountCents).toBe(sum(r.pieces!.map((p) => p.lines.find((l) => l.key === key)!.amountCents)));
    }
    expect(r.subtotalCents).toBe(sum(r.lines.map((l) => l.amountCents)));
    expect(r.totalCents).toBe(r.subtotalCents + r.marginCents + r.taxCents);
    // the pieces' volumes add up to the beam's: 14 m × 0.4 × 0.3 = 1.68 m³ net, a solid one's machined mass ρ·V
    const solid = await run([14_000, 400, 300], { printMode: "solid" });
    expect(solid.pieces!.map((p) => p.printMode)).toEqual(["vertical-solid", "vertical-solid"]);
    expect(solid.partMassKg).toBeCloseTo(1.68e9 * 1.15e-6, 0);
  });

  it("the joining line: set-up, bond by the joint face and a band machined each side of the joint (arithmetic on the rate card)", async () => {
    const r = await run([14_000, 400, 300]);
    const j = r.joint!;
    // one joint; its face is the beam's 400 × 300 section, its contour 1400 mm
    expect(j.cuts).toBe(1);
    expect(j.faceAreaMm2).toBeCloseTo(120_000, 0);
    expect(j.contourMm).toBeCloseTo(1400, 3);
    const s = stepoverForScallop(defaultRateCard.cutterRadiusMm, defaultRateCard.targetScallopMm);
    const hours = JOIN_FALLBACKS.joinSetupHours + 0.12 * JOIN_FALLBACKS.joinBondHoursPerM2 + (2 * JOIN_FALLBACKS.joinBandMm * 1400) / (s * defaultRateCard.finishingFeedMmPerMin) / 60;
    expect(j.hours).toBeCloseTo(hours, 3);
    const line = r.lines.find((l) => l.key === "joining")!;
    expect(line.unitCents).toBe(defaultRateCard.machiningRateCentsPerH);
    // the line shows hours to 3 decimals; the amount is rounded once from the unrounded hours
    expect(Math.abs(line.amountCents - j.hours * line.unitCents)).toBeLessThanOrEqual(0.5);
    // the joined part is crated and shipped once
    expect(r.lines.find((l) => l.key === "crating")!.quantity).toBe(1);
  });

  it("pieces on one cell print one after the other, are machined one at a time, and the joint waits for both", async () => {
    const r = await run([14_000, 400, 300]);
    const [a, b] = r.pieces!;
    expect(Date.parse(b!.schedule.setupStart)).toBeGreaterThanOrEqual(Date.parse(a!.schedule.coolingEnd));
    expect(Date.parse(b!.schedule.machiningStart)).toBeGreaterThanOrEqual(Date.parse(a!.schedule.machiningEnd));
    expect(Date.parse(r.schedule.machiningEnd)).toBeGreaterThan(Date.parse(b!.schedule.machiningEnd));
    expect(r.schedule.printStart).toBe(a!.schedule.printStart);
    expect(r.schedule.printEnd).toBe(b!.schedule.printEnd);
  });

  it("the client sees each piece's build and hours, never its own lines (before margin)", async () => {
    const r = await run([14_000, 400, 300]);
    for (const view of [clientEstimate(r), clientEstimate({ ...r, status: "needs-review" })]) {
      expect(view.pieces!.every((p) => p.lines.length === 0 && p.subtotalCents === 0)).toBe(true);
      expect(view.pieces!.map((p) => p.printHours)).toEqual(r.pieces!.map((p) => p.printHours));
    }
    expect(r.pieces![0]!.lines.length).toBeGreaterThan(0);
  });
});

describe("warnings of a part priced as pieces", () => {
  it("the expansion across the beads follows the pieces' build: each 7 m piece is built along its length", async () => {
    const r = await run([14_000, 400, 300], { partCtePpmPerK: 3, cureTempC: 120 });
    // 77e-6 × 100 K × 7000 mm ≈ 53.9 mm (linear expansion; ABS/CF 80 ppm/K across, memory, checks.md)
    expect(r.warnings.find((w) => w.code === "material-cte-across")!.message).toMatch(/7000 mm.*53\.9 mm/);
    expect(r.alternatives).toEqual([]);
  });
});
