/**
 * Near-net growth by the Steiner formula for the parallel body at distance t
 * (P. M. Gruber, Convex and Discrete Geometry, 2007, p. 106):
 *   V(t) = V + S·t + M·t² + (4/3)·π·t³,  M = ½ Σ edge length × exterior dihedral angle.
 * Exact for convex bodies; with signed (negative, concave) angles it is an estimate for
 * non-convex parts, where the true grown volume is a little smaller.
 */
export function steinerVolume(volumeMm3: number, areaMm2: number, mMm: number, tMm: number): number {
  return volumeMm3 + areaMm2 * tMm + mMm * tMm * tMm + (4 / 3) * Math.PI * tMm ** 3;
}

/** 2D Steiner for a section grown by r: area A + P·r + π·r², perimeter P + 2π·r (one outer contour). */
export function grownSection(areaMm2: number, perimeterMm: number, rMm: number): { area: number; perimeter: number } {
  return { area: areaMm2 + perimeterMm * rMm + Math.PI * rMm * rMm, perimeter: perimeterMm + 2 * Math.PI * rMm };
}
