import { applyBp } from "./estimating/money";

/** Money is integer cents everywhere, with one rounding rule, the estimator's (half away from zero, no −0). */
export { roundCents } from "./estimating/money";

/** A share in basis points of an amount in cents (5000 bp = half). */
export function shareOfCents(amountCents: number, bp: number): number {
  return applyBp(amountCents, bp);
}

/** Format for display only. */
export function formatCents(cents: number, currency = "usd"): string {
  return new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);
}
