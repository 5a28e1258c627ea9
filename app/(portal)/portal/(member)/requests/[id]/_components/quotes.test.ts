import { describe, expect, it } from "vitest";
import { quoteChanges, type QuoteView } from "./quote-changes";

const base: QuoteView = {
  id: "q1",
  version: 1,
  status: "superseded",
  isStale: false,
  leadTime: "standard",
  subtotalCents: 0,
  marginCents: 0,
  taxCents: 0,
  totalCents: 100_000,
  depositCents: 50_000,
  currency: "usd",
  terms: "",
  notes: "",
  shipDate: "2027-01-10T00:00:00.000Z",
  issuedAt: null,
  validUntil: null,
  lines: [
    { id: "a", kind: "material", description: "Material", quantity: 1, unitCents: 60_000, amountCents: 60_000 },
    { id: "b", kind: "crating", description: "Crating", quantity: 1, unitCents: 40_000, amountCents: 40_000 },
  ],
};

describe("quoteChanges", () => {
  it("lists re-priced, added and removed lines, the total and the ship date", () => {
    const v2: QuoteView = {
      ...base,
      id: "q2",
      version: 2,
      status: "issued",
      totalCents: 112_500,
      shipDate: "2027-01-17T00:00:00.000Z",
      lines: [
        { id: "c", kind: "material", description: "Material", quantity: 1, unitCents: 62_500, amountCents: 62_500 },
        { id: "d", kind: "option", description: "Vacuum-integrity test", quantity: 1, unitCents: 50_000, amountCents: 50_000 },
      ],
    };
    expect(quoteChanges(v2, base)).toEqual([
      "Material: $600.00 → $625.00",
      "Added: Vacuum-integrity test ($500.00)",
      "Removed: Crating",
      "Total: $1,000.00 → $1,125.00",
      "Ship date: 10 Jan 2027 → 17 Jan 2027",
    ]);
  });
  it("says so when nothing changed, and nothing for the first version", () => {
    expect(quoteChanges({ ...base, id: "q2", version: 2 }, base)).toEqual(["No changes to the lines or total."]);
    expect(quoteChanges(base, undefined)).toEqual([]);
  });
});
