import { describe, expect, it } from "vitest";
import { leadTimeLines, requestLeadTimes } from "./lead-times";

const a = { shipDate: "2027-03-10", totalCents: 100_000, leadTimes: [
  { key: "standard" as const, shipDate: "2027-03-10", totalCents: 100_000, adjustmentCents: 0 },
  { key: "expedite" as const, shipDate: "2027-03-05", totalCents: 112_000, adjustmentCents: 10_000 },
  { key: "economy" as const, shipDate: "2027-03-24", totalCents: 95_000, adjustmentCents: -4_000 },
] };
const b = { shipDate: "2027-03-12", totalCents: 50_000, leadTimes: [
  { key: "standard" as const, shipDate: "2027-03-12", totalCents: 50_000, adjustmentCents: 0 },
  { key: "expedite" as const, shipDate: "2027-03-08", totalCents: 60_000, adjustmentCents: 8_000 },
] };

describe("a request's delivery choices", () => {
  it("ships with its last part, at the summed totals; economy only if every part offers it", () => {
    expect(requestLeadTimes([a, b])).toEqual([
      { key: "standard", shipDate: "2027-03-12", totalCents: 150_000, adjustmentCents: 0 },
      { key: "expedite", shipDate: "2027-03-08", totalCents: 172_000, adjustmentCents: 18_000 },
    ]);
    expect(requestLeadTimes([a]).map((l) => l.key)).toEqual(["standard", "expedite", "economy"]);
    // an estimate from before the choices: standard only
    expect(requestLeadTimes([{ shipDate: "2027-03-01", totalCents: 5 }])).toEqual([{ key: "standard", shipDate: "2027-03-01", totalCents: 5, adjustmentCents: 0 }]);
  });

  it("quote lines carry each part's adjustment as the estimate's own amount", () => {
    const lines = leadTimeLines([{ partId: "p1", partName: "Rib", ...a }, { partId: "p2", partName: "Spar", ...b }], "expedite");
    expect(lines.map((l) => [l.partId, l.amountCents, l.estimatedCents, l.kind])).toEqual([["p1", 10_000, 10_000, "option"], ["p2", 8_000, 8_000, "option"]]);
    expect(leadTimeLines([{ partId: "p1", partName: "Rib", ...a }], "economy")[0]).toMatchObject({ amountCents: -4_000, quantity: 1, unitCents: -4_000 });
    expect(leadTimeLines([{ partId: "p1", partName: "Rib", ...a }], "standard")).toEqual([]);
  });
});
