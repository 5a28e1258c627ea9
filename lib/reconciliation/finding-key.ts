import type { Finding } from "./match";

/**
 * What a finding is about, stable across runs, so accounts' notes stay with it: our refund or
 * payment when the ledger has one, else the processor's object.
 */
export function findingKey(f: Pick<Finding, "subject" | "paymentId" | "refundId" | "processorId">): string {
  if (f.subject === "refund" && f.refundId) return `refund:${f.refundId}`;
  if (f.subject === "payment" && f.paymentId) return `payment:${f.paymentId}`;
  return `processor:${f.processorId ?? "unknown"}`;
}
