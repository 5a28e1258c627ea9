import { describe, expect, it } from "vitest";
import { formatReceiptNumber, nextReceiptNumber, parseReceiptNumber, receiptYear } from "@/db/receipt-number";

describe("receipt numbers", () => {
  it("formats the year and a five-digit sequence, and reads it back", () => {
    expect(formatReceiptNumber(2026, 42)).toBe("RC-2026-00042");
    expect(parseReceiptNumber("RC-2026-00042")).toEqual({ year: 2026, seq: 42 });
    expect(formatReceiptNumber(2026, 123456)).toBe("RC-2026-123456");
    expect(parseReceiptNumber("RC-2026-123456")).toEqual({ year: 2026, seq: 123456 });
  });

  it("refuses what is not a receipt number", () => {
    expect(parseReceiptNumber("INV-2026-00001")).toBeNull();
    expect(parseReceiptNumber("RC-26-1")).toBeNull();
    expect(() => formatReceiptNumber(2026, 0)).toThrow(RangeError);
    expect(() => formatReceiptNumber(2026, 1.5)).toThrow(RangeError);
  });

  it("starts each calendar year (UTC) at 1 and otherwise counts on", () => {
    expect(nextReceiptNumber(2026, null)).toBe("RC-2026-00001");
    expect(nextReceiptNumber(2026, "RC-2026-00009")).toBe("RC-2026-00010");
    expect(nextReceiptNumber(2027, "RC-2026-00310")).toBe("RC-2027-00001");
    expect(receiptYear(new Date("2026-12-31T23:59:59Z"))).toBe(2026);
    expect(receiptYear(new Date("2027-01-01T00:00:00Z"))).toBe(2027);
  });
});
