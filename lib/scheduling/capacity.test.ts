import { describe, expect, it } from "vitest";
import { capacityWeeks, plantMonday } from "./capacity";

// Monday to Friday, two 8-hour shifts from 06:00 UTC: 80 working hours a week.
const cal = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
const plant = { timeZone: "UTC", dayStartHour: 6, holidays: [] };
const d = (s: string) => new Date(`${s}:00Z`);
const now = d("2027-03-03T10:00"); // a Wednesday

describe("capacity by week", () => {
  it("the week starts on the plant's Monday", () => {
    expect(plantMonday(now, plant)).toBe("2027-03-01");
    // 03:00 UTC on Monday is still Sunday evening six hours behind UTC
    expect(plantMonday(d("2027-03-08T03:00"), { ...plant, timeZone: "Etc/GMT+6" })).toBe("2027-03-01");
  });

  it("counts booked shift hours per week, the jobs behind them, blocks, and flags an overloaded week", () => {
    const out = capacityWeeks({
      fromMonday: "2027-03-01", weeks: 3, now, plant,
      resources: [{ key: "bed", name: "Bed", calendar: cal }],
      // R-1 holds Mon 06:00 → Wed 22:00 (three 16 h days = 48 h) and, across the weekend, Fri 14:00 → Mon 14:00
      // (Fri 8 h, then Mon 8 h in the next week)
      held: [
        { resourceKey: "bed", orderId: "o1", reference: "R-1", startsAt: d("2027-03-01T06:00"), endsAt: d("2027-03-03T22:00") },
        { resourceKey: "bed", orderId: "o2", reference: "R-2", startsAt: d("2027-03-05T14:00"), endsAt: d("2027-03-08T14:00") },
      ],
      // R-3 waits: 70 h promised for Fri 19 Mar, so due in the week before (8 Mar), where with R-2's 8 h
      // and a 16 h block it exceeds 80 h
      waiting: [{ resourceKey: "bed", orderId: "o3", reference: "R-3", hours: 70, promisedShip: d("2027-03-19T00:00") }],
      blocks: [{ resourceKey: "bed", startsAt: d("2027-03-09T00:00"), endsAt: d("2027-03-10T00:00"), reason: "nozzle rebuild" }],
    });
    const [w1, w2, w3] = out[0]!.weeks;
    expect(w1).toMatchObject({ weekStart: "2027-03-01", availableHours: 80, bookedHours: 56, waitingHours: 0, blockedHours: 0, isOverloaded: false });
    expect(w1!.jobs.map((j) => [j.reference, j.hours])).toEqual([["R-1", 48], ["R-2", 8]]);
    expect(w2).toMatchObject({ weekStart: "2027-03-08", bookedHours: 8, waitingHours: 70, blockedHours: 16, isOverloaded: true });
    expect(w2!.blocks).toEqual([{ reason: "nozzle rebuild", hours: 16 }]);
    expect(w3).toMatchObject({ bookedHours: 0, isOverloaded: false });
  });
});
