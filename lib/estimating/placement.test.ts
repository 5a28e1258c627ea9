import { describe, expect, it } from "vitest";
import { Ledger, Timeline, type BookedSpan, type CapacityQueue } from "./ledger";
import { placeExpedited } from "./expedite";
import { placeJob, type JobSpec, type PrintSpec } from "./placement";
import { UTC_PLANT } from "./schedule";
import type { WorkingCalendar } from "./types";

// Two 8 h shifts from 06:00 UTC, Monday to Friday: working time is 06:00–22:00 on weekdays.
const cal: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
const t = (iso: string) => new Date(`${iso}:00Z`).getTime();
const iso = (ms: number) => new Date(ms).toISOString().slice(0, 16);
// Monday 2027-03-01 06:00, the start of the first shift
const NOW = t("2027-03-01T06:00");

const print: PrintSpec = { cellKey: "bed", calendar: cal, setupHours: 2, dryingHours: 0, printHours: 10, coolingHours: 4, removalHours: 1, machiningHours: 3 };
const job = (prints: PrintSpec[] = [print], afterDays = 0): JobSpec => ({ prints, routerCalendar: cal, joinHours: 0, afterDays, shipCalendar: cal });
const ledger = (q: CapacityQueue = {}) => new Ledger(q, NOW, UTC_PLANT);
const span = (a: string, b: string, more: Partial<BookedSpan> = {}): BookedSpan => ({ startMs: t(a), endMs: t(b), ...more });

describe("timeline", () => {
  it("merges touching intervals and finds the first overlap", () => {
    const tl = new Timeline();
    tl.add(10, 20); tl.add(30, 40); tl.add(20, 25); tl.add(50, 60);
    expect(tl.intervals()).toEqual([[10, 25], [30, 40], [50, 60]]);
    expect(tl.overlap(25, 30)).toBeNull();
    expect(tl.overlap(24, 31)).toEqual([10, 25]);
    expect(tl.overlap(41, 55)).toEqual([50, 60]);
    tl.add(0, 100);
    expect(tl.intervals()).toEqual([[0, 100]]);
  });
});

describe("queue-aware placement", () => {
  it("on idle calendars: set-up, print straight through, cooling, removal on a shift, then the router", () => {
    // set-up 06:00–08:00; print 08:00–18:00; cooling to 22:00 (the second shift's end); removal
    // takes the next working hour, Tue 06:00–07:00; the router machines 07:00–10:00; ships Wed.
    const pl = placeJob(ledger(), job());
    const p = pl.prints[0]!;
    expect([iso(p.setupStart), iso(p.printStart), iso(p.printEnd), iso(p.coolingEnd), iso(p.holdEnd)]).toEqual(["2027-03-01T06:00", "2027-03-01T08:00", "2027-03-01T18:00", "2027-03-01T22:00", "2027-03-02T07:00"]);
    expect([iso(p.machiningStart), iso(p.machiningEnd)]).toEqual(["2027-03-02T07:00", "2027-03-02T10:00"]);
    expect(pl.shipDate).toBe("2027-03-03");
    expect(pl.waitHours).toBe(0);
  });

  it("uses a gap the whole window fits in, and skips one it does not", () => {
    const q = { booked: { bed: [span("2027-03-01T10:00", "2027-03-01T14:00")] } };
    // a short job (set-up 1 h, print 2 h, cooling 0.5 h, no removal) ends at 09:30, before the booking at 10:00
    const small = placeJob(ledger(q), job([{ ...print, setupHours: 1, printHours: 2, coolingHours: 0.5, removalHours: 0, machiningHours: 0 }]));
    expect(iso(small.prints[0]!.setupStart)).toBe("2027-03-01T06:00");
    expect(iso(small.prints[0]!.holdEnd)).toBe("2027-03-01T09:30");
    // the full job needs 06:00 → Tue 07:00: it waits for the booking's end at 14:00; set-up to 16:00,
    // print 16:00 → Tue 02:00, cooling to 06:00, removal to 07:00
    const big = placeJob(ledger(q), job()).prints[0]!;
    expect([iso(big.setupStart), iso(big.printEnd), iso(big.holdEnd)]).toEqual(["2027-03-01T14:00", "2027-03-02T02:00", "2027-03-02T07:00"]);
  });

  it("needs one unbroken window: a booking in the night pushes the whole print past it", () => {
    // idle, the job would hold the cell Mon 06:00 → Tue 07:00; a booking Tue 00:00–04:00 is inside
    // that window, so the set-up starts at the next shift after it, Tue 06:00, and the cell is
    // released Wed 07:00 (cooling ends Tue 22:00, removal in Wednesday's first hour)
    const p = placeJob(ledger({ booked: { bed: [span("2027-03-02T00:00", "2027-03-02T04:00")] } }), job()).prints[0]!;
    expect([iso(p.setupStart), iso(p.holdEnd)]).toEqual(["2027-03-02T06:00", "2027-03-03T07:00"]);
  });

  it("respects a maintenance block on the cell and on the router", () => {
    const q = { booked: { bed: [span("2027-03-01T00:00", "2027-03-03T06:00", { kind: "block" })], router: [span("2027-03-04T00:00", "2027-03-04T12:00", { kind: "block" })] } };
    // the cell is blocked to Wed 06:00: set-up 06–08, print 08–18, cool to 22:00, removal Thu 06–07;
    // the router is blocked to Thu 12:00, so machining runs 12:00–15:00
    const p = placeJob(ledger(q), job()).prints[0]!;
    expect([iso(p.setupStart), iso(p.holdEnd), iso(p.machiningStart), iso(p.machiningEnd)]).toEqual(["2027-03-03T06:00", "2027-03-04T07:00", "2027-03-04T12:00", "2027-03-04T15:00"]);
  });

  it("the router machines after the cell releases the part, around its own bookings", () => {
    // the part is lifted Tue 07:00; the router is booked Tue 06:00–12:00: machining 12:00–15:00
    const p = placeJob(ledger({ booked: { router: [span("2027-03-02T06:00", "2027-03-02T12:00")] } }), job()).prints[0]!;
    expect([iso(p.machiningStart), iso(p.machiningEnd)]).toEqual(["2027-03-02T12:00", "2027-03-02T15:00"]);
  });

  it("places copies as separate prints, one after the other, the next charge drying during the first", () => {
    // print 1 holds Mon 06:00 → Tue 07:00. Print 2 sets up Tue 07:00–09:00; its 4 h charge dries in
    // the second hopper from 03:00 (during print 1), so it prints 09:00–19:00, cools to 23:00 and is
    // lifted Wed 06:00–07:00. The router takes them in turn: Tue 07–10, Wed 07–10.
    const pl = placeJob(ledger(), job([print, { ...print, dryingHours: 4 }]));
    const [a, b] = pl.prints;
    expect(iso(a!.holdEnd)).toBe("2027-03-02T07:00");
    expect([iso(b!.dryingStart), iso(b!.setupStart), iso(b!.printStart), iso(b!.holdEnd)]).toEqual(["2027-03-02T03:00", "2027-03-02T07:00", "2027-03-02T09:00", "2027-03-03T07:00"]);
    expect([iso(a!.machiningEnd), iso(b!.machiningStart), iso(b!.machiningEnd)]).toEqual(["2027-03-02T10:00", "2027-03-03T07:00", "2027-03-03T10:00"]);
  });

  it("lays unscheduled hours first-fit from now and counts them as the wait", () => {
    // 20 working hours from Mon 06:00: Mon 06–22 (16 h) and Tue 06–10 (4 h); the job sets up at 10:00
    const pl = placeJob(ledger({ hours: { bed: 20 } }), job());
    expect(iso(pl.prints[0]!.setupStart)).toBe("2027-03-02T10:00");
    expect(pl.waitHours).toBeCloseTo(20, 9);
  });

  it("does not change the ledger it was given when forked", () => {
    const base = ledger({ booked: { bed: [span("2027-03-01T10:00", "2027-03-01T14:00")] } });
    placeJob(base.fork(), job());
    expect(base.timeline("bed", cal).intervals()).toEqual([[t("2027-03-01T10:00"), t("2027-03-01T14:00")]]);
  });
});

describe("expedite: going ahead of booked work without breaking its promise", () => {
  const standardOf = (l: Ledger) => placeJob(l.fork(), job());

  it("jumps a job with enough slack", () => {
    // Job A (not started) holds the cell Mon 06:30 → Tue 06:00 and may end as late as Wed 12:00
    // and still ship on its promised date. Expedited, the new job sets up 06:00–08:00, prints
    // 08–18, cools to 22:00 and is lifted 22:00–23:00 on the overtime shift; A pushed behind it runs
    // Mon 23:00 → Tue 22:30, before Wed 12:00: allowed.
    const q = { booked: { bed: [span("2027-03-01T06:30", "2027-03-02T06:00", { latestEndMs: t("2027-03-03T12:00"), ref: "A" })] } };
    const l = ledger(q);
    const ex = placeExpedited(l, job(), standardOf(l));
    expect(ex.jumped).toEqual(["A"]);
    expect([iso(ex.prints[0]!.setupStart), iso(ex.prints[0]!.holdEnd)]).toEqual(["2027-03-01T06:00", "2027-03-01T23:00"]);
  });

  it("never jumps a job whose promised date would then be missed", () => {
    // Same A, but its latest end is Tue 12:00: pushed to Tue 23:00 it would be late, so it stays;
    // the new job waits for it (set-up Tue 06:00) and only the overtime removal is gained.
    const q = { booked: { bed: [span("2027-03-01T06:30", "2027-03-02T06:00", { latestEndMs: t("2027-03-02T12:00"), ref: "A" })] } };
    const l = ledger(q);
    const std = standardOf(l);
    const ex = placeExpedited(l, job(), std);
    expect(ex.jumped).toEqual([]);
    expect(iso(ex.prints[0]!.setupStart)).toBe("2027-03-02T06:00");
    expect(ex.doneMs).toBeLessThanOrEqual(std.doneMs);
  });

  it("never jumps a maintenance block, work under way, or work with no slack", () => {
    const late = { latestEndMs: t("2027-03-20T00:00") };
    for (const s of [span("2027-03-01T06:30", "2027-03-02T06:00", { ...late, kind: "block" }), span("2027-03-01T05:00", "2027-03-02T06:00", late), span("2027-03-01T06:30", "2027-03-02T06:00")]) {
      const l = ledger({ booked: { bed: [s] } });
      const ex = placeExpedited(l, job(), standardOf(l));
      expect(ex.jumped).toEqual([]);
      expect(ex.prints[0]!.setupStart).toBeGreaterThanOrEqual(t("2027-03-02T06:00"));
    }
  });

  it("a chain: pushing one job must not push the next past its promise", () => {
    // A (Mon 06:30–20:00, slack to Fri) then B (Mon 20:00 → Tue 06:00, may end by Tue 10:00).
    // Ahead of both, the job holds Mon 06:00–23:00; A pushed behind it runs 23:00 → Tue 12:30 and
    // B behind A would end Tue 22:30, past 10:00: B stays. Then the job (06:00 → 23:00) overlaps
    // B at 20:00 and goes after it, Tue 06:00, and A need not move: nothing is jumped.
    const q = { booked: { bed: [
      span("2027-03-01T06:30", "2027-03-01T20:00", { latestEndMs: t("2027-03-05T00:00"), ref: "A" }),
      span("2027-03-01T20:00", "2027-03-02T06:00", { latestEndMs: t("2027-03-02T10:00"), ref: "B" }),
    ] } };
    const l = ledger(q);
    const ex = placeExpedited(l, job(), standardOf(l));
    expect(ex.jumped).toEqual([]);
    expect(iso(ex.prints[0]!.setupStart)).toBe("2027-03-02T06:00");
    // with B's promise a day later both may move: the job goes first
    const q2 = { booked: { bed: [q.booked.bed[0]!, { ...q.booked.bed[1]!, latestEndMs: t("2027-03-03T10:00") }] } };
    const l2 = ledger(q2);
    const ex2 = placeExpedited(l2, job(), standardOf(l2));
    expect(ex2.jumped).toEqual(["A", "B"]);
    expect(iso(ex2.prints[0]!.setupStart)).toBe("2027-03-01T06:00");
  });

  it("is never later than standard, on an empty calendar and on a busy one, from any hour of a week", () => {
    const busy = { booked: { bed: [span("2027-03-02T00:00", "2027-03-03T12:00", { latestEndMs: t("2027-03-08T00:00") })], router: [span("2027-03-03T06:00", "2027-03-04T06:00")] } };
    for (const q of [{}, busy]) {
      for (let h = 0; h < 7 * 24; h += 5) {
        const l = new Ledger(q, NOW + h * 3_600_000, UTC_PLANT);
        const std = placeJob(l.fork(), job([print], 4));
        const ex = placeExpedited(l, job([print], 4), std);
        expect(ex.doneMs).toBeLessThanOrEqual(std.doneMs);
        expect(ex.shipDate <= std.shipDate).toBe(true);
      }
    }
  });
});
