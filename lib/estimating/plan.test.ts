import { describe, expect, it } from "vitest";
import { planLayers, downsampleLayers } from "./plan";
import { defaultCells, defaultMaterials } from "./defaults";

const cell = { speedMinMmS: 30, speedMaxMmS: 250, extruderOutputKgPerH: 1000 };
const material = { densityGPerCm3: 1.15, minLayerTimeS: 90, maxLayerTimeS: 600 };

function one(areaMm2: number, over: Partial<Parameters<typeof planLayers>[0]> = {}) {
  return planLayers({ areaMm2: new Float64Array([areaMm2]), perimeterMm: new Float64Array([4 * Math.sqrt(areaMm2)]), layerHeightMm: 5, beadWidthMm: 20, shellWalls: null, cell, material, ...over });
}

describe("layer-time plan", () => {
  it("deposition rate = ρ·w·h·v: 20 × 5 mm at 100 mm/s, 1.15 g/cm³ → 41.4 kg/h (checks.md, arithmetic)", () => {
    const p = one(1e6, { cell: { ...cell, extruderOutputKgPerH: 41.4, speedMaxMmS: 250 } });
    expect(p.speedMmS).toBeCloseTo(100, 9); // the extruder cap sets the speed
  });

  it("a long enough layer runs at full speed with no dwell", () => {
    const area = 20 * 250 * 200; // path 50 000 mm → 200 s at 250 mm/s
    const p = one(area);
    expect(p.timeS[0]).toBeCloseTo(200, 9);
    expect(p.dwellS[0]).toBe(0);
    expect(p.flaggedCount).toBe(0);
  });

  it("a short layer slows down to the minimum layer time", () => {
    const p = one(20 * 5000); // path 5000 mm: 20 s at 250 mm/s, 90 s needs 55.6 mm/s ≥ 30
    expect(p.timeS[0]).toBeCloseTo(90, 9);
    expect(p.dwellS[0]).toBe(0);
  });

  it("a very short layer also dwells once the speed is at the cell's minimum", () => {
    const p = one(20 * 600); // 600 mm at 30 mm/s = 20 s, dwell 70 s
    expect(p.timeS[0]).toBeCloseTo(20, 9);
    expect(p.dwellS[0]).toBeCloseTo(70, 9);
  });

  it("a layer longer than the cooling window is flagged", () => {
    const p = one(20 * 250 * 700);
    expect(p.flagged[0]).toBe(1);
    expect(p.flaggedCount).toBe(1);
  });

  it("shell walls lay the contour N times instead of filling the section", () => {
    const p = one(1e6, { shellWalls: 2 });
    expect(p.pathMm[0]).toBeCloseTo(2 * 4000, 9);
  });

  it("the demo cells' speeds and outputs sit inside the trade's ranges (checks.md; common practice)", () => {
    for (const c of defaultCells) {
      for (const m of defaultMaterials) {
        const p = planLayers({ areaMm2: new Float64Array([1e6]), perimeterMm: new Float64Array([4000]), layerHeightMm: c.defaultLayerHeightMm, beadWidthMm: c.defaultBeadWidthMm, shellWalls: null, cell: c, material: m });
        // print speeds ~30–250 mm/s
        expect(p.speedMmS).toBeGreaterThanOrEqual(30);
        expect(p.speedMmS).toBeLessThanOrEqual(250);
        const kgPerH = (m.densityGPerCm3 * c.defaultBeadWidthMm * c.defaultLayerHeightMm * p.speedMmS * 3600) / 1e6;
        expect(kgPerH).toBeLessThanOrEqual(c.extruderOutputKgPerH + 1e-9);
        // layer height about 0.25–0.5 × bead width (common practice)
        expect(c.defaultLayerHeightMm / c.defaultBeadWidthMm).toBeGreaterThanOrEqual(0.2);
        expect(c.defaultLayerHeightMm / c.defaultBeadWidthMm).toBeLessThanOrEqual(0.5);
        // minimum layer time about 1–3 min (Compton et al. 2017, memory; common practice)
        expect(m.minLayerTimeS).toBeGreaterThanOrEqual(60);
        expect(m.minLayerTimeS).toBeLessThanOrEqual(180);
      }
    }
  });

  it("downsamples to at most 2000 points, keeping flags", () => {
    const n = 5000;
    const area = new Float64Array(n).fill(20 * 600);
    area[4321] = 20 * 250 * 700;
    const p = planLayers({ areaMm2: area, perimeterMm: new Float64Array(n), layerHeightMm: 5, beadWidthMm: 20, shellWalls: null, cell, material });
    const c = downsampleLayers(0, 5, p);
    expect(c.zMm.length).toBeLessThanOrEqual(2000);
    expect(c.flagged.filter(Boolean).length).toBe(1);
  });
});
