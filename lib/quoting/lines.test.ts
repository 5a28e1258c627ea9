import { describe, expect, it } from "vitest";
import { checkLines, lineAmount, linesFromEstimates, parseMoneyToCents, quoteTotals, validUntil, type DraftLine } from "./lines";

const estimate = {
  partId: "p1",
  partName: "Layup mold",
  lines: [
    { key: "material", label: "Material", quantity: 412.5, unit: "kg", unitCents: 1_850, amountCents: 763_125 },
    { key: "dwell", label: "Cooling dwell", quantity: 3.25, unit: "h", unitCents: 6_500, amountCents: 21_125 },
    { key: "vacuum-test", label: "Vacuum-integrity test", quantity: 1, unit: "part", unitCents: 35_000, amountCents: 35_000 },
  ],
};

describe("linesFromEstimates", () => {
  it("keeps each estimate amount as estimatedCents and maps keys to line kinds", () => {
    const lines = linesFromEstimates([estimate]);
    expect(lines.map((l) => l.kind)).toEqual(["material", "print", "option"]);
    expect(lines.every((l) => l.estimatedCents === l.amountCents && l.editReason === null)).toBe(true);
    expect(lines[0]!.description).toBe("Material");
  });
  it("names the part when a request has several", () => {
    const lines = linesFromEstimates([estimate, { ...estimate, partId: "p2", partName: "Trim fixture" }]);
    expect(lines).toHaveLength(6);
    expect(lines[3]!.description).toBe("Trim fixture: Material");
    expect(lines[3]!.partId).toBe("p2");
  });
});

describe("checkLines", () => {
  const base = linesFromEstimates([estimate]);
  it("accepts untouched estimate lines", () => expect(checkLines(base)).toEqual([]));
  it("wants a reason for an edited line and for an added line", () => {
    const edited: DraftLine = { ...base[0]!, unitCents: 1_700, amountCents: lineAmount(412.5, 1_700) };
    const added: DraftLine = { partId: null, kind: "freight", description: "Escort", quantity: 1, unitCents: 90_000, amountCents: 90_000, estimatedCents: null, editReason: " " };
    const problems = checkLines([edited, added]);
    expect(problems.map((p) => p.index)).toEqual([0, 1]);
    expect(checkLines([{ ...edited, editReason: "Volume price agreed" }, { ...added, editReason: "Wide load" }])).toEqual([]);
  });
  it("refuses an amount that is not quantity × unit price", () => {
    expect(checkLines([{ ...base[0]!, amountCents: 1 }])[0]!.message).toMatch(/quantity × unit/);
  });
  it("refuses an empty quote", () => expect(checkLines([])).toHaveLength(1));
  it("accepts an untouched estimate line whose shown quantity is rounded to 0.001", () => {
    // 412.5004 kg × 1850 ¢ = 763 125.74 → 763 126 ¢, shown as 412.5 kg
    const l: DraftLine = { partId: "p", kind: "material", description: "Material", quantity: 412.5, unitCents: 1_850, amountCents: 763_126, estimatedCents: 763_126, editReason: null };
    expect(checkLines([l])).toEqual([]);
    expect(checkLines([{ ...l, amountCents: 763_130, estimatedCents: 763_130 }])).toHaveLength(1);
  });
});

describe("quoteTotals", () => {
  it("applies margin, then tax on subtotal + margin, then the deposit share (worked by hand)", () => {
    // subtotal 100 000.00 → margin 25 % = 25 000.00 → tax 8.25 % of 125 000.00 = 10 312.50
    // total 135 312.50 → deposit 50 % = 67 656.25, balance 67 656.25
    const t = quoteTotals([{ amountCents: 6_000_000 }, { amountCents: 4_000_000 }], { marginBp: 2_500, taxBp: 825, depositBp: 5_000 });
    expect(t).toEqual({
      subtotalCents: 10_000_000,
      marginCents: 2_500_000,
      taxCents: 1_031_250,
      totalCents: 13_531_250,
      depositCents: 6_765_625,
      balanceCents: 6_765_625,
    });
  });
  it("rounds half away from zero once per step and keeps deposit + balance = total", () => {
    // 333 cents × 33.33 % = 110.9889 → 111; total 444; deposit 50 % = 222
    const t = quoteTotals([{ amountCents: 333 }], { marginBp: 3_333, taxBp: 0, depositBp: 5_000 });
    expect(t.marginCents).toBe(111);
    expect(t.depositCents + t.balanceCents).toBe(t.totalCents);
  });
  it("refuses negative or fractional rates and a deposit above the total", () => {
    expect(() => quoteTotals([], { marginBp: -1, taxBp: 0, depositBp: 0 })).toThrow(RangeError);
    expect(() => quoteTotals([], { marginBp: 1.5, taxBp: 0, depositBp: 0 })).toThrow(RangeError);
    expect(() => quoteTotals([], { marginBp: 0, taxBp: 0, depositBp: 10_001 })).toThrow(RangeError);
  });
});

describe("parseMoneyToCents", () => {
  it.each([
    ["1,234.56", 123_456],
    ["$80", 8_000],
    ["0.1", 10],
    ["19.99", 1_999],
    ["-5.5", -550],
  ])("%s → %i cents", (s, c) => expect(parseMoneyToCents(s)).toBe(c));
  it.each(["", "abc", "1.234", "1e5", "12..3"])("refuses %j", (s) => expect(parseMoneyToCents(s)).toBeNull());
});

it("validUntil adds whole days", () => {
  expect(validUntil(new Date("2027-03-01T10:00:00Z"), 30).toISOString()).toBe("2027-03-31T10:00:00.000Z");
});
