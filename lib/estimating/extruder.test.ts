import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { isEstimateInputError } from "./errors";
import { canMelt, dryingFor, extruderOutputFor, familyOf, feedFor } from "./extruder";
import { continuousSchedule } from "./schedule";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (size: [number, number, number], options: AnalyseOptions = {}) => analyse({ bytes: binaryStl(box(...size)), fileName: "part.stl", options, catalogue, now });
const cell = (k: string) => defaultCells.find((c) => c.key === k)!;
const material = (k: string) => defaultMaterials.find((m) => m.key === k)!;

describe("extruders by material family", () => {
  it("a 40 mm-class screw lays about 90 kg/h and a 60 mm-class one about 225 kg/h of a commodity polymer, less of a high-temperature one (common practice)", () => {
    expect(cell("long-bed").screwMm).toBe(40);
    expect(extruderOutputFor(cell("long-bed"), material("abs-cf"))).toBe(90);
    expect(cell("long-axis").screwMm).toBe(60);
    expect(extruderOutputFor(cell("long-axis"), material("abs-cf"))).toBe(225);
    for (const c of defaultCells) {
      expect(extruderOutputFor(c, material("pei-cf"))).toBeLessThan(extruderOutputFor(c, material("pa-cf")));
      expect(extruderOutputFor(c, material("pa-cf"))).toBeLessThan(extruderOutputFor(c, material("abs-cf")));
    }
  });

  it("a row with no family takes it from its melt range; a cell with no figures by family uses its one output", () => {
    for (const m of defaultMaterials) expect(familyOf({ meltTempMinC: m.meltTempMinC })).toBe(m.family);
    const old = { ...cell("compact"), outputKgPerHByFamily: undefined };
    expect(extruderOutputFor(old, material("pps-cf"))).toBe(old.extruderOutputKgPerH);
  });

  it("a material a cell cannot melt is never chosen for it, and forcing that cell is a clear error", async () => {
    // PEI/CF melts at 340–400 °C (typical processing range, memory); the compact cell reaches 320 °C
    expect(canMelt(cell("compact"), material("pei-cf"))).toBe(false);
    expect(canMelt(cell("compact"), material("pps-cf"))).toBe(true);
    const r = await run([300, 200, 150], { materialKey: "pei-cf" });
    expect(r.cell).not.toBe("compact");
    expect(r.alternatives.map((a) => a.cell)).not.toContain("compact");
    expect(r.fits.map((f) => f.cell)).not.toContain("compact");
    const err = await run([300, 200, 150], { materialKey: "pei-cf", cellKey: "compact" }).catch((e: unknown) => e);
    expect(isEstimateInputError(err)).toBe(true);
    expect((err as Error).message).toMatch(/320 °C.*340 °C/);
  });
});

describe("drying", () => {
  it("sustained feed = hopper ÷ drying hours (hopper residence time, common practice): 400 kg ÷ 8 h = 50 kg/h of PA/CF on the long bed", () => {
    const d = dryingFor(cell("long-bed"), material("pa-cf"))!;
    expect(d).toEqual({ hours: 8, tempC: 80, dryerKg: 400, maxKgPerH: 50 });
    // the dryer, not the 75 kg/h screw, sets the feed
    expect(feedFor(cell("long-bed"), material("pa-cf"))).toMatchObject({ kgPerH: 50, limitedBy: "dryer" });
    // ABS/CF dries in 3 h: 400 ÷ 3 = 133 kg/h, more than the screw's 90
    expect(feedFor(cell("long-bed"), material("abs-cf"))).toMatchObject({ kgPerH: 90, limitedBy: "extruder" });
    // a cell row with no dryer stated plans no drying (older rows)
    expect(dryingFor({ ...cell("long-bed"), dryer: undefined }, material("pa-cf"))).toBeNull();
  });

  it("a PA/CF part: the plan dries the first charge before the first layer and deposits no faster than the dryer allows", async () => {
    for (const cellKey of [undefined, "long-bed", "long-axis"]) {
      const r = await run([1800, 900, 450], { materialKey: "pa-cf", printMode: "solid", cellKey });
      expect(r.drying).not.toBeNull();
      const c = cell(r.cell);
      expect(r.drying).toEqual({ hours: 8, tempC: 80, dryerKg: c.dryer!.hopperKg, maxKgPerH: c.dryer!.hopperKg / 8 });
      // drying ends no later than the first layer
      const dryEnd = Date.parse(r.schedule.dryingStart) + r.drying!.hours * 3_600_000;
      expect(dryEnd).toBeLessThanOrEqual(Date.parse(r.schedule.printStart));
      expect(Date.parse(r.schedule.dryingStart)).toBeGreaterThanOrEqual(now.getTime());
      // laying rate ρ·w·h·v (arithmetic) and the whole print's mean rate, both within the dryer's feed
      const layKgPerH = (r.material.densityGPerCm3 * r.beadWidthMm * r.layerHeightMm * r.speedMmS * 3600) / 1e6;
      // (speedMmS is rounded to 0.01 mm/s in the JSON)
      expect(layKgPerH).toBeLessThanOrEqual(r.drying!.maxKgPerH * (1 + 1e-4));
      // (printHours is rounded to 4 decimals in the JSON)
      expect(r.depositedKg / r.printHours).toBeLessThanOrEqual(r.drying!.maxKgPerH * (1 + 1e-4));
      expect(r.feed).toMatchObject({ limitedBy: "dryer", kgPerH: r.drying!.maxKgPerH });
    }
  });

  it("with a job ahead, the second hopper dries the charge during that job; alone, the first layer waits for the dryer", () => {
    const cal = cell("long-bed").calendar;
    const plant = { timeZone: "CST6CDT", dayStartHour: 6, holidays: [] };
    const p = { setupHours: 2, printHours: 10, coolingHours: 4, machiningHours: 3, finishingDays: 0, inspectionDays: 0, packingDays: 0, dryingHours: 8 };
    // Tuesday 2027-03-02 08:00 local (14:00Z, UTC−6), no queue: set-up 2 h, drying 8 h to 16:00
    // local: the first layer waits for the dryer, not for the set-up
    const alone = continuousSchedule(new Date("2027-03-02T14:00:00Z"), cal, plant, { ...p, queueHours: 0 });
    expect(alone.dryingStart.toISOString()).toBe("2027-03-02T14:00:00.000Z");
    expect(alone.printStart.toISOString()).toBe("2027-03-02T22:00:00.000Z");
    // from 15:00 local the charge is dry at 23:00, after the second shift (06:00 + 16 h): the first
    // layer is laid at the next shift, 06:00 local
    const late = continuousSchedule(new Date("2027-03-02T21:00:00Z"), cal, plant, { ...p, queueHours: 0 });
    expect(late.printStart.toISOString()).toBe("2027-03-03T12:00:00.000Z");
    // 10 working hours ahead: the charge dries during them and the print starts at the set-up's end
    const queued = continuousSchedule(new Date("2027-03-02T14:00:00Z"), cal, plant, { ...p, queueHours: 10 });
    expect(queued.setupStart.getTime() - queued.dryingStart.getTime()).toBe(8 * 3_600_000);
    const noDry = continuousSchedule(new Date("2027-03-02T14:00:00Z"), cal, plant, { ...p, queueHours: 10, dryingHours: 0 });
    expect(queued.printStart.toISOString()).toBe(noDry.printStart.toISOString());
  });
});
