import { describe, expect, it } from "vitest";
import { applyArrival, checkCredit, daysOverdue, dueDateFor, invoiceStanding } from "./terms";

const at = (s: string) => new Date(s);

describe("net terms", () => {
  // Net 30/45/60: the balance is due that many calendar days after the invoice date (trade usage), by the end of that day.
  it.each([
    ["net30", "2026-12-31T23:59:59.999Z"],
    ["net45", "2027-01-15T23:59:59.999Z"],
    ["net60", "2027-01-30T23:59:59.999Z"],
  ] as const)("%s from 1 Dec 2026 falls due on %s", (terms, due) => {
    expect(dueDateFor(terms, at("2026-12-01T15:00:00Z")).toISOString()).toBe(new Date(due).toISOString());
    // Late in the day in the plant's zone is already the next day in UTC: the invoice's (UTC) date counts.
    expect(dueDateFor("net30", at("2026-12-02T02:00:00Z")).toISOString()).toBe("2027-01-01T23:59:59.999Z");
  });

  it("checks credit as open balance plus this order against the limit; the limit itself fits", () => {
    expect(checkCredit({ limitCents: 100_000, openCents: 40_000, orderCents: 60_000 })).toEqual({ ok: true, availableCents: 60_000, overByCents: 0 });
    expect(checkCredit({ limitCents: 100_000, openCents: 40_000, orderCents: 60_001 })).toEqual({ ok: false, availableCents: 60_000, overByCents: 1 });
    expect(checkCredit({ limitCents: 0, openCents: 0, orderCents: 1 })).toMatchObject({ ok: false, overByCents: 1 });
    expect(checkCredit({ limitCents: 50_000, openCents: 80_000, orderCents: 10_000 })).toEqual({ ok: false, availableCents: 0, overByCents: 40_000 });
  });

  it("stands open, due soon (5 days ahead), overdue after the due instant, or paid", () => {
    const dueAt = at("2026-12-31T15:00:00Z");
    expect(invoiceStanding({ dueAt, isPaid: false, now: at("2026-12-20T00:00:00Z") })).toBe("open");
    expect(invoiceStanding({ dueAt, isPaid: false, now: at("2026-12-26T15:00:00Z") })).toBe("due_soon");
    expect(invoiceStanding({ dueAt, isPaid: false, now: dueAt })).toBe("due_soon");
    expect(invoiceStanding({ dueAt, isPaid: false, now: at("2026-12-31T15:00:01Z") })).toBe("overdue");
    expect(invoiceStanding({ dueAt, isPaid: true, now: at("2027-02-01T00:00:00Z") })).toBe("paid");
    expect(invoiceStanding({ dueAt: null, isPaid: false, now: dueAt })).toBe("not_invoiced");
    expect(daysOverdue(dueAt, at("2027-01-10T16:00:00Z"))).toBe(10);
    expect(daysOverdue(dueAt, at("2026-12-01T00:00:00Z"))).toBe(0);
  });
});

describe("a bank transfer's arrival", () => {
  const receivedAt = at("2026-12-10T12:00:00Z");
  it("applies in full, short, over, late or not at all", () => {
    expect(applyArrival({ amountCents: 5_000, owedCents: 5_000, receivedAt, dueAt: null })).toEqual({ status: "applied", appliedCents: 5_000, leftCents: 0, isSettled: true });
    expect(applyArrival({ amountCents: 3_000, owedCents: 5_000, receivedAt, dueAt: null })).toEqual({ status: "short", appliedCents: 3_000, leftCents: 0, isSettled: false });
    expect(applyArrival({ amountCents: 6_200, owedCents: 5_000, receivedAt, dueAt: null })).toEqual({ status: "over", appliedCents: 5_000, leftCents: 1_200, isSettled: true });
    expect(applyArrival({ amountCents: 5_000, owedCents: 5_000, receivedAt, dueAt: at("2026-12-01T00:00:00Z") })).toMatchObject({ status: "late", isSettled: true });
    expect(applyArrival({ amountCents: 5_000, owedCents: null, receivedAt, dueAt: null })).toEqual({ status: "unmatched", appliedCents: 0, leftCents: 5_000, isSettled: false });
    expect(applyArrival({ amountCents: 5_000, owedCents: 0, receivedAt, dueAt: null })).toMatchObject({ status: "unmatched", appliedCents: 0 });
  });
});
