import { describe, expect, it } from "vitest";
import { addWorkingHours, shipSchedule } from "./schedule";
import type { WorkingCalendar } from "./types";

const cal: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: ["2027-03-03"] };

describe("working calendar", () => {
  it("counts only shift hours on working days", () => {
    // Monday 2027-03-01 06:00 UTC + 16 h = Monday 22:00
    expect(addWorkingHours(new Date("2027-03-01T06:00:00Z"), 16, cal).toISOString()).toBe("2027-03-01T22:00:00.000Z");
    // + 17 h runs into Tuesday 07:00
    expect(addWorkingHours(new Date("2027-03-01T06:00:00Z"), 17, cal).toISOString()).toBe("2027-03-02T07:00:00.000Z");
    // Friday evening + 1 h = Monday 07:00
    expect(addWorkingHours(new Date("2027-03-05T21:30:00Z"), 1, cal).toISOString()).toBe("2027-03-08T06:30:00.000Z");
  });
  it("skips holidays", () => {
    expect(addWorkingHours(new Date("2027-03-02T21:00:00Z"), 2, cal).toISOString()).toBe("2027-03-04T07:00:00.000Z");
  });
  it("a ship date is later with a queue ahead and never on a weekend", () => {
    const p = { queueHours: 0, printHours: 20, coolingHours: 12, machiningHours: 10, finishingDays: 2, inspectionDays: 1, packingDays: 1 };
    const now = new Date("2027-03-01T09:00:00Z");
    const a = shipSchedule(now, cal, p), b = shipSchedule(now, cal, { ...p, queueHours: 80 });
    expect(b.shipDate > a.shipDate).toBe(true);
    for (const s of [a, b]) expect([0, 6]).not.toContain(new Date(`${s.shipDate}T12:00:00Z`).getUTCDay());
    expect(a.coolingEnd.getTime() - a.printEnd.getTime()).toBe(12 * 3_600_000);
  });
});
