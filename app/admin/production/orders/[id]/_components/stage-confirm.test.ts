import { describe, expect, it } from "vitest";
import { moveConsequences } from "./stage-confirm";

describe("moveConsequences", () => {
  it("a hold of a paid, booked order: client told on the timeline, payments kept, cell stays booked, returns to its stage", () => {
    const c = moveConsequences("on_hold", { from: "printing", paidCents: 879_717, currency: "USD", bookedCell: "Tall Frame" });
    expect(c.confirm).toBe("Yes, put it on hold");
    expect(c.lines.join(" ")).toMatch(/“On hold” on their order's timeline/);
    expect(c.lines.join(" ")).toContain("$8,797.17 received is kept");
    expect(c.lines.join(" ")).toContain("Tall Frame stays booked");
    expect(c.lines.at(-1)).toBe("Releasing the hold sends it back to Printing.");
  });

  it("a cancel: refunds are left to accounts, booked time is released, it can not be reopened", () => {
    const c = moveConsequences("cancelled", { from: "scheduled", paidCents: 500_000, currency: "USD", bookedCell: "Compact" });
    expect(c.lines.join(" ")).toContain("$5,000.00 received is not refunded automatically: accounts refunds what is due from the ledger.");
    expect(c.lines.join(" ")).toContain("Its booked time on Compact is released for other jobs.");
    expect(c.lines).toContain("A cancelled order can not be reopened.");
  });

  it("an unpaid, unscheduled cancel says so instead of naming sums or cells", () => {
    const c = moveConsequences("cancelled", { from: "accepted", paidCents: 0, currency: "USD", bookedCell: null });
    expect(c.lines).toContain("Nothing has been paid on this order.");
    expect(c.lines).toContain("It has no cell time booked.");
  });
});
