/** Unit conversions (exact, NIST SP 811 Appendix B) and display in the user's preferred units. */
export const MM_PER_IN = 25.4;
export const KG_PER_LB = 0.45359237;

export type UnitsPref = "mm" | "in";

export const mmToIn = (mm: number) => mm / MM_PER_IN;
export const inToMm = (inch: number) => inch * MM_PER_IN;
export const kgToLb = (kg: number) => kg / KG_PER_LB;
export const cToF = (c: number) => (c * 9) / 5 + 32;
export const fToC = (f: number) => ((f - 32) * 5) / 9;

const fmt = (v: number, digits: number) => v.toLocaleString("en-US", { maximumFractionDigits: digits, minimumFractionDigits: 0 });

export function formatLength(mm: number, pref: UnitsPref, digits = 1): string {
  return pref === "in" ? `${fmt(mmToIn(mm), digits + 1)} in` : `${fmt(mm, digits)} mm`;
}

export function formatSize(mm: readonly number[], pref: UnitsPref): string {
  return pref === "in"
    ? `${mm.map((v) => fmt(mmToIn(v), 1)).join(" × ")} in`
    : `${mm.map((v) => fmt(v, 0)).join(" × ")} mm`;
}

export function formatMass(kg: number, pref: UnitsPref): string {
  return pref === "in" ? `${fmt(kgToLb(kg), 0)} lb` : `${fmt(kg, 1)} kg`;
}

export function formatVolume(mm3: number, pref: UnitsPref): string {
  return pref === "in" ? `${fmt(mm3 / 16_387.064, 0)} in³` : `${fmt(mm3 / 1e6, 2)} L`;
}

export function formatTemp(c: number, pref: UnitsPref): string {
  return pref === "in" ? `${fmt(cToF(c), 0)} °F` : `${fmt(c, 0)} °C`;
}

/**
 * A temperature in both scales, the user's first: "250 °F (121 °C)". A cure temperature is typed
 * in either, so it is shown back in both.
 */
export function formatTempBoth(c: number, pref: UnitsPref): string {
  const f = `${fmt(cToF(c), 0)} °F`;
  const cc = `${fmt(c, 0)} °C`;
  return pref === "in" ? `${f} (${cc})` : `${cc} (${f})`;
}

export function formatHours(hours: number): string {
  return `${fmt(hours, 1)} h`;
}
