import type Stripe from "stripe";
import type { Db } from "../../db/client";
import { getIntentWithoutFee, setProcessorFee } from "../../db/queries/payments";
import { getStripe, retrieveChargeFee } from "./stripe";

/**
 * Record the processor's charge id and processing fee on a paid payment, so reconciliation
 * compares like with like. Called after the payment webhook commits (the checkout session the
 * webhook carries has no fee); writes only where the fee is still unrecorded, so it is safe to
 * repeat. Answers what it recorded, or null when the processor has no settled charge yet.
 */
export async function recordProcessorFee(db: Db, paymentId: string, stripe: Stripe = getStripe()): Promise<{ chargeId: string; feeCents: number } | null> {
  const intent = await getIntentWithoutFee(db, paymentId);
  if (!intent) return null;
  const found = await retrieveChargeFee(intent, stripe);
  if (!found) return null;
  await setProcessorFee(db, paymentId, found);
  return found;
}
