import { describe, expect, it } from "vitest";
import { amountDue, splitDeposit } from "./deposit";

describe("splitDeposit", () => {
  // Half up front is common practice for tooling work (DESIGN.md, rate card default 5000 bp).
  it.each([
    [1_910_500, 5000, 955_250, 955_250],
    [1_001, 5000, 501, 500], // half a cent rounds away from zero (lib/money.roundCents)
    [999, 3333, 333, 666], // 332.967 → 333
    [100_000, 10_000, 100_000, 0],
    [100_000, 0, 0, 100_000],
    [0, 5000, 0, 0],
  ])("total %i at %i bp → deposit %i, balance %i", (total, bp, dep, bal) => {
    const s = splitDeposit(total, bp);
    expect(s).toEqual({ depositCents: dep, balanceCents: bal });
    expect(s.depositCents + s.balanceCents).toBe(total);
  });

  it("always adds up and never goes negative over a sweep of totals and shares", () => {
    for (let total = 0; total < 5_000; total += 37) {
      for (const bp of [1, 2500, 3333, 5000, 6667, 9999]) {
        const s = splitDeposit(total, bp);
        expect(s.depositCents + s.balanceCents).toBe(total);
        expect(s.depositCents).toBeGreaterThanOrEqual(0);
        expect(s.balanceCents).toBeGreaterThanOrEqual(0);
        expect(Number.isInteger(s.depositCents)).toBe(true);
      }
    }
  });

  it("refuses fractional cents and out-of-range shares", () => {
    expect(() => splitDeposit(10.5, 5000)).toThrow(RangeError);
    expect(() => splitDeposit(-1, 5000)).toThrow(RangeError);
    expect(() => splitDeposit(100, 10_001)).toThrow(RangeError);
    expect(() => splitDeposit(100, 50.5)).toThrow(RangeError);
  });
});

describe("amountDue", () => {
  const order = { depositCents: 500, balanceCents: 700 };
  it("asks for the deposit until it is paid, then nothing", () => {
    expect(amountDue(order, "deposit", { deposit: false, balance: false })).toBe(500);
    expect(amountDue(order, "deposit", { deposit: true, balance: false })).toBeNull();
  });
  it("asks for the balance until it is paid", () => {
    expect(amountDue(order, "balance", { deposit: true, balance: false })).toBe(700);
    expect(amountDue(order, "balance", { deposit: true, balance: true })).toBeNull();
    expect(amountDue({ depositCents: 1200, balanceCents: 0 }, "balance", { deposit: true, balance: false })).toBeNull();
  });
});
