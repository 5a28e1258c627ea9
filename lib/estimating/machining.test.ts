import { describe, expect, it } from "vitest";
import { planMachining, scallopHeight, stepoverForScallop } from "./machining";
import { defaultRateCard } from "./defaults";

describe("machining (Machinery's Handbook scallop formula, via checks.md)", () => {
  it.each([
    [3, 0.5, 0.010435], [5, 0.5, 0.006254], [6.35, 1.27, 0.03183], [12.7, 2.54, 0.06366],
  ])("R=%f, s=%f → h=%f", (R, s, h) => {
    expect(scallopHeight(R, s)).toBeCloseTo(h, 6);
  });
  it("R=6.35, h=0.0254 → s=1.13479 mm", () => {
    expect(stepoverForScallop(6.35, 0.0254)).toBeCloseTo(1.13479, 5);
  });
  it("the default stepover is 5–10 % of the cutter diameter (common practice)", () => {
    const s = stepoverForScallop(defaultRateCard.cutterRadiusMm, defaultRateCard.targetScallopMm) / (2 * defaultRateCard.cutterRadiusMm);
    expect(s).toBeGreaterThanOrEqual(0.05);
    expect(s).toBeLessThanOrEqual(0.1);
  });
  it("finishing t = A/(s·f): 3 m² at 1.27 mm and 5000 mm/min → 7.874 h (checks.md)", () => {
    const card = { ...defaultRateCard, cutterRadiusMm: 6.35, targetScallopMm: scallopHeight(6.35, 1.27), finishingFeedMmPerMin: 5000 };
    const m = planMachining(0, 3e6, card);
    expect(m.finishingHours).toBeCloseTo(7.874, 3);
    expect(m.roughingHours).toBe(0);
    expect(m.totalHours).toBeCloseTo(7.874 + (card.toolChangeCount * card.toolChangeMinutes) / 60 + card.machiningSetupHours, 3);
  });
  it("roughing = allowance volume ÷ removal rate", () => {
    const m = planMachining(defaultRateCard.roughingRemovalMm3PerMin * 60, 0, defaultRateCard);
    expect(m.roughingHours).toBeCloseTo(1, 12);
  });
});
