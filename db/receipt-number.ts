/**
 * The bureau's receipt numbers: `RC-<year>-<five digits>`, e.g. `RC-2026-00042`, one series per
 * calendar year (UTC), given in the transaction that records the money as received. A client's
 * receipt shows this number; the processor's own references stay with accounts.
 */
export const RECEIPT_SERIES = "RC";

export function receiptYear(paidAt: Date): number {
  return paidAt.getUTCFullYear();
}

export function formatReceiptNumber(year: number, seq: number): string {
  if (!Number.isInteger(year) || year < 1000 || year > 9999) throw new RangeError(`Not a receipt year: ${year}`);
  if (!Number.isInteger(seq) || seq < 1) throw new RangeError(`Not a receipt sequence number: ${seq}`);
  return `${RECEIPT_SERIES}-${year}-${String(seq).padStart(5, "0")}`;
}

/** The year and sequence number of a receipt number, or null when it is not one. */
export function parseReceiptNumber(value: string): { year: number; seq: number } | null {
  const m = /^RC-(\d{4})-(\d{5,})$/.exec(value);
  return m ? { year: Number(m[1]), seq: Number(m[2]) } : null;
}

/** The number after the highest one given so far in that year (null: none yet). */
export function nextReceiptNumber(year: number, highest: string | null): string {
  const last = highest ? parseReceiptNumber(highest) : null;
  return formatReceiptNumber(year, last && last.year === year ? last.seq + 1 : 1);
}
