import { PAYMENT_KIND_LABEL, PAYMENT_STATE_LABEL, REFUND_STATE_LABEL, type PaymentState, type RefundState } from "../labels";

/**
 * CSV of the ledger (RFC 4180: comma separated, CRLF line ends, fields with a comma, quote or
 * line break quoted, quotes doubled). Cells that a spreadsheet would run as a formula
 * (=, +, -, @ first, unless a plain number) get a leading apostrophe (common practice against CSV injection).
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return "";
  let s = String(value);
  if (typeof value === "string" && /^[=+\-@\t\r]/.test(s) && !/^-?\d+(\.\d+)?$/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(header: string[], rows: (string | number | null | undefined)[][]): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(",")).join("\r\n") + "\r\n";
}

/** Cents as a plain decimal amount (no currency symbol, no grouping) for spreadsheets. */
export function centsToDecimal(cents: number | null | undefined): string {
  if (cents === null || cents === undefined) return "";
  const sign = cents < 0 ? "-" : "";
  const a = Math.abs(cents);
  return `${sign}${Math.floor(a / 100)}.${String(a % 100).padStart(2, "0")}`;
}

export interface LedgerCsvPayment {
  id: string;
  reference: string;
  firmName: string;
  kind: "deposit" | "balance";
  status: PaymentState;
  amountCents: number;
  feeCents: number | null;
  refundedCents: number;
  currency: string;
  receiptNumber: string | null;
  processorReference: string | null;
  createdAt: Date;
  paidAt: Date | null;
}

export interface LedgerCsvRefund {
  id: string;
  paymentId: string;
  reference: string;
  firmName: string;
  amountCents: number;
  status: RefundState;
  reason: string;
  /** The processor's id of the refund. */
  stripeRefundId: string | null;
  /** The receipt number of the payment refunded. */
  receiptNumber: string | null;
  currency: string;
  createdAt: Date;
}

/** The export's columns, in accounting's words (the processor's ids only as "processor reference"). */
export const LEDGER_CSV_HEADER = ["Date (UTC)", "Entry", "Kind", "Order", "Firm", "Status", "Amount", "Fee", "Refunded", "Currency", "Receipt number", "Processor reference", "Reason"];

/** One row per payment and per refund (refunds negative), in time order. */
export function ledgerCsv(payments: LedgerCsvPayment[], refunds: LedgerCsvRefund[]): string {
  const rows: { at: number; cells: (string | number | null)[] }[] = [];
  for (const p of payments) {
    const at = p.paidAt ?? p.createdAt;
    rows.push({ at: at.getTime(), cells: [at.toISOString(), "Payment", PAYMENT_KIND_LABEL[p.kind], p.reference, p.firmName, PAYMENT_STATE_LABEL[p.status], centsToDecimal(p.amountCents), centsToDecimal(p.feeCents), centsToDecimal(p.refundedCents), p.currency.toUpperCase(), p.receiptNumber, p.processorReference, ""] });
  }
  for (const r of refunds) {
    rows.push({ at: r.createdAt.getTime(), cells: [r.createdAt.toISOString(), "Refund", "", r.reference, r.firmName, REFUND_STATE_LABEL[r.status], centsToDecimal(-r.amountCents), "", "", r.currency.toUpperCase(), r.receiptNumber, r.stripeRefundId, r.reason] });
  }
  rows.sort((a, b) => a.at - b.at);
  return toCsv(LEDGER_CSV_HEADER, rows.map((r) => r.cells));
}
