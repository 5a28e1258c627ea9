/* A stored number's format is part of the data: the unique index and the series counter rely on it. */
import type { IssuedDocumentKind } from "./schema/issued-documents";

/**
 * Document numbers: `<series>-<year>-<five digits>`, e.g. `INV-2026-00042`. One gap-free series
 * per prefix and calendar year (UTC). The deposit and balance invoices share the invoice series,
 * as tax rules usually ask of invoices; quotes, credit notes and packing lists have their own.
 * The counter itself lives in `document_series` (queries/issued-documents.ts allocates from it
 * inside the transaction that writes the document). Other numbered papers (receipts, for one)
 * take a prefix here and allocate the same way.
 */
export const SERIES_BY_KIND: Record<IssuedDocumentKind, string> = {
  quote: "QT",
  deposit_invoice: "INV",
  invoice: "INV",
  credit_note: "CN",
  packing_list: "PL",
};

/** The calendar year a document issued at `at` is numbered in (UTC). */
export function seriesYear(at: Date): number {
  return at.getUTCFullYear();
}

export function formatDocumentNumber(series: string, year: number, seq: number): string {
  if (!Number.isInteger(seq) || seq < 1) throw new RangeError(`Not a document sequence number: ${seq}`);
  return `${series}-${year}-${String(seq).padStart(5, "0")}`;
}

/** The parts of a number made by formatDocumentNumber, or null. */
export function parseDocumentNumber(number: string): { series: string; year: number; seq: number } | null {
  const m = /^([A-Z]{2,4})-(\d{4})-(\d{5,})$/.exec(number);
  return m ? { series: m[1]!, year: Number(m[2]), seq: Number(m[3]) } : null;
}
