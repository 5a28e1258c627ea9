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
