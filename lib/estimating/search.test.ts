import { describe, expect, it } from "vitest";
import { binaryStl, box } from "../../mocks/fixtures/meshes";
import { analyse, type AnalyseOptions } from "./analyse";
import { defaultCells, defaultMaterials, defaultRateCard } from "./defaults";
import { segmentTimeS } from "./plan";
import { continuousSchedule, zoneOffsetMs } from "./schedule";
import { presetsOf } from "./stages/search-space";
import { shellExposure, wallsForAllowance } from "./stages/plan";
import type { WorkingCalendar } from "./types";

const catalogue = { cells: defaultCells, materials: defaultMaterials, rateCard: defaultRateCard };
const now = new Date("2027-03-01T09:00:00Z");
const run = (size: [number, number, number], options: AnalyseOptions = {}) => analyse({ bytes: binaryStl(box(...size)), fileName: "part.stl", options, catalogue, now });

describe("mean speed from segment lengths and acceleration", () => {
  // Uniform acceleration from rest to v over v²/2a, the same to stop: a segment ℓ ≥ v²/a takes
  // ℓ/v + v/a, a shorter one never reaches v and takes 2√(ℓ/a) (kinematics; arithmetic).
  it.each([
    { l: 1000, n: 1, v: 200, a: 500, t: 5.4, why: "long segment: 1000/200 + 200/500" },
    { l: 80, n: 1, v: 200, a: 500, t: 0.8, why: "exactly v²/a: both forms agree (0.4 + 0.4)" },
    { l: 40, n: 1, v: 200, a: 500, t: 2 * Math.sqrt(40 / 500), why: "short segment: triangular profile" },
    { l: 250, n: 4, v: 100, a: 1000, t: 4 * (2.5 + 0.1), why: "four corners of a 250 mm square" },
    { l: 500, n: 2, v: 250, a: 0, t: 4, why: "no acceleration given: length ÷ speed" },
  ])("$why", ({ l, n, v, a, t }) => {
    expect(segmentTimeS(l, n, v, a)).toBeCloseTo(t, 9);
  });

  it("keeps the mean inside the cell's 30–250 mm/s range (about 70–600 in/min on large cells: common practice)", async () => {
    for (const size of [[1000, 600, 400], [300, 200, 150], [2400, 1200, 600]] as [number, number, number][]) {
      const r = await run(size);
      const cell = defaultCells.find((c) => c.key === r.cell)!;
      expect(r.meanSpeedMmS).toBeGreaterThanOrEqual(Math.min(cell.speedMinMmS, r.speedMmS) - 1e-6);
      expect(r.meanSpeedMmS).toBeLessThanOrEqual(r.speedMmS + 1e-6);
      expect(r.meanSpeedMmS).toBeLessThan(r.speedMmS); // corners cost time
    }
  });
});

describe("shells", () => {
  // walls = ⌈(allowance + net wall) ÷ bead⌉, at least 2 (common practice: a printed wall holds
  // the finish allowance plus about 0.5 in of net wall after machining).
  it.each([
    { t: 6.35, bead: 20, net: 12.7, walls: 2 },
    { t: 6.35, bead: 10, net: 12.7, walls: 2 },
    { t: 12.7, bead: 10, net: 12.7, walls: 3 },
    { t: 25, bead: 12, net: 12.7, walls: 4 },
    { t: 0, bead: 25, net: 5, walls: 2 },
  ])("allowance $t mm, bead $bead mm → $walls walls", ({ t, bead, net, walls }) => {
    expect(wallsForAllowance(t, bead, net)).toBe(walls);
  });

  it("skins where the part has tops and bottoms; support ribs under a flat top the bead cannot bridge", () => {
    const area = new Float64Array(20).fill(1e6);
    const rules = { shellNetWallMm: 12.7, ribSpacingMm: 400, ribBeads: 1, skinLayers: 3, maxBridgeMm: 60 };
    const ex = shellExposure(area, 3, 5, rules);
    expect([...ex.skin]).toEqual([1e6, 1e6, 1e6, ...Array(14).fill(0), 1e6, 1e6, 1e6]);
    expect(ex.bridging).toBe("support-ribs");
    // 200 mm (half the 400 mm rib spacing) at 5 mm layers: the 40 layers below the top, here all 19 under it
    expect(ex.support[19]).toBe(0);
    expect(ex.support[0]).toBe(1e6);
    const direct = shellExposure(area, 3, 5, { ...rules, ribSpacingMm: 50 });
    expect(direct.bridging).toBe("direct");
    expect([...direct.support].every((v) => v === 0)).toBe(true);
  });

  it("a mold block is a shell by default: far lighter than solid, machined the same (only the allowance is removed)", async () => {
    const shell = await run([1800, 900, 450]);
    // machining depends on the build's bed face (left as printed), so compare the same cell and orientation
    const solid = await run([1800, 900, 450], { printMode: "solid", cellKey: shell.cell, orientation: shell.orientation });
    expect(shell.printMode).toBe("shell");
    expect(shell.shell).not.toBeNull();
    expect(solid.printMode).toBe("solid");
    expect(solid.shell).toBeNull();
    expect(shell.massKg).toBeLessThan(solid.massKg * 0.4);
    expect(shell.machiningHours).toBe(solid.machiningHours);
    expect(shell.allowanceVolumeMm3).toBe(solid.allowanceVolumeMm3);
    // deposited mass never exceeds the solid near-net mass
    expect(shell.depositedKg).toBeLessThan((shell.nearNetVolumeMm3 * shell.material.densityGPerCm3) / 1e6);
    // walls from the allowance and the bead
    expect(shell.shell!.walls).toBe(wallsForAllowance(shell.allowanceMm, shell.beadWidthMm, defaultRateCard.shellNetWallMm!));
    expect(shell.shell!.wallsFromAllowance).toBe(true);
    const byHand = await run([1800, 900, 450], { shellWalls: 4 });
    expect(byHand.shellWalls).toBe(4);
    expect(byHand.shell!.wallsFromAllowance).toBe(false);
  });
});

describe("the candidate search", () => {
  it("presets keep the layer between ¼ and ½ of the bead (common practice, checks.md), plus the cell's default", () => {
    for (const cell of defaultCells) {
      const p = presetsOf(cell);
      expect(p[0]).toEqual({ beadWidthMm: cell.defaultBeadWidthMm, layerHeightMm: cell.defaultLayerHeightMm });
      for (const x of p.slice(1)) expect(x.layerHeightMm / x.beadWidthMm).toBeGreaterThanOrEqual(0.25);
      for (const x of p.slice(1)) expect(x.layerHeightMm / x.beadWidthMm).toBeLessThanOrEqual(0.5);
    }
  });

  it("picks a plan no alternative beats on both total and date, and bills print time at the chosen cell's rate", async () => {
    const r = await run([1000, 600, 400]);
    expect(r.status).toBe("priced");
    expect(r.reviewReasons).toEqual([]);
    expect(r.alternatives[0]!.cell).toBe(r.cell);
    expect(r.alternatives[0]!.whyNot).toBe("");
    for (const a of r.alternatives.slice(1)) {
      expect(a.totalCents > r.totalCents || a.shipDate > r.shipDate || a.status !== "priced").toBe(true);
      expect(a.whyNot).not.toBe("");
    }
    const print = r.lines.find((l) => l.key === "print")!;
    expect(print.unitCents).toBe(defaultCells.find((c) => c.key === r.cell)!.printRateCentsPerH);
    expect(print.unit).toBe("h");
    expect(r.candidatesPlanned).toBeGreaterThan(3);
  });

  it("--cell X gives exactly the figures the search computed for X", async () => {
    const r = await run([1000, 600, 400]);
    for (const a of r.alternatives) {
      const forced = await run([1000, 600, 400], { cellKey: a.cell });
      expect(forced.cell).toBe(a.cell);
      expect({ total: forced.totalCents, ship: forced.shipDate, hours: forced.printHours, kg: forced.massKg, bead: forced.beadWidthMm, layer: forced.layerHeightMm })
        .toEqual({ total: a.totalCents, ship: a.shipDate, hours: a.printHours, kg: a.massKg, bead: a.beadWidthMm, layer: a.layerHeightMm });
    }
  });

  it("a plug whose layers no candidate keeps inside the cooling window needs review, still with staff's figures", async () => {
    const r = await run([2800, 5800, 1100]);
    expect(r.status).toBe("needs-review");
    expect(r.reviewReasons.map((x) => x.code)).toEqual(expect.arrayContaining(["layers-outside-window", "needs-engineer"]));
    expect(r.remedies.map((x) => x.code)).toEqual(expect.arrayContaining(["shell-walls", "preset", "cell", "split"]));
    expect(r.totalCents).toBeGreaterThan(0);
    expect(r.flaggedLayers).toBeGreaterThan(0);
  });

  it("a part longer than every cell, whose pieces the forced cell cannot build, needs review (split) rather than a plain price", async () => {
    // 7 m pieces stood on end do not fit the long bed's 1.8 m height, and it has no vertical build
    const r = await run([14000, 400, 300], { cellKey: "long-bed" });
    expect(r.pieces).toBeUndefined();
    expect(r.fitsAny).toBe(false);
    expect(r.status).toBe("needs-review");
    expect(r.reviewReasons.some((x) => x.code === "fits-no-cell")).toBe(true);
  });

  it("parts side by side lengthen short layers: less dwell for the order than one at a time", async () => {
    const one = await run([120, 100, 300], { cellKey: "compact" });
    expect(one.dwellHours).toBeGreaterThan(0);
    const six = await run([120, 100, 300], { cellKey: "compact", quantity: 6 });
    expect(six.batch.partsPerBuild).toBeGreaterThan(1);
    expect(six.dwellHours).toBeLessThan(one.dwellHours * 6);
    expect(six.remedies.some((x) => x.code === "side-by-side")).toBe(true);
  });
});

describe("printing runs continuously", () => {
  const cal: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
  // CST6CDT: UTC−6 in winter, UTC−5 from the second Sunday of March (US rules since 2007; memory).
  it.each([
    { at: "2027-01-15T12:00:00Z", hours: -6 },
    { at: "2027-07-15T12:00:00Z", hours: -5 },
    { at: "2027-03-14T07:59:00Z", hours: -6 },
    { at: "2027-03-14T08:01:00Z", hours: -5 },
  ])("the plant zone's offset at $at is $hours h", ({ at, hours }) => {
    expect(zoneOffsetMs(new Date(at).getTime(), "CST6CDT")).toBe(hours * 3_600_000);
  });

  it("prints through the weekend: print end − print start is exactly the deposition and dwell", () => {
    const plant = { timeZone: "CST6CDT", dayStartHour: 6, holidays: ["2027-03-08"] };
    const p = { queueHours: 0, setupHours: 2, printHours: 60, coolingHours: 12, machiningHours: 10, finishingDays: 2, inspectionDays: 1, packingDays: 1 };
    // Friday 2027-03-05 09:00 local (15:00Z)
    const s = continuousSchedule(new Date("2027-03-05T15:00:00Z"), cal, plant, p);
    expect(s.setupStart.toISOString()).toBe("2027-03-05T15:00:00.000Z");
    expect(s.printStart.toISOString()).toBe("2027-03-05T17:00:00.000Z");
    expect(s.printEnd.getTime() - s.printStart.getTime()).toBe(60 * 3_600_000);
    expect(s.coolingEnd.getTime() - s.printEnd.getTime()).toBe(12 * 3_600_000);
    // the ship date is an open day: not a weekend, not the plant's holiday
    const d = new Date(`${s.shipDate}T12:00:00Z`).getUTCDay();
    expect([0, 6]).not.toContain(d);
    expect(plant.holidays).not.toContain(s.shipDate);
  });

  it("set-up waits for a shift: a job arriving at 03:00 local starts its set-up at the 06:00 shift", () => {
    const plant = { timeZone: "CST6CDT", dayStartHour: 6, holidays: [] };
    const s = continuousSchedule(new Date("2027-03-02T09:00:00Z"), cal, plant, { queueHours: 0, setupHours: 2, printHours: 5, coolingHours: 4, machiningHours: 3, finishingDays: 0, inspectionDays: 0, packingDays: 0 });
    expect(s.setupStart.toISOString()).toBe("2027-03-02T12:00:00.000Z");
    expect(s.printStart.toISOString()).toBe("2027-03-02T14:00:00.000Z");
  });

  it("the estimate's print window holds only deposition and dwell, and the ship date is never a closed day", async () => {
    for (const size of [[1000, 600, 400], [2400, 1200, 900]] as [number, number, number][]) {
      const r = await run(size);
      const span = (Date.parse(r.schedule.printEnd) - Date.parse(r.schedule.printStart)) / 3_600_000;
      expect(span).toBeCloseTo(r.printHours + r.dwellHours, 2);
      expect(r.schedule.timeZone).toBe(defaultRateCard.plantTimeZone);
      expect(defaultRateCard.holidays).not.toContain(r.shipDate);
      expect([0, 6]).not.toContain(new Date(`${r.shipDate}T12:00:00Z`).getUTCDay());
      expect(r.schedule.shipDate).toBe(r.shipDate);
    }
  });
});
