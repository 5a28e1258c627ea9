import { formatCents } from "@/lib/money";
import { formatDate, formatDay } from "@/lib/dates";

export interface QuoteView {
  id: string;
  version: number;
  status: "issued" | "accepted" | "superseded" | "expired" | "declined" | "draft";
  isStale: boolean;
  subtotalCents: number;
  marginCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  currency: string;
  terms: string;
  /** The terms-of-sale version the quote is offered on, printed on its PDF. */
  termsVersion?: number | null;
  /** The quotation PDF, when one was issued. */
  pdf?: { number: string; url: string } | null;
  notes: string;
  shipDate: string | null;
  /** The delivery quoted (the client's choice on the request, or sales'): standard, expedited or economy. */
  leadTime: "standard" | "expedite" | "economy";
  issuedAt: string | null;
  validUntil: string | null;
  lines: { id: string; kind: string; description: string; quantity: number; unitCents: number; amountCents: number }[];
}

/** Quoted ship dates are days (UTC midnight); issue and expiry are instants in the plant's zone. */
export const day = (iso: string | null) => formatDay(iso);
export const instantDay = (iso: string | null) => formatDate(iso);

/** What changed from the previous version: lines added, removed or re-priced, and the total. */
export function quoteChanges(cur: QuoteView, prev: QuoteView | undefined): string[] {
  if (!prev) return [];
  const out: string[] = [];
  const key = (l: QuoteView["lines"][number]) => `${l.kind}|${l.description}`;
  const before = new Map(prev.lines.map((l) => [key(l), l]));
  const after = new Map(cur.lines.map((l) => [key(l), l]));
  for (const [k, l] of after) {
    const b = before.get(k);
    if (!b) out.push(`Added: ${l.description} (${formatCents(l.amountCents, cur.currency)})`);
    else if (b.amountCents !== l.amountCents) out.push(`${l.description}: ${formatCents(b.amountCents, cur.currency)} → ${formatCents(l.amountCents, cur.currency)}`);
  }
  for (const [k, l] of before) if (!after.has(k)) out.push(`Removed: ${l.description}`);
  if (prev.totalCents !== cur.totalCents) out.push(`Total: ${formatCents(prev.totalCents, cur.currency)} → ${formatCents(cur.totalCents, cur.currency)}`);
  if (prev.shipDate !== cur.shipDate) out.push(`Ship date: ${day(prev.shipDate)} → ${day(cur.shipDate)}`);
  return out.length ? out : ["No changes to the lines or total."];
}

