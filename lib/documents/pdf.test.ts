import { describe, expect, it } from "vitest";
import { linesAsBilled } from "./pdf-blocks";

describe("the lines as billed", () => {
  it("carry the margin inside their amounts, add up to the total before tax, and drop lines that do not apply", () => {
    const lines = [
      { kind: "material", description: "Material", quantity: 100, unitCents: 5_000, amountCents: 500_000 },
      { kind: "print", description: "Printing cell time", quantity: 10, unitCents: 15_000, amountCents: 150_000 },
      { kind: "dwell", description: "Cooling dwell between layers", quantity: 0, unitCents: 6_500, amountCents: 0 },
    ];
    const billed = linesAsBilled(lines, 162_500);
    expect(billed.map((l) => l.description)).toEqual(["Material", "Printing cell time"]);
    expect(billed.reduce((s, l) => s + l.amountCents, 0)).toBe(650_000 + 162_500);
    expect(billed[0]!.amountCents).toBe(625_000);
    expect(billed[0]!.unitCents).toBe(6_250);
  });
});
