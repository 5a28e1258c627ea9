import type { LeadTime, LeadTimeKey } from "../estimating/types";
import type { DraftLine } from "./lines";

export const LEAD_TIME_LABEL: Record<LeadTimeKey, string> = { standard: "Standard", expedite: "Expedited", economy: "Economy" };

/** A request's delivery choice over its parts: the latest part's ship date and the sum of totals. */
export interface RequestLeadTime {
  key: LeadTimeKey;
  shipDate: string;
  totalCents: number;
  adjustmentCents: number;
}

/** A part's choices; an estimate made before the choices were offered has standard only. */
const choicesOf = (r: { leadTimes?: LeadTime[]; shipDate: string; totalCents: number }): LeadTime[] =>
  r.leadTimes?.length ? r.leadTimes : [{ key: "standard", shipDate: r.shipDate, totalCents: r.totalCents, adjustmentCents: 0 }];

/**
 * The choices a whole request offers: one a key every part offers (economy only where every
 * part's cells have room), shipping when its last part does, at the parts' summed totals.
 */
export function requestLeadTimes(results: { leadTimes?: LeadTime[]; shipDate: string; totalCents: number }[]): RequestLeadTime[] {
  if (results.length === 0) return [];
  const keys: LeadTimeKey[] = ["standard", "expedite", "economy"];
  const out: RequestLeadTime[] = [];
  for (const key of keys) {
    const per = results.map((r) => choicesOf(r).find((l) => l.key === key));
    if (per.some((l) => !l)) continue;
    const all = per as LeadTime[];
    out.push({ key, shipDate: all.map((l) => l.shipDate).sort().at(-1)!, totalCents: all.reduce((s, l) => s + l.totalCents, 0), adjustmentCents: all.reduce((s, l) => s + l.adjustmentCents, 0) });
  }
  return out;
}

/**
 * The quote lines of a delivery choice: one per part, the estimate's own adjustment before margin
 * (expedite: overtime premium and fee; economy: the discount, negative). None for standard.
 */
export function leadTimeLines(parts: { partId: string; partName: string; leadTimes?: LeadTime[] }[], key: LeadTimeKey): DraftLine[] {
  if (key === "standard") return [];
  return parts.flatMap((p) => {
    const l = p.leadTimes?.find((x) => x.key === key);
    if (!l || l.adjustmentCents === 0) return [];
    const what = key === "expedite" ? "Expedited delivery: extra shifts and weekends, ahead of work with time to spare" : "Economy delivery: later date, fitted into spare capacity";
    return [{ partId: p.partId, kind: key === "expedite" ? ("option" as const) : ("other" as const), description: parts.length > 1 ? `${p.partName}: ${what}` : what, quantity: 1, unitCents: l.adjustmentCents, amountCents: l.adjustmentCents, estimatedCents: l.adjustmentCents, editReason: null }];
  });
}
