import { describe, expect, it } from "vitest";
import { reconcile, summarise, type LedgerPayment, type ReconcileInput } from "./match";

const pay = (id: string, over: Partial<LedgerPayment> = {}): LedgerPayment => ({
  id, orderId: `o-${id}`, kind: "deposit", status: "paid", amountCents: 100_000, feeCents: 2_930,
  refundedCents: 0, paymentIntentId: `pi_${id}`, chargeId: `ch_${id}`, ...over,
});
const charge = (id: string, over: Partial<ReconcileInput["charges"][number]> = {}) => ({
  id: `ch_${id}`, amount: 100_000, amountRefunded: 0, status: "succeeded", paymentIntentId: `pi_${id}`,
  balanceTransactionId: `txn_${id}`, paymentId: id, ...over,
});
const txn = (id: string, fee = 2_930) => ({ id: `txn_${id}`, fee, source: `ch_${id}` });

/** One seeded set with each kind of finding. */
function seededSet(): ReconcileInput {
  return {
    payments: [
      pay("ok"),
      pay("amount", { amountCents: 100_000 }),
      pay("fee", { feeCents: 2_000 }),
      pay("gone"), // ours paid, processor nothing
      pay("stuck", { status: "pending", chargeId: null }), // webhook lost: processor paid, ours pending
      pay("open", { status: "pending", chargeId: null, paymentIntentId: null }), // not paid yet: no finding
      pay("refunded", { status: "partially_refunded", refundedCents: 20_000 }),
      pay("byintent", { chargeId: null }), // matched through the intent's latest charge
    ],
    refunds: [
      { id: "r1", paymentId: "refunded", amountCents: 20_000, status: "succeeded", stripeRefundId: "re_1" },
      { id: "r2", paymentId: "ok", amountCents: 5_000, status: "succeeded", stripeRefundId: "re_missing" },
    ],
    charges: [
      charge("ok"),
      charge("amount", { amount: 99_000 }),
      charge("fee"),
      charge("stuck"),
      charge("refunded", { amountRefunded: 20_000 }),
      charge("byintent"),
      charge("stranger", { paymentId: null, paymentIntentId: "pi_x" }),
      charge("declined", { status: "failed", paymentId: null, paymentIntentId: "pi_y", balanceTransactionId: null }),
    ],
    intents: [{ id: "pi_byintent", amountReceived: 100_000, status: "succeeded", latestChargeId: "ch_byintent", paymentId: "byintent" }],
    balanceTransactions: [txn("ok"), txn("amount"), txn("fee"), txn("stuck"), txn("refunded"), txn("byintent"), txn("stranger")],
    processorRefunds: [
      { id: "re_1", amount: 20_000, status: "succeeded", chargeId: "ch_refunded" },
      { id: "re_extra", amount: 7_500, status: "succeeded", chargeId: "ch_fee" },
    ],
  };
}

describe("reconcile", () => {
  const findings = reconcile(seededSet());
  const of = (paymentId: string, subject = "payment") => findings.filter((f) => f.paymentId === paymentId && f.subject === subject);

  it("matches agreeing payments, also through the payment intent", () => {
    expect(of("ok")[0]!.kind).toBe("matched");
    expect(of("byintent")[0]).toMatchObject({ kind: "matched", processorId: "ch_byintent" });
    expect(of("refunded")[0]!.kind).toBe("matched");
  });
  it("reports amount and fee mismatches with both figures", () => {
    expect(of("amount")[0]).toMatchObject({ kind: "amount_mismatch", differences: [{ field: "amount", oursCents: 100_000, theirsCents: 99_000 }] });
    expect(of("fee")[0]).toMatchObject({ kind: "amount_mismatch", differences: [{ field: "fee", oursCents: 2_000, theirsCents: 2_930 }] });
  });
  it("reports money ours says moved but the processor lacks", () => {
    expect(of("gone")[0]!.kind).toBe("missing_theirs");
    expect(findings.find((f) => f.refundId === "r2")!.kind).toBe("missing_theirs");
  });
  it("reports money the processor moved that ours lacks", () => {
    expect(of("stuck")[0]).toMatchObject({ kind: "missing_ours", processorId: "ch_stuck" });
    expect(findings.find((f) => f.processorId === "ch_stranger")!.kind).toBe("missing_ours");
    expect(findings.find((f) => f.processorId === "re_extra")).toMatchObject({ kind: "missing_ours", subject: "refund", paymentId: "fee" });
  });
  it("leaves unpaid payments and declined charges alone", () => {
    expect(of("open")).toEqual([]);
    expect(findings.find((f) => f.processorId === "ch_declined")).toBeUndefined();
  });
  it("summarises each kind", () => {
    expect(summarise(findings)).toEqual({ matched: 4, amount_mismatch: 2, missing_theirs: 2, missing_ours: 3 });
  });
  it("flags a refunded amount that differs between the sides", () => {
    const set = seededSet();
    set.charges = set.charges.map((c) => (c.id === "ch_refunded" ? { ...c, amountRefunded: 30_000 } : c));
    expect(reconcile(set).find((f) => f.paymentId === "refunded" && f.subject === "payment")!.differences).toEqual([
      { field: "refunded", oursCents: 20_000, theirsCents: 30_000 },
    ]);
  });
});
