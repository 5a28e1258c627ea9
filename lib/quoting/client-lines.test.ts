import { describe, expect, it } from "vitest";
import { spreadMargin } from "./client-lines";

describe("spreadMargin", () => {
  it("adds the margin to the lines in proportion, to the cent", () => {
    // 25 % on 600.00 + 400.00: 150.00 and 100.00 (worked by hand)
    expect(spreadMargin([{ amountCents: 60_000 }, { amountCents: 40_000 }], 25_000).map((l) => l.amountCents)).toEqual([75_000, 50_000]);
    const odd = spreadMargin([{ amountCents: 1 }, { amountCents: 1 }, { amountCents: 1 }], 100);
    expect(odd.reduce((s, l) => s + l.amountCents, 0)).toBe(103);
  });
  it("leaves lines alone with no margin or nothing to spread over", () => {
    expect(spreadMargin([{ amountCents: 500 }], 0)).toEqual([{ amountCents: 500 }]);
    expect(spreadMargin([{ amountCents: 0 }], 300)).toEqual([{ amountCents: 0 }]);
  });
});
