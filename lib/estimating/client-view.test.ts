import { describe, expect, it } from "vitest";
import { clientEstimate } from "./client-view";
import type { EstimateAlternative, EstimateResult } from "./types";

function alt(cell: string, status: EstimateAlternative["status"], totalCents: number): EstimateAlternative {
  return {
    cell, cellName: cell, orientation: { up: "z", swapped: false }, beadWidthMm: 10, layerHeightMm: 5,
    printMode: "shell", shellWalls: 2, printHours: 4, dwellHours: 0, massKg: 90,
    flaggedLayers: status === "priced" ? 0 : 12, totalCents, shipDate: "2027-03-09", status, whyNot: status === "priced" ? "dearer" : "layers outside the cooling window",
  };
}

const result = (status: EstimateResult["status"], alternatives: EstimateAlternative[]) =>
  ({ status, alternatives, remedies: [{ step: "walls" }], lines: [{ key: "print" }], totalCents: 664_800 }) as unknown as EstimateResult;

describe("what a client is shown of an estimate", () => {
  it("offers only printable alternatives, as cell, total and ship date", () => {
    const view = clientEstimate(result("priced", [alt("long-bed", "priced", 1_162_300), alt("compact", "needs-review", 454_360)]));
    expect(view.alternatives).toEqual([{ cell: "long-bed", cellName: "long-bed", totalCents: 1_162_300, shipDate: "2027-03-09" }]);
    expect(view.remedies).toEqual([]);
    expect(view.priceWithheld).toBe(false);
    expect(view.totalCents).toBe(664_800);
  });

  it("withholds every price of an estimate the engineer will quote", () => {
    const view = clientEstimate(result("needs-review", [alt("long-bed", "priced", 1_162_300)]));
    expect(view.priceWithheld).toBe(true);
    expect(view.totalCents).toBe(0);
    expect(view.lines).toEqual([]);
    expect(view.alternatives.map((a) => a.totalCents)).toEqual([0]);
  });

  it("shows each delivery choice's date and total, not the adjustment before margin nor the jobs gone ahead of", () => {
    const r = { ...result("priced", []), leadTimes: [
      { key: "standard", shipDate: "2027-03-09", totalCents: 664_800, adjustmentCents: 0 },
      { key: "expedite", shipDate: "2027-03-04", totalCents: 760_000, adjustmentCents: 70_000, jumped: 2 },
    ] } as EstimateResult;
    expect(clientEstimate(r).leadTimes).toEqual([
      { key: "standard", shipDate: "2027-03-09", totalCents: 664_800, adjustmentCents: 0 },
      { key: "expedite", shipDate: "2027-03-04", totalCents: 760_000, adjustmentCents: 0 },
    ]);
    // withheld: standard only, no price
    expect(clientEstimate({ ...r, status: "needs-review" }).leadTimes).toEqual([{ key: "standard", shipDate: "2027-03-09", totalCents: 0, adjustmentCents: 0 }]);
  });
});
