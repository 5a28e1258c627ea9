import { describe, expect, it } from "vitest";
import { filesDeleteAfter, retentionCutoff, retentionText, utcDay } from "./policy";

describe("retention dates", () => {
  const closed = new Date("2026-01-10T15:00:00Z");
  it("files are due the given number of days after the order finished, and the cutoff agrees", () => {
    const due = filesDeleteAfter(closed, 30);
    expect(due.toISOString()).toBe("2026-02-09T15:00:00.000Z");
    expect(retentionCutoff(due, 30).getTime()).toBe(closed.getTime());
    expect(retentionCutoff(new Date(due.getTime() - 1), 30).getTime()).toBeLessThan(closed.getTime());
  });
  it("names the day in UTC and words the period", () => {
    expect(utcDay(new Date("2026-03-01T23:59:59Z"))).toBe("2026-03-01");
    expect(retentionText(180)).toBe("180 days");
    expect(retentionText(365)).toBe("1 year");
    expect(retentionText(730)).toBe("2 years");
    expect(retentionText(1)).toBe("1 day");
  });
});
