import { describe, expect, it } from "vitest";
import { defaultRateCard } from "./defaults";
import { expeditePremiumCents, leadTimeOptions } from "./lead-times";
import { Ledger, type CapacityQueue } from "./ledger";
import { placeJob, type JobSpec } from "./placement";
import { costLine, totalsOf } from "./pricing";
import { UTC_PLANT } from "./schedule";
import type { WorkingCalendar } from "./types";

const cal: WorkingCalendar = { workingWeekdays: [1, 2, 3, 4, 5], shiftsPerDay: 2, hoursPerShift: 8, holidays: [] };
const NOW = Date.parse("2027-03-01T06:00:00Z");
const spec: JobSpec = {
  prints: [{ cellKey: "bed", calendar: cal, setupHours: 2, dryingHours: 0, printHours: 10, coolingHours: 4, removalHours: 1, machiningHours: 3 }],
  routerCalendar: cal, joinHours: 0, afterDays: 4, shipCalendar: cal,
};
const card = { ...defaultRateCard, marginBp: 2000, taxBp: 1000, overtimePremiumBp: 5000, expediteFeeCents: 25_000, economyDiscountBp: 500, economyExtraDays: 10, economyMaxLoadBp: 6000 };
const pricing = totalsOf([costLine("print", "Printing", 10, "h", 20_000), costLine("setup", "Setup", 1, "order", 50_000), costLine("machining", "Machining", 3, "h", 15_000)], card);

const options = (q: CapacityQueue) => {
  const l = new Ledger(q, NOW, UTC_PLANT);
  const std = placeJob(l.fork(), spec);
  return { std, lt: leadTimeOptions(l, spec, std, pricing, card) };
};

describe("lead-time choices", () => {
  it("the expedite's premium: overtime on set-up and machining plus the flat fee", () => {
    // set-up 500.00 + machining 3 × 150.00 = 950.00 of labour; half of it 475.00, plus 250.00
    expect(expeditePremiumCents(pricing, card)).toBe(47_500 + 25_000);
  });

  it("on an empty calendar: standard is the estimate's own, expedite earlier or equal and dearer, economy later and cheaper", () => {
    const { std, lt } = options({});
    const [s, e, c] = lt;
    expect(s).toEqual({ key: "standard", shipDate: std.shipDate, totalCents: pricing.totalCents, adjustmentCents: 0 });
    expect(e!.key).toBe("expedite");
    expect(e!.shipDate <= s!.shipDate).toBe(true);
    // 725.00 more before margin (20 %) and tax (10 %): 725 × 1.2 × 1.1 = 957.00
    expect(e!.totalCents - s!.totalCents).toBe(95_700);
    // the four days after machining run through the weekend on overtime: Tue 10:00 + 64 working h
    // on 18 h days is Sat 20:00 → ships Mon 8 Mar; standard runs to Mon 10:00 → ships Tue 9 Mar
    expect([s!.shipDate, e!.shipDate]).toEqual(["2027-03-09", "2027-03-08"]);
    expect(c!.key).toBe("economy");
    expect(c!.shipDate > s!.shipDate).toBe(true);
    expect(c!.totalCents).toBeLessThan(s!.totalCents);
  });

  it("economy is not offered when the cell is mostly booked up to its date", () => {
    // the bed booked solid for five weeks: 25 of the about 40 working days to the economy date (over 60 %)
    const { lt } = options({ booked: { bed: [{ startMs: NOW, endMs: NOW + 35 * 86_400_000 }] } });
    expect(lt.map((x) => x.key)).toEqual(["standard", "expedite"]);
  });
});
