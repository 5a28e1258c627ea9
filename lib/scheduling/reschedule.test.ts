import { describe, expect, it } from "vitest";
import { planBlocks } from "./blocks";
import { endBlockAt, moveJob, workingDaysMoved } from "./reschedule";

// Monday to Friday, two 8-hour shifts from 06:00 UTC.
const cal = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
const plant = { timeZone: "UTC", dayStartHour: 6, holidays: [] };
const d = (s: string) => new Date(`${s}:00Z`);
const iso = (x: Date) => x.toISOString().slice(0, 16);
// 8 working hours of print, 10 h cooling, 2 h machining, one finishing day
const dur = { printHours: 8, coolingHours: 10, machiningHours: 2, finishingDays: 1 };
const job = (orderId: string, start: string) => ({ orderId, blocks: planBlocks(d(start), dur, cal), durations: dur });

describe("moving a job on a cell", () => {
  it("pushes back the jobs it now overlaps, in order, and leaves clear ones alone", () => {
    // A Mon 06:00: print to 14:00, cooling to 24:00. B Tue 06:00 (print to 14:00, cooling to
    // Wed 00:00). C Thu 06:00. A delayed to Mon 20:00: print 20–22 and Tue 06–12, cooling to 22:00,
    // so B (from Tue 06:00) clashes and goes to the first free start after A's cooling, Wed 06:00
    // (print to 14:00, cooling to Thu 00:00); C on Thu 06:00 is clear and keeps its time.
    const [a, b, c] = [job("A", "2027-03-01T06:00"), job("B", "2027-03-02T06:00"), job("C", "2027-03-04T06:00")];
    const out = moveJob(a, d("2027-03-01T20:00"), [b, c], cal);
    expect(out.map((o) => o.orderId)).toEqual(["A", "B"]);
    expect(iso(out[0]!.blocks[1]!.endsAt)).toBe("2027-03-02T22:00");
    expect(iso(out[1]!.blocks[0]!.startsAt)).toBe("2027-03-03T06:00");
    expect(out[1]!.toShip.getTime()).toBeGreaterThan(out[1]!.fromShip.getTime());
  });

  it("moving a job earlier (it finishes early) pushes nobody", () => {
    const [a, b] = [job("A", "2027-03-03T06:00"), job("B", "2027-03-05T06:00")];
    const out = moveJob(a, d("2027-03-02T06:00"), [b], cal);
    expect(out).toHaveLength(1);
    expect(out[0]!.toShip.getTime()).toBeLessThan(out[0]!.fromShip.getTime());
  });
});

describe("a block ending at another time", () => {
  it("a print finished early brings its cooling, machining and finishing forward; one running late pushes the next job", () => {
    // A: print Mon 06:00–14:00, cooling to 24:00, machining Tue 06–08, finishing a day to Wed 08:00.
    // Its print ends at 12:00 instead: cooling to 22:00, machining Tue 06–08 (the next shift) as before.
    const a = job("A", "2027-03-01T06:00");
    const early = endBlockAt(a, "print", d("2027-03-01T12:00"), [], cal);
    expect(early[0]!.blocks.map((b) => `${b.kind} ${iso(b.startsAt)} ${iso(b.endsAt)}`)).toEqual([
      "print 2027-03-01T06:00 2027-03-01T12:00", "cooling 2027-03-01T12:00 2027-03-01T22:00",
      "machining 2027-03-02T06:00 2027-03-02T08:00", "finishing 2027-03-02T08:00 2027-03-03T08:00",
    ]);
    // Its cooling runs to Tue 12:00 instead: B, booked from Tue 06:00, now overlaps and goes after it
    // (its print at 12:00, on shift), and A's machining follows at 12:00.
    const b = job("B", "2027-03-02T06:00");
    const late = endBlockAt(a, "cooling", d("2027-03-02T12:00"), [b], cal);
    expect(late.map((r) => r.orderId)).toEqual(["A", "B"]);
    expect(iso(late[0]!.blocks[2]!.startsAt)).toBe("2027-03-02T12:00");
    expect(iso(late[1]!.blocks[0]!.startsAt)).toBe("2027-03-02T12:00");
    expect(() => endBlockAt(a, "print", d("2027-03-01T05:00"), [], cal)).toThrow(/before it started/);
  });
});

describe("working days a ship date moved", () => {
  it("counts open days between the two local dates, weekends and holidays not", () => {
    expect(workingDaysMoved(d("2027-03-05T20:00"), d("2027-03-05T21:00"), cal, plant)).toBe(0);
    // Friday → Monday: one working day (the Monday)
    expect(workingDaysMoved(d("2027-03-05T20:00"), d("2027-03-08T08:00"), cal, plant)).toBe(1);
    // Friday → Saturday: no working day in between
    expect(workingDaysMoved(d("2027-03-05T20:00"), d("2027-03-06T08:00"), cal, plant)).toBe(0);
    // earlier counts the same way; a plant holiday on the Monday is not a working day
    expect(workingDaysMoved(d("2027-03-09T08:00"), d("2027-03-05T20:00"), cal, { ...plant, holidays: ["2027-03-08"] })).toBe(1);
  });
});
