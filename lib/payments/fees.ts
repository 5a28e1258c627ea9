import { and, eq, isNull } from "drizzle-orm";
import type Stripe from "stripe";
import type { Db } from "../../db/client";
import { payments } from "../../db/schema";
import { getStripe, retrieveChargeFee } from "./stripe";

/**
 * Record the processor's charge id and processing fee on a paid payment, so reconciliation
 * compares like with like. Called after the payment webhook commits (the checkout session the
 * webhook carries has no fee); writes only where the fee is still unrecorded, so it is safe to
 * repeat. Answers what it recorded, or null when the processor has no settled charge yet.
 */
export async function recordProcessorFee(db: Db, paymentId: string, stripe: Stripe = getStripe()): Promise<{ chargeId: string; feeCents: number } | null> {
  const [p] = await db.select({ intent: payments.paymentIntentId, fee: payments.feeCents }).from(payments).where(eq(payments.id, paymentId));
  if (!p?.intent || p.fee !== null) return null;
  const found = await retrieveChargeFee(p.intent, stripe);
  if (!found) return null;
  await db.update(payments).set({ chargeId: found.chargeId, feeCents: found.feeCents }).where(and(eq(payments.id, paymentId), isNull(payments.feeCents)));
  return found;
}
