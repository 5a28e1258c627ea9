import { describe, expect, it } from "vitest";
import { planMachining, scallopHeight, stepoverForScallop, TRIM_FEED_FALLBACK_MM_PER_MIN } from "./machining";
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

describe("machining as it is done", () => {
  const card = defaultRateCard;
  const s = stepoverForScallop(card.cutterRadiusMm, card.targetScallopMm);
  it("the bed face is left as printed unless asked: its area is not finished and its allowance not roughed", () => {
    const whole = planMachining(5e7, 3e6, card);
    const left = planMachining(5e7, 3e6, card, { bedFaceMm2: 1e6, allowanceMm: 6.35 });
    expect(left.bedFaceFinished).toBe(false);
    expect(left.setups).toBe(1);
    // t = A/(s·f): 1 m² less to finish (Machinery's Handbook stepover, checks.md)
    expect(whole.finishingHours - left.finishingHours).toBeCloseTo(1e6 / (s * card.finishingFeedMmPerMin) / 60, 9);
    expect(whole.roughingHours - left.roughingHours).toBeCloseTo((1e6 * 6.35) / card.roughingRemovalMm3PerMin / 60, 9);
  });
  it("asked to finish both faces: a second set-up, the part flipped", () => {
    const both = planMachining(5e7, 3e6, card, { bedFaceMm2: 1e6, allowanceMm: 6.35, finishBedFace: true });
    expect(both.setups).toBe(2);
    expect(both.setupHours).toBe(2 * card.machiningSetupHours);
    expect(both.finishingHours).toBeCloseTo(planMachining(5e7, 3e6, card).finishingHours, 9);
  });
  it("an open mold's trim line: length ÷ trim feed, plus one tool change", () => {
    const m = planMachining(0, 1e6, card, { bedFaceMm2: 0, allowanceMm: 6.35, trimLengthMm: 6000 });
    expect(m.trimHours).toBeCloseTo(6000 / TRIM_FEED_FALLBACK_MM_PER_MIN / 60, 9);
    expect(m.toolChangeHours).toBeCloseTo(((card.toolChangeCount + 1) * card.toolChangeMinutes) / 60, 9);
  });
});
