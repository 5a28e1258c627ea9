/**
 * What the payment processor holds for the seeded payments, so the local payment fake can be
 * loaded with matching records (and the reconciliation page has real matches to show). A few
 * deliberate differences are added by the fake's loader for the mismatch demo.
 */
export interface SeedProcessorRecord {
  kind: "charge";
  id: string;
  paymentIntentId: string;
  checkoutSessionId: string;
  amountCents: number;
  feeCents: number;
  /** Refunded since (a seeded refund after delivery). */
  refundedCents?: number;
  createdAt: string;
}

export function processorRecordsFor(row: {
  status: string;
  chargeId: string | null;
  paymentIntentId: string | null;
  checkoutSessionId: string | null;
  amountCents: number;
  feeCents: number | null;
  paidAt: Date | null;
}): SeedProcessorRecord[] {
  if (row.status !== "paid" || !row.chargeId || !row.paymentIntentId || !row.checkoutSessionId) return [];
  return [
    {
      kind: "charge",
      id: row.chargeId,
      paymentIntentId: row.paymentIntentId,
      checkoutSessionId: row.checkoutSessionId,
      amountCents: row.amountCents,
      feeCents: row.feeCents ?? 0,
      createdAt: (row.paidAt ?? new Date()).toISOString(),
    },
  ];
}

type StripeLike = Record<string, unknown>;

/**
 * The records as the payment API's objects (charges, payment intents, balance transactions), with
 * three deliberate differences so the reconciliation page has each kind of mismatch to show:
 * the first paid payment is missing at the processor, the second differs in amount, and one
 * processor charge has no ledger row at all.
 */
export function processorObjectsFor(records: SeedProcessorRecord[]): {
  charges: StripeLike[];
  payment_intents: StripeLike[];
  balance_transactions: StripeLike[];
  refunds: StripeLike[];
} {
  const refunds: StripeLike[] = [];
  const charges: StripeLike[] = [];
  const intents: StripeLike[] = [];
  const txns: StripeLike[] = [];
  const add = (r: SeedProcessorRecord, amount: number) => {
    const created = Math.floor(new Date(r.createdAt).getTime() / 1000);
    const txn = `txn_${r.id.slice(3)}`;
    charges.push({ id: r.id, amount, amount_captured: amount, amount_refunded: r.refundedCents ?? 0, currency: "usd", status: "succeeded", paid: true, refunded: (r.refundedCents ?? 0) >= amount, captured: true, payment_intent: r.paymentIntentId, balance_transaction: txn, created, metadata: { checkoutSessionId: r.checkoutSessionId } });
    intents.push({ id: r.paymentIntentId, amount, amount_received: amount, currency: "usd", status: "succeeded", latest_charge: r.id, created, metadata: {} });
    txns.push({ id: txn, amount, fee: r.feeCents, net: amount - r.feeCents, currency: "usd", type: "charge", source: r.id, created, status: "available" });
    if (r.refundedCents) {
      // The seed's refund ids follow its charge ids: ch_seed_b012 → re_seed_b012.
      refunds.push({ id: r.id.replace(/^ch_/, "re_"), amount: r.refundedCents, charge: r.id, payment_intent: r.paymentIntentId, currency: "usd", status: "succeeded", created: created + 86_400, metadata: {} });
    }
  };
  records.forEach((r, i) => {
    if (i === 0) return; // missing on the processor's side
    add(r, i === 1 ? r.amountCents + 10_000 : r.amountCents); // i === 1: amount mismatch of $100
  });
  const last = records.at(-1);
  if (last) {
    add({ ...last, id: "ch_seed_stray001", paymentIntentId: "pi_seed_stray001", checkoutSessionId: "cs_test_seed_stray001", amountCents: 125_000, feeCents: 3_655 }, 125_000);
  }
  return { charges, payment_intents: intents, balance_transactions: txns, refunds };
}
