import { roundCents, shareOfCents } from "../money";

/** The kinds a quote line may have (mirrors db/schema/quotes.ts QUOTE_LINE_KINDS). */
export const LINE_KINDS = ["material", "print", "machining", "engineering", "setup", "option", "crating", "freight", "other"] as const;
export type LineKind = (typeof LINE_KINDS)[number];

/** A cost line of the automatic estimate (lib/estimating CostLine), as stored in analyses.result. */
export interface EstimateCostLine {
  key: string;
  label: string;
  quantity: number;
  unit: string;
  unitCents: number;
  amountCents: number;
}

/** One part's estimate, as the quote editor needs it. */
export interface PartEstimate {
  partId: string;
  partName: string;
  lines: EstimateCostLine[];
}

export interface DraftLine {
  partId: string | null;
  kind: LineKind;
  description: string;
  quantity: number;
  unitCents: number;
  amountCents: number;
  /** The automatic estimate's amount; null for lines sales added. */
  estimatedCents: number | null;
  editReason: string | null;
}

/** Estimate cost-line keys (lib/estimating/pricing.ts) → quote line kinds. */
const KIND_OF_KEY: Record<string, LineKind> = {
  material: "material",
  print: "print",
  dwell: "print",
  machining: "machining",
  engineering: "engineering",
  setup: "setup",
  sealing: "option",
  "vacuum-test": "option",
  crating: "crating",
  freight: "freight",
};

/** amount = quantity × unit price, rounded once to cents. */
export function lineAmount(quantity: number, unitCents: number): number {
  return roundCents(quantity * unitCents);
}

/**
 * Quote lines prefilled from each part's estimate, each remembering the estimate's amount. A line
 * the estimate priced at nothing (no cooling dwell, an option not asked for: quantity 0) is left
 * out: a quote line needs a quantity above zero, and it would only say "0 h" to the client.
 */
export function linesFromEstimates(parts: PartEstimate[]): DraftLine[] {
  const out: DraftLine[] = [];
  for (const part of parts) {
    for (const l of part.lines) {
      // a line the plan did not need (no dwell, say) is not a quote line: quotes take quantities above zero
      if (l.quantity <= 0 && l.amountCents === 0) continue;
      out.push({
        partId: part.partId,
        kind: KIND_OF_KEY[l.key] ?? "other",
        description: parts.length > 1 ? `${part.partName}: ${l.label}` : l.label,
        quantity: l.quantity,
        unitCents: l.unitCents,
        amountCents: l.amountCents,
        estimatedCents: l.amountCents,
        editReason: null,
      });
    }
  }
  return out;
}

/** Has sales changed this line away from the estimate? Added lines count as changed. */
export function isEdited(line: Pick<DraftLine, "amountCents" | "estimatedCents">): boolean {
  return line.estimatedCents === null || line.amountCents !== line.estimatedCents;
}

export interface LineProblem {
  index: number;
  message: string;
}

/**
 * Every line edited away from the estimate, and every added line, needs a reason; amounts are
 * recomputed from quantity × unit price so a tampered amount can not slip through.
 */
export function checkLines(lines: DraftLine[]): LineProblem[] {
  const problems: LineProblem[] = [];
  if (lines.length === 0) problems.push({ index: -1, message: "A quote needs at least one line." });
  lines.forEach((l, index) => {
    // The estimator shows quantities rounded to 0.001 but prices the unrounded figure, so an
    // untouched estimate line may differ from quantity × unit by that rounding, no more.
    const slack = isEdited(l) ? 0 : Math.abs(l.unitCents) * 0.0005 + 0.5;
    if (Math.abs(l.amountCents - lineAmount(l.quantity, l.unitCents)) > slack) {
      problems.push({ index, message: "The amount does not equal quantity × unit price." });
    }
    if (isEdited(l) && !(l.editReason ?? "").trim()) {
      problems.push({ index, message: l.estimatedCents === null ? "Say why this line is added." : "Say why this line differs from the estimate." });
    }
  });
  return problems;
}

export interface QuoteTotals {
  subtotalCents: number;
  marginCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
}

/**
 * Margin on the subtotal, tax on subtotal + margin, deposit as a share of the total, all in basis
 * points and rounded once each (the same order as lib/estimating/pricing.ts).
 */
export function quoteTotals(lines: Pick<DraftLine, "amountCents">[], rates: { marginBp: number; taxBp: number; depositBp: number }): QuoteTotals {
  for (const [name, bp] of Object.entries(rates)) {
    if (!Number.isInteger(bp) || bp < 0) throw new RangeError(`${name} must be a non-negative whole number of basis points`);
  }
  if (rates.depositBp > 10_000) throw new RangeError("depositBp can not exceed 10 000 (the whole total)");
  const subtotalCents = lines.reduce((s, l) => s + l.amountCents, 0);
  const marginCents = shareOfCents(subtotalCents, rates.marginBp);
  const taxCents = shareOfCents(subtotalCents + marginCents, rates.taxBp);
  const totalCents = subtotalCents + marginCents + taxCents;
  const depositCents = shareOfCents(totalCents, rates.depositBp);
  return { subtotalCents, marginCents, taxCents, totalCents, depositCents, balanceCents: totalCents - depositCents };
}

/**
 * Parse a money amount typed by a person ("1,234.5", "$80") into integer cents exactly, by
 * string, so 0.1 + 0.2 style float errors never reach the ledger. Null when it is not an amount.
 */
export function parseMoneyToCents(input: string): number | null {
  const s = input.trim().replace(/^\$/, "").replace(/,/g, "");
  const m = /^(-)?(\d+)(?:\.(\d{0,2}))?$/.exec(s);
  if (!m) return null;
  const cents = Number(m[2]) * 100 + Number((m[3] ?? "").padEnd(2, "0"));
  if (!Number.isSafeInteger(cents)) return null;
  return m[1] ? -cents : cents;
}

/** The date a quote stops being valid: `validityDays` whole days after issue. */
export function validUntil(issuedAt: Date, validityDays: number): Date {
  return new Date(issuedAt.getTime() + validityDays * 86_400_000);
}
