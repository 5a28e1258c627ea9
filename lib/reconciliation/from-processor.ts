import "server-only";
import type Stripe from "stripe";
import type { ProcessorBalanceTxn, ProcessorCharge, ProcessorIntent, ProcessorRefund } from "./match";

/** The processor's lists (lib/payments/stripe.ts listProcessorRecords), as plain rows. Types only: no SDK call here. */
export interface ProcessorLists {
  charges: Stripe.Charge[];
  paymentIntents: Stripe.PaymentIntent[];
  balanceTransactions: Stripe.BalanceTransaction[];
  refunds: Stripe.Refund[];
}

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === "string" ? v : v.id);

export function fromProcessor(lists: ProcessorLists): {
  charges: ProcessorCharge[];
  intents: ProcessorIntent[];
  balanceTransactions: ProcessorBalanceTxn[];
  processorRefunds: ProcessorRefund[];
} {
  return {
    charges: lists.charges.map((c) => ({
      id: c.id,
      amount: c.amount_captured ?? c.amount,
      amountRefunded: c.amount_refunded ?? 0,
      status: c.status,
      paymentIntentId: idOf(c.payment_intent),
      balanceTransactionId: idOf(c.balance_transaction),
      paymentId: c.metadata?.paymentId ?? null,
    })),
    intents: lists.paymentIntents.map((i) => ({
      id: i.id,
      amountReceived: i.amount_received ?? 0,
      status: i.status,
      latestChargeId: idOf(i.latest_charge),
      paymentId: i.metadata?.paymentId ?? null,
    })),
    balanceTransactions: lists.balanceTransactions.map((t) => ({ id: t.id, fee: t.fee, source: idOf(t.source as string | { id: string } | null) })),
    processorRefunds: lists.refunds.map((r) => ({ id: r.id, amount: r.amount, status: r.status ?? "succeeded", chargeId: idOf(r.charge) })),
  };
}
