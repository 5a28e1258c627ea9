import { describe, expect, it } from "vitest";
import { formatDate, formatDateTime, formatDay, fromPlantInput, nextPlantMonday, plantDay, toPlantInput } from "./dates";

// Offsets from the IANA tz database (America/Chicago: UTC−6 in winter, UTC−5 from the second
// Sunday of March, 2027-03-14 02:00 local).
const Z = "America/Chicago";

describe("plant time", () => {
  it("shows an instant in the plant's zone, named", () => {
    expect(formatDateTime("2026-12-02T17:30:00Z", Z)).toBe("2 Dec 2026, 11:30 CST");
    expect(formatDateTime("2027-06-02T17:30:00Z", Z)).toBe("2 Jun 2027, 12:30 CDT");
    // Late evening in the plant is still the day before in UTC terms shown locally.
    expect(formatDate("2026-12-03T03:00:00Z", Z)).toBe("2 Dec 2026");
    expect(plantDay("2026-12-03T03:00:00Z", Z)).toBe("2026-12-02");
  });
  it("shows a stored calendar day as written, whatever the zone", () => {
    expect(formatDay("2026-12-10")).toBe("10 Dec 2026");
    expect(formatDay(null)).toBe("—");
    expect(formatDate(null)).toBe("—");
  });
  it("reads staff's typed wall-clock time in the plant's zone, and writes it back the same", () => {
    expect(fromPlantInput("2026-12-07T06:00", Z)!.toISOString()).toBe("2026-12-07T12:00:00.000Z");
    expect(fromPlantInput("2027-06-07T06:00", Z)!.toISOString()).toBe("2027-06-07T11:00:00.000Z");
    expect(toPlantInput(new Date("2026-12-07T12:00:00Z"), Z)).toBe("2026-12-07T06:00");
    expect(fromPlantInput("2026-02-31T06:00", Z)).toBeNull();
    expect(fromPlantInput("next monday", Z)).toBeNull();
  });
  it("finds the next Monday 06:00 in the plant", () => {
    // Wednesday 2 Dec 2026 → Monday 7 Dec 2026 06:00 CST = 12:00 UTC
    expect(nextPlantMonday(new Date("2026-12-02T17:00:00Z"), 6, Z).toISOString()).toBe("2026-12-07T12:00:00.000Z");
    // Sunday night 23:30 in the plant (already Monday in UTC) → the next day, Monday 7 Dec
    expect(nextPlantMonday(new Date("2026-12-07T05:30:00Z"), 6, Z).toISOString()).toBe("2026-12-07T12:00:00.000Z");
  });
});
