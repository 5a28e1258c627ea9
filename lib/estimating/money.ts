/**
 * The estimator's one rounding rule: amounts are computed in fractional cents and rounded once,
 * half away from zero, to integer cents.
 */
export function roundCents(cents: number): number {
  if (!Number.isFinite(cents)) throw new RangeError("amount is not a finite number");
  const r = Math.sign(cents) * Math.round(Math.abs(cents));
  return r === 0 ? 0 : r; // no −0
}

/** cents × basis points / 10 000, rounded by the same rule. */
export function applyBp(cents: number, bp: number): number {
  return roundCents((cents * bp) / 10_000);
}
