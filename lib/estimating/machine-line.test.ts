import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { stepoverForScallop } from "./machining";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (size: [number, number, number], options: AnalyseOptions = {}) => analyse({ bytes: binaryStl(box(...size)), fileName: "plate.stl", options, catalogue, now });

describe("machining in the plan", () => {
  it("a flat plate is not finished on its bed face; asked, it is flipped for a second set-up", async () => {
    const plate = await run([1200, 800, 60]);
    // the plate lies flat: its 1200 × 800 face is on the bed
    expect(plate.orientation.up).toBe("z");
    expect(plate.machining.bedFaceMm2).toBeCloseTo(1200 * 800, 0);
    expect(plate.machining.bedFaceFinished).toBe(false);
    expect(plate.machining.setups).toBe(1);
    const both = await run([1200, 800, 60], { finishBedFace: true, cellKey: plate.cell, orientation: plate.orientation });
    expect(both.machining.bedFaceFinished).toBe(true);
    expect(both.machining.setups).toBe(2);
    // the finish time of the bed face, t = A/(s·f) (checks.md), and a second set-up
    const s = stepoverForScallop(defaultRateCard.cutterRadiusMm, defaultRateCard.targetScallopMm);
    expect(both.machining.finishingHours - plate.machining.finishingHours).toBeCloseTo((1200 * 800) / (s * defaultRateCard.finishingFeedMmPerMin) / 60, 3);
    expect(both.machining.setupHours).toBe(2 * defaultRateCard.machiningSetupHours);
    expect(both.totalCents).toBeGreaterThan(plate.totalCents);
  });

  it("an open mold gets its trim line along its edge", async () => {
    const r = await run([1200, 800, 300], { trimLines: true });
    // the box's outline: 2 × (1200 + 800) in a horizontal build, the edge the trim line follows
    const [x, y] = r.orientation.up === "z" ? [1200, 800] : r.orientation.up === "y" ? [300, 1200] : [800, 300];
    expect(r.machining.trimLengthMm).toBeCloseTo(2 * (x + y), 3);
    expect(r.machining.trimHours).toBeGreaterThan(0);
  });

  it("the router keeps its own calendar: machining on a one-shift router ends later", async () => {
    const oneShift = { ...defaultRateCard, routerCalendar: { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 1, hoursPerShift: 8, holidays: [] } };
    const a = await run([1800, 900, 450]);
    const b = await analyse({ bytes: binaryStl(box(1800, 900, 450)), fileName: "p.stl", options: { cellKey: a.cell, orientation: a.orientation }, catalogue: { ...catalogue, rateCard: oneShift }, now });
    expect(b.schedule.coolingEnd).toBe(a.schedule.coolingEnd);
    expect(Date.parse(b.schedule.machiningEnd)).toBeGreaterThan(Date.parse(a.schedule.machiningEnd));
  });
});

describe("warnings that follow the plan", () => {
  it("expansion across the beads in the chosen build: Δα·ΔT·L over the span along the build direction (linear expansion)", async () => {
    // an 11 m beam built vertically: its length runs across the beads. ABS/CF 80 ppm/K across against
    // a carbon laminate's 3 (memory, checks.md), 20 → 120 °C: 77e-6 × 100 × 11000 ≈ 84.7 mm
    const beam = await run([11_000, 400, 300], { partCtePpmPerK: 3, cureTempC: 120 });
    const w = beam.warnings.find((x) => x.code === "material-cte-across")!;
    expect(w.message).toMatch(/vertically/);
    expect(w.message).toMatch(/84\.7 mm/);
    // a 60 mm plate built flat: 77e-6 × 100 × 60 = 0.46 mm, under the 0.5 mm the bureau accepts
    const plate = await run([1200, 800, 60], { partCtePpmPerK: 3, cureTempC: 120 });
    expect(plate.warnings.map((x) => x.code)).not.toContain("material-cte-across");
    // along the beads, as before: |10 − 3| is inside the 15 ppm/K threshold
    expect(plate.warnings.map((x) => x.code)).not.toContain("material-cte");
  });

  it("a cure above the material's rating names the catalogue's materials rated for it", async () => {
    const r = await run([600, 400, 200], { cureTempC: 177 });
    const w = r.warnings.find((x) => x.code === "material-temperature")!;
    // service limits: PPS/CF 180 °C, PEI/CF 190 °C, PESU/CF 195 °C (the catalogue's)
    for (const name of ["PPS/CF", "PEI/CF", "PESU/CF"]) expect(w.message).toContain(name);
    expect(w.message).not.toContain("PC/CF");
  });

  it("the lifting caution is from the machined mass, with the printed mass beside it", async () => {
    const r = await run([1200, 800, 300]);
    expect(r.liftingCaution).toBe(r.partMassKg > defaultRateCard.liftingCautionKg);
    const c = r.cautions.find((x) => x.startsWith("Heavy part"))!;
    expect(c).toContain(`${Math.round(r.partMassKg * 100) / 100} kg`);
    expect(c).toMatch(/as printed/);
  });
});
