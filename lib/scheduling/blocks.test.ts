import { describe, expect, it } from "vitest";
import { findConflicts, firstFreeStart, jobDurations, overlaps, planBlocks, type ExistingBlock } from "./blocks";

// Monday to Friday, two 8-hour shifts from 06:00 UTC (the demo plant of DESIGN.md).
const cal = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
const iso = (d: Date) => d.toISOString();

describe("planBlocks", () => {
  it("lays print on working time, cooling over the night, machining and finishing on working time", () => {
    // Monday 2027-03-01 06:00; 20 h of print = Monday 16 h + Tuesday 4 h → Tue 10:00.
    const blocks = planBlocks(new Date("2027-03-01T06:00:00Z"), { printHours: 20, coolingHours: 24, machiningHours: 10, finishingDays: 2 }, cal);
    expect(blocks.map((b) => b.kind)).toEqual(["print", "cooling", "machining", "finishing"]);
    expect(iso(blocks[0]!.endsAt)).toBe("2027-03-02T10:00:00.000Z");
    expect(iso(blocks[1]!.endsAt)).toBe("2027-03-03T10:00:00.000Z"); // 24 calendar hours
    expect(iso(blocks[2]!.endsAt)).toBe("2027-03-03T20:00:00.000Z"); // 10 working hours
    // two working days of 16 h each: Wed 20:00 → Thu 20:00 → Fri 20:00
    expect(iso(blocks[3]!.endsAt)).toBe("2027-03-05T20:00:00.000Z");
  });
  it("starts a print asked for on a Saturday on Monday morning", () => {
    const [print] = planBlocks(new Date("2027-03-06T09:00:00Z"), { printHours: 1, coolingHours: 0, machiningHours: 0, finishingDays: 0 }, cal);
    expect(iso(print!.startsAt)).toBe("2027-03-08T06:00:00.000Z");
  });
  it("refuses negative durations", () => {
    expect(() => planBlocks(new Date(), { printHours: -1, coolingHours: 0, machiningHours: 0, finishingDays: 0 }, cal)).toThrow(RangeError);
  });
});

it("jobDurations adds print + dwell and machining per quantity, keeps the longest cooling", () => {
  const d = jobDurations(
    [
      { printHours: 10, dwellHours: 2, coolingHours: 8, machiningHours: 5, quantity: 2 },
      { printHours: 3, dwellHours: 0, coolingHours: 12, machiningHours: 1, quantity: 1 },
    ],
    4,
  );
  expect(d).toEqual({ printHours: 27, coolingHours: 12, machiningHours: 11, finishingDays: 4 });
  expect(() => jobDurations([], 1)).toThrow(RangeError);
});

describe("conflicts", () => {
  const other: ExistingBlock[] = [
    { orderId: "B", kind: "print", startsAt: new Date("2027-03-01T06:00:00Z"), endsAt: new Date("2027-03-01T20:00:00Z") },
    { orderId: "B", kind: "cooling", startsAt: new Date("2027-03-01T20:00:00Z"), endsAt: new Date("2027-03-02T08:00:00Z") },
    { orderId: "B", kind: "machining", startsAt: new Date("2027-03-02T08:00:00Z"), endsAt: new Date("2027-03-02T18:00:00Z") },
  ];
  const d = { printHours: 4, coolingHours: 2, machiningHours: 1, finishingDays: 0 };

  it("half-open intervals that only touch do not overlap", () => {
    const a = { startsAt: new Date(0), endsAt: new Date(10) };
    expect(overlaps(a, { startsAt: new Date(10), endsAt: new Date(20) })).toBe(false);
    expect(overlaps(a, { startsAt: new Date(9), endsAt: new Date(20) })).toBe(true);
  });
  it("finds a print that lands inside another job's cooling", () => {
    const c = findConflicts("A", planBlocks(new Date("2027-03-02T06:00:00Z"), d, cal), other);
    expect(c).toHaveLength(1);
    expect(c[0]!.with.kind).toBe("cooling");
  });
  it("ignores the other job's machining (off the cell) and the order's own blocks", () => {
    expect(findConflicts("A", planBlocks(new Date("2027-03-02T08:00:00Z"), d, cal), other)).toEqual([]);
    expect(findConflicts("B", planBlocks(new Date("2027-03-01T06:00:00Z"), d, cal), other)).toEqual([]);
  });
  it("firstFreeStart moves past the other job's cell time", () => {
    expect(iso(firstFreeStart("A", new Date("2027-03-01T06:00:00Z"), d, cal, other))).toBe("2027-03-02T08:00:00.000Z");
  });
});
