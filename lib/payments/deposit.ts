import { shareOfCents } from "../money";

/**
 * Split an order total into the deposit paid on acceptance and the balance paid on shipping.
 * The deposit is the rate card's share (basis points) of the total, rounded half away from zero
 * to whole cents by lib/money; the balance is the exact remainder, so the two always add up.
 */
export function splitDeposit(totalCents: number, depositBp: number): { depositCents: number; balanceCents: number } {
  if (!Number.isInteger(totalCents) || totalCents < 0) throw new RangeError(`totalCents must be a whole, non-negative number of cents, got ${totalCents}`);
  if (!Number.isInteger(depositBp) || depositBp < 0 || depositBp > 10_000) throw new RangeError(`depositBp must be 0…10000, got ${depositBp}`);
  const depositCents = shareOfCents(totalCents, depositBp);
  return { depositCents, balanceCents: totalCents - depositCents };
}

/** What is owed now for an order, by kind; null when nothing is due yet. */
export function amountDue(
  order: { depositCents: number; balanceCents: number },
  kind: "deposit" | "balance",
  paid: { deposit: boolean; balance: boolean },
): number | null {
  if (kind === "deposit") return paid.deposit || order.depositCents <= 0 ? null : order.depositCents;
  return paid.balance || order.balanceCents <= 0 ? null : order.balanceCents;
}
