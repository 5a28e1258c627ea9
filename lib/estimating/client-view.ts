import type { EstimateResult } from "./types";

/**
 * What a client is shown of an estimate. Alternatives are cell, total and ship date only (the
 * search's reasons and remedies are the bureau's working); a needs-review estimate withholds its
 * price (lines, totals and the alternatives' totals), because the bureau's engineer will quote it.
 * Only printable alternatives are offered: a cheaper cell whose plan needs the engineer's review is
 * not a choice the client can make. A split part's pieces keep their builds and hours but not their own
 * lines, which are before margin. Staff screens and the CLI show the whole result.
 */
export function clientEstimate(r: EstimateResult): EstimateResult & { priceWithheld: boolean } {
  const withheld = (r.status ?? "priced") === "needs-review";
  const alternatives = (r.alternatives ?? []).filter((a) => (a.status ?? "priced") === "priced").map((a) => ({
    cell: a.cell, cellName: a.cellName, totalCents: withheld ? 0 : a.totalCents, shipDate: a.shipDate,
  })) as unknown as EstimateResult["alternatives"];
  // a split part's pieces: their builds and hours, not their own lines (those are before margin)
  const pieces = r.pieces?.map((p) => ({ ...p, lines: [], subtotalCents: 0 }));
  // delivery choices: date and total only (the adjustment is before margin; the jobs gone ahead of are the bureau's)
  const leadTimes = (r.leadTimes ?? []).map((l) => ({ key: l.key, shipDate: l.shipDate, totalCents: withheld ? 0 : l.totalCents, adjustmentCents: 0 }));
  const base = { ...r, alternatives, remedies: [], leadTimes: withheld ? leadTimes.filter((l) => l.key === "standard") : leadTimes, priceWithheld: withheld, ...(pieces ? { pieces } : {}) };
  if (!withheld) return base;
  return { ...base, lines: [], subtotalCents: 0, marginCents: 0, taxCents: 0, totalCents: 0, depositCents: 0, balanceCents: 0, printRateCentsPerH: 0 };
}

/** A stored result (plain JSON from the database) as the client sees it; null stays null. */
export function clientEstimateOf(result: unknown): (EstimateResult & { priceWithheld: boolean }) | null {
  if (!result || typeof result !== "object") return null;
  return clientEstimate(result as EstimateResult);
}
