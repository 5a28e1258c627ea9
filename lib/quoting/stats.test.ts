import { describe, expect, it } from "vitest";
import { errorStats, inboxOrder, turnaround, winRate } from "./stats";

const now = new Date("2027-05-01T00:00:00Z");

describe("winRate", () => {
  it("counts each request once by its best live quote; superseded and drafts do not count", () => {
    const r = winRate(
      [
        { requestId: "a", status: "superseded", validUntil: null },
        { requestId: "a", status: "accepted", validUntil: null },
        { requestId: "b", status: "declined", validUntil: null },
        { requestId: "c", status: "issued", validUntil: new Date("2027-04-01T00:00:00Z") }, // lapsed → lost
        { requestId: "d", status: "issued", validUntil: new Date("2027-06-01T00:00:00Z") }, // still open
        { requestId: "e", status: "draft", validUntil: null },
      ],
      now,
    );
    expect(r).toEqual({ won: 1, lost: 2, open: 1, rate: 1 / 3 });
  });
  it("is null while nothing is decided", () => expect(winRate([], now).rate).toBeNull());
});

describe("turnaround", () => {
  it("gives mean, median and max hours over requests with both dates", () => {
    const h = (n: number) => new Date(Date.UTC(2027, 0, 1) + n * 3_600_000);
    const t = turnaround([
      { submittedAt: h(0), firstIssuedAt: h(4) },
      { submittedAt: h(0), firstIssuedAt: h(10) },
      { submittedAt: h(0), firstIssuedAt: h(30) },
      { submittedAt: h(0), firstIssuedAt: null },
    ]);
    expect(t).toEqual({ count: 3, meanHours: 44 / 3, medianHours: 10, maxHours: 30 });
  });
  it("is empty with no quoted request", () => expect(turnaround([]).meanHours).toBeNull());
});

it("inboxOrder puts the nearest due date first, then the oldest submission", () => {
  const d = (s: string) => new Date(s);
  const rows = [
    { id: "late-due", neededBy: d("2027-09-01"), submittedAt: d("2027-01-01") },
    { id: "no-due-old", neededBy: null, submittedAt: d("2026-12-01") },
    { id: "soon-due", neededBy: d("2027-02-01"), submittedAt: d("2027-01-20") },
    { id: "no-due-new", neededBy: null, submittedAt: d("2027-01-10") },
  ];
  expect(inboxOrder(rows).map((r) => r.id)).toEqual(["soon-due", "late-due", "no-due-old", "no-due-new"]);
});

it("errorStats gives the mean and sample standard deviation of the relative error in %", () => {
  // errors +10 %, −10 %, +30 % → mean 10 %, sample sd = sqrt((0 + 400 + 400) / 2) = 20 %
  const s = errorStats([
    { estimate: 10, actual: 11 },
    { estimate: 10, actual: 9 },
    { estimate: 10, actual: 13 },
  ]);
  expect(s.count).toBe(3);
  expect(s.meanPct).toBeCloseTo(10, 9);
  expect(s.spreadPct).toBeCloseTo(20, 9);
});
