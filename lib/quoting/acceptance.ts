import { freightTo, type Crate, type FreightRules, type FreightZone } from "../estimating/freight";
import { quoteTotals, type LineKind } from "./lines";

/** A quote line as acceptance reads it. */
export interface AcceptLine {
  kind: LineKind | string;
  partId: string | null;
  description: string;
  quantity: number;
  unitCents: number;
  amountCents: number;
  /** The estimate's amount; a freight line sales changed by hand keeps its price. */
  estimatedCents: number | null;
}

export interface AcceptQuoteFigures {
  marginBp: number;
  taxBp: number;
  depositBp: number;
}

export interface OrderFigures {
  lines: { kind: string; partId: string | null; description: string; quantity: number; unitCents: number; amountCents: number }[];
  subtotalCents: number;
  marginCents: number;
  taxBp: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
  /** Σ freight lines after re-pricing. */
  freightCents: number;
  /** Did anything move from the quote (freight to this ship-to, or no tax)? */
  isChanged: boolean;
}

/**
 * The order's figures for the ship-to picked at acceptance: each part's freight line, as the
 * estimate priced it (not edited by sales), is priced again from the part's crate for the
 * ship-to's zone; with a valid tax exemption the tax is nil. Margin, tax and deposit follow in
 * the quote's rates and order (lib/quoting/lines.ts quoteTotals), so an unchanged ship-to and no
 * exemption give the quote's own totals.
 */
export function orderFiguresFor(input: {
  lines: AcceptLine[];
  rates: AcceptQuoteFigures;
  /** Each part's crate (from its estimate); parts with none keep their quoted freight. */
  crates: Map<string, Crate>;
  rules: FreightRules | null;
  zone: FreightZone | null;
  taxExempt: boolean;
}): OrderFigures {
  let isChanged = false;
  const lines = input.lines.map((l) => {
    const crate = l.partId ? input.crates.get(l.partId) : undefined;
    const byHand = l.estimatedCents === null || l.estimatedCents !== l.amountCents;
    if (l.kind !== "freight" || !crate || !input.rules || !input.zone || byHand) {
      return { kind: l.kind, partId: l.partId, description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents };
    }
    const f = freightTo(crate, input.zone, input.rules);
    const amountCents = Math.round(l.quantity * f.perCrateCents);
    // A multi-part quote's lines start with the part's name ("Hull plug: Freight …").
    const at = l.description.indexOf(": Freight");
    const prefix = at >= 0 ? l.description.slice(0, at + 2) : "";
    const description = `${prefix}Freight to ${input.zone.name}${f.flatbed ? " (flatbed, oversize)" : ""}`;
    if (amountCents !== l.amountCents || description !== l.description) isChanged = true;
    return { kind: l.kind, partId: l.partId, description, quantity: l.quantity, unitCents: f.perCrateCents, amountCents };
  });
  const taxBp = input.taxExempt ? 0 : input.rates.taxBp;
  if (taxBp !== input.rates.taxBp) isChanged = true;
  const t = quoteTotals(lines, { marginBp: input.rates.marginBp, taxBp, depositBp: input.rates.depositBp });
  const freightCents = lines.filter((l) => l.kind === "freight").reduce((s, l) => s + l.amountCents, 0);
  return { lines, ...t, taxBp, freightCents, isChanged };
}
