import { describe, expect, it } from "vitest";
import { forCells, parseQueueArgs, queueFromRows, unscheduledOf } from "./queue";

const H = 3_600_000;
const NOW = Date.parse("2027-03-01T06:00:00Z");

describe("the queue from the calendar", () => {
  it("print and cooling hold the cell, machining the router, finishing neither; slack is promised minus planned", () => {
    const job = { ref: "R-1", plannedShipMs: NOW + 100 * H, promisedShipMs: NOW + 124 * H };
    const q = queueFromRows(NOW, [
      { cellKey: "bed", kind: "print", startsAt: NOW, endsAt: NOW + 10 * H, ...job },
      { cellKey: "bed", kind: "cooling", startsAt: NOW + 10 * H, endsAt: NOW + 14 * H, ...job },
      { cellKey: "bed", kind: "machining", startsAt: NOW + 20 * H, endsAt: NOW + 23 * H, ...job },
      { cellKey: "bed", kind: "finishing", startsAt: NOW + 23 * H, endsAt: NOW + 60 * H, ...job },
      { cellKey: "bed", kind: "print", startsAt: NOW - 20 * H, endsAt: NOW - 10 * H, ref: "past" },
      { cellKey: "router", kind: "maintenance", startsAt: NOW, endsAt: NOW + 8 * H, ref: "spindle service" },
    ], [{ cellKey: "bed", cellHours: 12, machiningHours: 2 }, { cellKey: "tall", cellHours: 5, machiningHours: 0 }]);
    // the promise is 24 h after the plan: each span may end up to 24 h later
    expect(q.booked!.bed).toEqual([
      { startMs: NOW, endMs: NOW + 10 * H, kind: "job", ref: "R-1", latestEndMs: NOW + 34 * H },
      { startMs: NOW + 10 * H, endMs: NOW + 14 * H, kind: "job", ref: "R-1", latestEndMs: NOW + 38 * H },
    ]);
    expect(q.booked!.router).toEqual([
      { startMs: NOW + 20 * H, endMs: NOW + 23 * H, kind: "job", ref: "R-1", latestEndMs: NOW + 47 * H },
      { startMs: NOW, endMs: NOW + 8 * H, kind: "block", ref: "spindle service" },
    ]);
    expect(q.hours).toEqual({ bed: 12, router: 2, tall: 5 });
    expect(forCells(q, ["bed"]).hours).toEqual({ bed: 12, router: 2 });
  });

  it("an accepted part's hours from its estimate", () => {
    expect(unscheduledOf({ cell: "bed", printHours: 10, dwellHours: 1, coolingHours: 4, machiningHours: 3, batch: { partsPerBuild: 1, builds: 2 } })).toEqual({ cellKey: "bed", cellHours: 19, machiningHours: 3 });
    expect(unscheduledOf({ printHours: 10 })).toBeNull();
  });
});

describe("--queue CELL=HOURS", () => {
  const cells = ["long-bed", "compact"];
  it("adds up repeated entries, the router included", () => {
    expect(parseQueueArgs(["long-bed=40", "router=12", "long-bed=8.5"], cells)).toEqual({ "long-bed": 48.5, router: 12 });
  });
  it("refuses an unknown cell, negative or missing hours, and a malformed entry, naming it", () => {
    expect(() => parseQueueArgs(["lathe=4"], cells)).toThrow(/unknown cell "lathe".*long-bed, compact/);
    expect(() => parseQueueArgs(["compact=-3"], cells)).toThrow(/cannot be negative/);
    expect(() => parseQueueArgs(["compact="], cells)).toThrow(/needs a number/);
    expect(() => parseQueueArgs(["compact=lots"], cells)).toThrow(/needs a number/);
    expect(() => parseQueueArgs(["compact"], cells)).toThrow(/CELL=HOURS/);
  });
});
