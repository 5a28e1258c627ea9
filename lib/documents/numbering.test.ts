import { describe, expect, it } from "vitest";
import { formatDocumentNumber, parseDocumentNumber, SERIES_BY_KIND, seriesYear } from "./numbering";

describe("document numbers", () => {
  it.each([
    ["QT", 2026, 1, "QT-2026-00001"],
    ["INV", 2026, 42, "INV-2026-00042"],
    ["CN", 2031, 123456, "CN-2031-123456"],
  ])("%s %i #%i → %s, and back", (series, year, seq, text) => {
    expect(formatDocumentNumber(series, year, seq)).toBe(text);
    expect(parseDocumentNumber(text)).toEqual({ series, year, seq });
  });

  it("refuses a sequence that is not a positive integer, and text that is not a number", () => {
    expect(() => formatDocumentNumber("QT", 2026, 0)).toThrow(RangeError);
    expect(() => formatDocumentNumber("QT", 2026, 1.5)).toThrow(RangeError);
    expect(parseDocumentNumber("QT-2026-1")).toBeNull();
    expect(parseDocumentNumber("../etc")).toBeNull();
  });

  it("numbers by the UTC calendar year; both invoice kinds share the invoice series", () => {
    expect(seriesYear(new Date("2026-12-31T23:59:59Z"))).toBe(2026);
    expect(seriesYear(new Date("2027-01-01T00:00:00Z"))).toBe(2027);
    expect(SERIES_BY_KIND.deposit_invoice).toBe(SERIES_BY_KIND.invoice);
    expect(new Set(Object.values(SERIES_BY_KIND)).size).toBe(4);
  });
});
