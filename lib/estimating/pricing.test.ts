import { describe, expect, it } from "vitest";
import { applyBp, roundCents } from "./money";
import { price } from "./pricing";
import { defaultRateCard } from "./defaults";

describe("money", () => {
  it("rounds half away from zero, once", () => {
    expect(roundCents(0.5)).toBe(1);
    expect(roundCents(1.4999)).toBe(1);
    expect(roundCents(-0.5)).toBe(-1);
    expect(Object.is(roundCents(-0.2), 0)).toBe(true);
    expect(applyBp(10_001, 5_000)).toBe(5_001);
    expect(() => roundCents(NaN)).toThrow();
  });
});

describe("pricing", () => {
  const base = { quantity: 1, massKg: 100, materialPricePerKgCents: 1400, printHours: 10, dwellHours: 1, machiningHours: 5, netAreaMm2: 2e6, crateSizeMm: [1000, 1000, 1000] as [number, number, number], partMassKg: 80, options: {} };
  it("lines are integer cents and add up to the total", () => {
    const p = price(base, defaultRateCard);
    for (const l of p.lines) expect(Number.isInteger(l.amountCents)).toBe(true);
    expect(p.subtotalCents).toBe(p.lines.reduce((s, l) => s + l.amountCents, 0));
    expect(p.totalCents).toBe(p.subtotalCents + p.marginCents + p.taxCents);
    expect(p.depositCents + p.balanceCents).toBe(p.totalCents);
    expect(p.lines.find((l) => l.key === "material")!.amountCents).toBe(140_000);
    expect(p.lines.find((l) => l.key === "print")!.amountCents).toBe(10 * defaultRateCard.printRateCentsPerH);
  });
  it("deposit is half by default (common practice) and margin/tax follow the card", () => {
    const card = { ...defaultRateCard, marginBp: 2000, taxBp: 825 };
    const p = price(base, card);
    expect(p.marginCents).toBe(Math.round(p.subtotalCents * 0.2));
    expect(p.taxCents).toBe(Math.round((p.subtotalCents + p.marginCents) * 0.0825));
    expect(Math.abs(p.depositCents - p.totalCents / 2)).toBeLessThanOrEqual(0.5);
  });
  it("options add their lines", () => {
    const p = price({ ...base, options: { sealingCoat: true, vacuumTest: true } }, defaultRateCard);
    expect(p.lines.find((l) => l.key === "sealing")!.amountCents).toBe(2 * defaultRateCard.sealingCoatCentsPerM2);
    expect(p.lines.find((l) => l.key === "vacuum-test")!.amountCents).toBe(defaultRateCard.vacuumTestCents);
  });
});
