import type { CellParams, MaterialFamily, MaterialParams } from "./types";

/**
 * What a cell's extruder and dryers can feed. A screw's output falls as the melt gets hotter and
 * stiffer: a 40 mm-class screw lays about 90 kg/h and a 60 mm-class one about 225 kg/h of a
 * commodity polymer, less of a high-temperature one (common practice). Pellets are dried before
 * they reach the screw: a hopper of `hopperKg` holding each charge for the material's drying hours
 * can feed at most hopperKg ÷ hours kg/h on a long print (residence-time rule for hopper dryers,
 * common practice), so sustained deposition is the lower of the two.
 */

/** A material's family: the catalogue's, else from its melt range (≥ 300 °C high-temperature, ≥ 250 °C engineering; bureau practice). */
export function familyOf(m: Pick<MaterialParams, "family" | "meltTempMinC">): MaterialFamily {
  if (m.family) return m.family;
  return m.meltTempMinC >= 300 ? "high-temp" : m.meltTempMinC >= 250 ? "engineering" : "commodity";
}

export const FAMILY_LABEL: Record<MaterialFamily, string> = { commodity: "commodity", engineering: "engineering", "high-temp": "high-temperature" };

/** Extruder output for the material, kg/h. */
export function extruderOutputFor(cell: CellParams, m: MaterialParams): number {
  return cell.outputKgPerHByFamily?.[familyOf(m)] ?? cell.extruderOutputKgPerH;
}

/** Can the cell's barrel reach the material's lowest melt temperature? (No stated limit: yes.) */
export function canMelt(cell: CellParams, m: MaterialParams): boolean {
  return cell.maxMeltTempC === undefined || m.meltTempMinC <= cell.maxMeltTempC;
}

export interface Drying {
  /** The material's drying time before its pellets may be fed, h. */
  hours: number;
  tempC: number;
  /** The hopper feeding this material, kg. */
  dryerKg: number;
  /** Sustained feed one hopper allows: dryerKg ÷ hours, kg/h. */
  maxKgPerH: number;
}

/**
 * Drying of a material on a cell, or null for a cell with no dryer stated (older rows). One hopper
 * feeds one material: the other dries the next material ahead of a change (bureau practice).
 */
export function dryingFor(cell: CellParams, m: MaterialParams): Drying | null {
  if (!cell.dryer || cell.dryer.hopperKg <= 0) return null;
  const hours = Math.max(0, m.dryingHours);
  return { hours, tempC: m.dryingTempC, dryerKg: cell.dryer.hopperKg, maxKgPerH: hours > 0 ? cell.dryer.hopperKg / hours : Infinity };
}

export interface Feed {
  /** Sustained deposition the cell can keep up for the material, kg/h. */
  kgPerH: number;
  /** What sets it: the screw's output or the dryer's. */
  limitedBy: "extruder" | "dryer";
  drying: Drying | null;
}

export function feedFor(cell: CellParams, m: MaterialParams): Feed {
  const out = extruderOutputFor(cell, m);
  const drying = dryingFor(cell, m);
  if (drying && drying.maxKgPerH < out) return { kgPerH: drying.maxKgPerH, limitedBy: "dryer", drying };
  return { kgPerH: out, limitedBy: "extruder", drying };
}
