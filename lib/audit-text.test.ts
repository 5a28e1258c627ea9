import { describe, expect, it } from "vitest";
import { describeChange, valueText } from "./audit-text";

describe("describeChange", () => {
  it("shows money, shares, instants and lists as a person reads them", () => {
    expect(valueText("amountCents", 125_050)).toBe("$1,250.50");
    expect(valueText("marginBp", 2_500)).toBe("25 %");
    expect(valueText("isActive", false)).toBe("no");
    expect(valueText("blocks", [1, 2, 3])).toBe("3 items");
    expect(valueText("at", "2026-12-02T17:30:00.000Z")).toMatch(/^2 Dec 2026, \d{2}:30 /);
  });
  it("lists changed fields only, by the glossary's names (lib/labels.ts) or readable ones, and leaves ids out", () => {
    const lines = describeChange({ refundedCents: 0, status: "paid", id: "abc" }, { refundedCents: 10_000, status: "partially_refunded", id: "abc", stripeRefundId: "re_1" });
    expect(lines).toEqual([
      { field: "refunded", before: "$0.00", after: "$100.00" },
      { field: "status", before: "paid", after: "partially_refunded" },
      { field: "processor reference", before: "—", after: "re_1" },
    ]);
    expect(describeChange(null, { note: "Kept" })).toEqual([{ field: "note", before: null, after: "Kept" }]);
    expect(describeChange(null, null)).toEqual([]);
  });
});
