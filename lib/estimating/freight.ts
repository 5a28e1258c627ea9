import { roundCents } from "./money";

/**
 * Crating and freight by destination. Pure: the crate comes from the estimate (the near-net
 * size plus padding, the machined part's mass plus the crate's own), the rates from the rate
 * card's zone table. Money in integer cents, lengths mm, masses kg.
 */

/** One destination zone of the rate card's freight table. */
export interface FreightZone {
  key: string;
  name: string;
  /**
   * Where the zone applies: ISO 3166-2 subdivision codes ("US-TX"), ISO 3166-1 country codes
   * ("CA"), or "*" for everywhere else. The most specific match wins.
   */
  regions: string[];
  /** Per crate: a base charge plus a rate per billable kg. */
  baseCents: number;
  centsPerKg: number;
  /** Added per crate that needs an open flatbed (oversize or overweight for a closed trailer). */
  flatbedSurchargeCents: number;
  /** Working days in transit, shown to the client. */
  transitDays: number;
}

export interface FreightRules {
  zones: FreightZone[];
  /** The zone priced when the firm has no ship-to yet. */
  defaultZoneKey: string;
  /**
   * Billable mass is the larger of the gross mass and the crate's volume times this factor,
   * kg/m³ (dimensional weight; road freight commonly bills 1 m³ as 333 kg: common practice,
   * from memory).
   */
  dimKgPerM3: number;
  /** The crate's own mass per m³ of its outside volume, kg/m³ (timber crate: demo value). */
  crateTareKgPerM3: number;
  /**
   * The inside of a closed trailer, mm, and its payload, kg: a crate that fits no way round, or
   * is heavier, goes on a flatbed. A 53 ft dry van is about 15.9 m × 2.49 m × 2.69 m inside and
   * carries about 20 t (common practice, from memory).
   */
  closedTrailer: { lengthMm: number; widthMm: number; heightMm: number; maxKg: number };
}

export interface Crate {
  /** Outside size, mm. */
  sizeMm: [number, number, number];
  /** Part plus crate, kg. */
  grossKg: number;
  needsFlatbed: boolean;
}

export interface FreightQuote {
  zoneKey: string;
  zoneName: string;
  billableKg: number;
  /** Per crate, cents. */
  perCrateCents: number;
  flatbed: boolean;
  transitDays: number;
}

const r1 = (v: number) => Math.round(v * 10) / 10;

/** The crate round one part, from its outside size (the near-net size padded on every side) and the part's mass. */
export function crateFor(crateSizeMm: readonly number[], partMassKg: number, rules: Pick<FreightRules, "crateTareKgPerM3" | "closedTrailer"> | null): Crate {
  const sizeMm = [0, 1, 2].map((i) => Math.round(crateSizeMm[i] ?? 0)) as [number, number, number];
  const m3 = (sizeMm[0] * sizeMm[1] * sizeMm[2]) / 1e9;
  const grossKg = r1(partMassKg + (rules ? rules.crateTareKgPerM3 * m3 : 0));
  return { sizeMm, grossKg, needsFlatbed: rules ? needsFlatbed(sizeMm, grossKg, rules.closedTrailer) : false };
}

/**
 * Does the crate need an open flatbed? It rides a closed trailer when, laid on any face, its
 * three sides fit the trailer's height, width and length (smallest to height), and its mass the payload.
 */
export function needsFlatbed(sizeMm: readonly number[], grossKg: number, t: FreightRules["closedTrailer"]): boolean {
  const [a, b, c] = [...sizeMm].sort((x, y) => x - y) as [number, number, number];
  const inside = [t.heightMm, t.widthMm, t.lengthMm].sort((x, y) => x - y) as [number, number, number];
  return a > inside[0] || b > inside[1] || c > inside[2] || grossKg > t.maxKg;
}

/**
 * The zone of a destination: an exact subdivision match ("US-TX") first, then the country, then
 * "*"; null when nothing matches (the table has no catch-all).
 */
export function zoneFor(rules: FreightRules, country: string, region: string | null | undefined): FreightZone | null {
  const c = country.trim().toUpperCase();
  const sub = region ? `${c}-${region.trim().toUpperCase()}` : null;
  const find = (code: string) => rules.zones.find((z) => z.regions.some((r) => r.toUpperCase() === code));
  return (sub ? find(sub) : undefined) ?? find(c) ?? find("*") ?? null;
}

/** A zone by key; the default zone when the key is absent or no longer in the table. */
export function zoneByKey(rules: FreightRules, key: string | null | undefined): FreightZone | null {
  return (key ? rules.zones.find((z) => z.key === key) : undefined) ?? rules.zones.find((z) => z.key === rules.defaultZoneKey) ?? rules.zones[0] ?? null;
}

/** Freight of one crate to one zone: base + rate × billable kg, plus the flatbed surcharge. */
export function freightTo(crate: Crate, zone: FreightZone, rules: Pick<FreightRules, "dimKgPerM3">): FreightQuote {
  const m3 = (crate.sizeMm[0] * crate.sizeMm[1] * crate.sizeMm[2]) / 1e9;
  const billableKg = r1(Math.max(crate.grossKg, m3 * rules.dimKgPerM3));
  const perCrateCents = roundCents(zone.baseCents + zone.centsPerKg * billableKg + (crate.needsFlatbed ? zone.flatbedSurchargeCents : 0));
  return { zoneKey: zone.key, zoneName: zone.name, billableKg, perCrateCents, flatbed: crate.needsFlatbed, transitDays: zone.transitDays };
}
