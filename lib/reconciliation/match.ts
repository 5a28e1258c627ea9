/**
 * Reconciliation of our ledger against the payment processor's records, pure: plain rows in,
 * one finding per payment, charge and refund out. Amounts in integer cents.
 */

import { PAYMENT_STATE_LABEL } from "../labels";

export interface LedgerPayment {
  id: string;
  orderId: string;
  kind: "deposit" | "balance";
  status: "pending" | "paid" | "failed" | "expired" | "refunded" | "partially_refunded";
  amountCents: number;
  feeCents: number | null;
  refundedCents: number;
  paymentIntentId: string | null;
  chargeId: string | null;
}

export interface LedgerRefund {
  id: string;
  paymentId: string;
  amountCents: number;
  status: "pending" | "succeeded" | "failed";
  stripeRefundId: string | null;
}

export interface ProcessorCharge {
  id: string;
  amount: number;
  amountRefunded: number;
  status: string;
  paymentIntentId: string | null;
  balanceTransactionId: string | null;
  paymentId: string | null;
}

export interface ProcessorIntent {
  id: string;
  amountReceived: number;
  status: string;
  latestChargeId: string | null;
  paymentId: string | null;
}

export interface ProcessorBalanceTxn {
  id: string;
  fee: number;
  source: string | null;
}

export interface ProcessorRefund {
  id: string;
  amount: number;
  status: string;
  chargeId: string | null;
}

export type FindingKind = "matched" | "missing_ours" | "missing_theirs" | "amount_mismatch";

export interface Difference {
  field: "amount" | "fee" | "refunded";
  oursCents: number | null;
  theirsCents: number | null;
}

export interface Finding {
  kind: FindingKind;
  subject: "payment" | "refund";
  paymentId: string | null;
  orderId: string | null;
  refundId: string | null;
  processorId: string | null;
  oursCents: number | null;
  theirsCents: number | null;
  differences: Difference[];
  note: string;
}

export interface ReconcileInput {
  payments: LedgerPayment[];
  refunds: LedgerRefund[];
  charges: ProcessorCharge[];
  intents: ProcessorIntent[];
  balanceTransactions: ProcessorBalanceTxn[];
  processorRefunds: ProcessorRefund[];
}

const MONEY_MOVED = new Set<LedgerPayment["status"]>(["paid", "refunded", "partially_refunded"]);

/**
 * Match each ledger payment to its processor charge (by charge id, else by payment intent, else
 * by our payment id in the processor's metadata) and each refund by its processor id.
 * - matched: both sides agree on amount, fee and refunded amount;
 * - amount_mismatch: both sides have it, with different figures (each difference listed);
 * - missing_theirs: our ledger says money moved, the processor has no succeeded charge or refund;
 * - missing_ours: the processor took or returned money our ledger does not record as such.
 * Pending payments with no charge are not findings (nothing has happened yet).
 */
export function reconcile(input: ReconcileInput): Finding[] {
  const chargeById = new Map(input.charges.map((c) => [c.id, c]));
  const intentById = new Map(input.intents.map((i) => [i.id, i]));
  const feeBySource = new Map(input.balanceTransactions.filter((t) => t.source).map((t) => [t.source!, t.fee]));
  const usedCharges = new Set<string>();
  const findings: Finding[] = [];

  const chargeFor = (p: LedgerPayment): ProcessorCharge | undefined => {
    if (p.chargeId && chargeById.has(p.chargeId)) return chargeById.get(p.chargeId);
    const intent = p.paymentIntentId ? intentById.get(p.paymentIntentId) : undefined;
    if (intent?.latestChargeId && chargeById.has(intent.latestChargeId)) return chargeById.get(intent.latestChargeId);
    const succeeded = (c: ProcessorCharge) => c.status === "succeeded";
    return (
      input.charges.find((c) => succeeded(c) && p.paymentIntentId !== null && c.paymentIntentId === p.paymentIntentId) ??
      input.charges.find((c) => succeeded(c) && c.paymentId === p.id)
    );
  };

  for (const p of input.payments) {
    const charge = chargeFor(p);
    if (charge) usedCharges.add(charge.id);
    const base = { subject: "payment" as const, paymentId: p.id, orderId: p.orderId, refundId: null, oursCents: p.amountCents };
    const theirsOk = charge && charge.status === "succeeded";
    if (!MONEY_MOVED.has(p.status)) {
      if (theirsOk) {
        findings.push({ ...base, kind: "missing_ours", processorId: charge.id, theirsCents: charge.amount, differences: [], note: `The processor took this ${p.kind}, but our ledger still says “${PAYMENT_STATE_LABEL[p.status]}”.` });
      }
      continue;
    }
    if (!theirsOk) {
      findings.push({ ...base, kind: "missing_theirs", processorId: charge?.id ?? null, theirsCents: null, differences: [], note: `Our ledger says this ${p.kind} was paid; the processor has no completed payment for it.` });
      continue;
    }
    const differences: Difference[] = [];
    if (charge.amount !== p.amountCents) differences.push({ field: "amount", oursCents: p.amountCents, theirsCents: charge.amount });
    const fee = charge.balanceTransactionId !== null ? (feeBySource.get(charge.id) ?? null) : null;
    if (fee !== null && p.feeCents !== fee) differences.push({ field: "fee", oursCents: p.feeCents, theirsCents: fee });
    if (charge.amountRefunded !== p.refundedCents) differences.push({ field: "refunded", oursCents: p.refundedCents, theirsCents: charge.amountRefunded });
    findings.push({
      ...base,
      kind: differences.length ? "amount_mismatch" : "matched",
      processorId: charge.id,
      theirsCents: charge.amount,
      differences,
      note: differences.length ? differences.map(describe).join("; ") : "Agrees with the processor.",
    });
  }

  for (const c of input.charges) {
    if (usedCharges.has(c.id) || c.status !== "succeeded") continue;
    findings.push({ kind: "missing_ours", subject: "payment", paymentId: c.paymentId, orderId: null, refundId: null, processorId: c.id, oursCents: null, theirsCents: c.amount, differences: [], note: "The processor took this payment; no ledger payment records it." });
  }

  const paymentById = new Map(input.payments.map((p) => [p.id, p]));
  const processorRefundById = new Map(input.processorRefunds.map((r) => [r.id, r]));
  const usedRefunds = new Set<string>();
  for (const r of input.refunds) {
    if (r.status === "failed") continue;
    const theirs = r.stripeRefundId ? processorRefundById.get(r.stripeRefundId) : undefined;
    if (theirs) usedRefunds.add(theirs.id);
    const base = { subject: "refund" as const, paymentId: r.paymentId, orderId: paymentById.get(r.paymentId)?.orderId ?? null, refundId: r.id, processorId: theirs?.id ?? r.stripeRefundId, oursCents: r.amountCents };
    if (!theirs || theirs.status === "failed" || theirs.status === "canceled") {
      findings.push({ ...base, kind: "missing_theirs", theirsCents: null, differences: [], note: r.status === "pending" ? "Refund still pending on our side and unknown to the processor." : "Our ledger records this refund; the processor has none." });
      continue;
    }
    const same = theirs.amount === r.amountCents;
    findings.push({
      ...base,
      kind: same ? "matched" : "amount_mismatch",
      theirsCents: theirs.amount,
      differences: same ? [] : [{ field: "amount", oursCents: r.amountCents, theirsCents: theirs.amount }],
      note: same ? "Agrees with the processor." : describe({ field: "amount", oursCents: r.amountCents, theirsCents: theirs.amount }),
    });
  }
  for (const r of input.processorRefunds) {
    if (usedRefunds.has(r.id) || r.status === "failed" || r.status === "canceled") continue;
    const payment = input.payments.find((p) => p.chargeId !== null && p.chargeId === r.chargeId);
    findings.push({ kind: "missing_ours", subject: "refund", paymentId: payment?.id ?? null, orderId: payment?.orderId ?? null, refundId: null, processorId: r.id, oursCents: null, theirsCents: r.amount, differences: [], note: "The processor returned money our ledger has no refund for." });
  }
  return findings;
}

function describe(d: Difference): string {
  const f = (c: number | null) => (c === null ? "none" : (c / 100).toFixed(2));
  return `${d.field}: ours ${f(d.oursCents)}, processor ${f(d.theirsCents)}`;
}

/** Counts per kind, for the summary line. */
export function summarise(findings: Finding[]): Record<FindingKind, number> {
  const out: Record<FindingKind, number> = { matched: 0, missing_ours: 0, missing_theirs: 0, amount_mismatch: 0 };
  for (const f of findings) out[f.kind]++;
  return out;
}
