import { describe, expect, it } from "vitest";
import { layerPoints } from "./layer-chart";

describe("layerPoints", () => {
  const chart = { zMm: [-154, -149, 846], timeS: [100.4, 120, 130], dwellS: [20, 0, 0], flagged: [false, false, true], stride: 1 };
  it("measures height from the bottom of the print, so the axis starts at 0", () => {
    expect(layerPoints(chart, "mm").map((p) => p.height)).toEqual([0, 5, 1000]);
    // 1000 mm = 39.37 in (exact inch: 25.4 mm)
    expect(layerPoints(chart, "in").at(-1)!.height).toBe(39.37);
  });
  it("keeps times in seconds and marks only flagged layers", () => {
    expect(layerPoints(chart, "mm").map((p) => [p.time, p.total, p.isFlagged])).toEqual([[100, 120, false], [120, 120, false], [130, 130, true]]);
  });
});
