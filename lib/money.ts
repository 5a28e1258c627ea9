/** Money is integer cents everywhere; this is the one rounding rule (half away from zero). */
export function roundCents(value: number): number {
  if (!Number.isFinite(value)) throw new RangeError(`Not a finite amount: ${value}`);
  return Math.sign(value) * Math.round(Math.abs(value));
}

/** A share in basis points of an amount in cents (5000 bp = half). */
export function shareOfCents(amountCents: number, bp: number): number {
  return roundCents((amountCents * bp) / 10_000);
}

/** Format for display only. */
export function formatCents(cents: number, currency = "usd"): string {
  return new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);
}
