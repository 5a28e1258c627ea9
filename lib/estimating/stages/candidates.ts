import { r4 } from "../round";
import type { BuildMode, EstimateAlternative, Orientation } from "../types";
import type { Candidate } from "./choose";

/** How the candidate search (./choose.ts) ranks its candidates and reports the ones it did not pick. */

/** Whole dollars, for the search's own sentences. */
export const money = (c: number) => `$${(c / 100).toLocaleString("en-US", { maximumFractionDigits: 0 })}`;

const key = (o: Orientation) => `${o.up}${o.swapped ? "'" : ""}`;

/** The build as reported: the fill, prefixed "vertical-" for a vertical build. */
export const buildModeOf = (c: Pick<Candidate, "vertical" | "bp">): BuildMode => (c.vertical ? `vertical-${c.bp.printMode}` : c.bp.printMode);

/** Ordering of candidates: printable first, then the lowest total, the earlier ship date, fewer hours; the rest breaks ties so the pick is stable. */
export function compareCandidates(a: Candidate, b: Candidate): number {
  const sa = a.status === "priced" ? 0 : 1, sb = b.status === "priced" ? 0 : 1;
  if (sa !== sb) return sa - sb;
  if (sa === 1 && a.bp.flaggedLayers !== b.bp.flaggedLayers && a.fitsCell === b.fitsCell) return a.bp.flaggedLayers - b.bp.flaggedLayers;
  if (sa === 1 && a.fitsCell !== b.fitsCell) return a.fitsCell ? -1 : 1;
  return a.pricing.totalCents - b.pricing.totalCents
    || a.schedule.shipDate.localeCompare(b.schedule.shipDate)
    || (a.bp.printHours + a.bp.dwellHours) - (b.bp.printHours + b.bp.dwellHours)
    || a.cell.key.localeCompare(b.cell.key)
    || key(a.orientation).localeCompare(key(b.orientation))
    || Number(a.vertical) - Number(b.vertical)
    || a.bp.beadWidthMm - b.bp.beadWidthMm || a.bp.layerHeightMm - b.bp.layerHeightMm
    || a.bp.partsPerBuild - b.bp.partsPerBuild;
}

/** A candidate as reported beside the pick, with why it was not picked. */
export function alternative(c: Candidate, chosen: Candidate): EstimateAlternative {
  let whyNot = "";
  if (c !== chosen) {
    const why: string[] = [];
    if (!c.fitsCell) why.push("does not fit whole");
    if (c.bp.flaggedLayers > 0) why.push(`${c.bp.flaggedLayers} layers outside the cooling window`);
    const d = c.pricing.totalCents - chosen.pricing.totalCents;
    if (d > 0) why.push(`${money(d)} more`);
    else if (d < 0 && chosen.status === "priced" && c.status !== "priced") why.push(`${money(-d)} less but not printable as planned`);
    if (c.schedule.shipDate > chosen.schedule.shipDate) why.push(`ships later (${c.schedule.shipDate})`);
    else if (c.schedule.shipDate === chosen.schedule.shipDate && d === 0) why.push("same total and date; the search's tie-break");
    whyNot = why.join("; ") || "not better on total or date";
  }
  return {
    cell: c.cell.key, cellName: c.cell.name, orientation: c.orientation, beadWidthMm: c.bp.beadWidthMm, layerHeightMm: c.bp.layerHeightMm,
    printMode: buildModeOf(c), shellWalls: c.bp.shellWalls, printHours: r4(c.bp.printHours), dwellHours: r4(c.bp.dwellHours), massKg: r4(c.bp.massKg),
    flaggedLayers: c.bp.flaggedLayers, totalCents: c.pricing.totalCents, shipDate: c.schedule.shipDate, status: c.status, whyNot,
  };
}
