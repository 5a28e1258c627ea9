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
