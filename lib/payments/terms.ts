import type { PaymentTerms } from "../../db/schema/organisations";

/** Days from the invoice date to the due date for each net term (net 30 = thirty calendar days). Trade usage. */
export const NET_DAYS: Record<Exclude<PaymentTerms, "prepay">, number> = { net30: 30, net45: 45, net60: 60 };

/** Days before the due date when the reminder goes out (common practice; the bureau's choice). */
export const REMINDER_DAYS_BEFORE = 5;

const DAY_MS = 86_400_000;

export function isOnAccount(terms: PaymentTerms): terms is Exclude<PaymentTerms, "prepay"> {
  return terms !== "prepay";
}

/**
 * When an invoice issued at `invoicedAt` on these terms falls due: the end (23:59:59.999 UTC) of
 * the calendar day N days after the invoice's date. Documents print days in UTC, and that instant
 * is the same day in the plant's zone too, so every screen and the PDF name one due date.
 */
export function dueDateFor(terms: Exclude<PaymentTerms, "prepay">, invoicedAt: Date): Date {
  return new Date(Date.UTC(invoicedAt.getUTCFullYear(), invoicedAt.getUTCMonth(), invoicedAt.getUTCDate() + NET_DAYS[terms], 23, 59, 59, 999));
}

export interface CreditCheck {
  ok: boolean;
  /** What the firm may still take on account before this order, cents (never below 0). */
  availableCents: number;
  /** By how much this order would pass the limit, cents (0 when it fits). */
  overByCents: number;
}

/**
 * Does an order fit the firm's credit: what it already owes on account (open invoices and
 * accepted orders not yet invoiced) plus this order, against its limit. At the limit exactly fits.
 */
export function checkCredit(input: { limitCents: number; openCents: number; orderCents: number }): CreditCheck {
  const availableCents = Math.max(0, input.limitCents - input.openCents);
  const overByCents = Math.max(0, input.openCents + input.orderCents - input.limitCents);
  return { ok: overByCents === 0, availableCents, overByCents };
}

export type InvoiceStanding = "paid" | "not_invoiced" | "open" | "due_soon" | "overdue";

/** Where an invoice on terms stands at `now`: due soon from REMINDER_DAYS_BEFORE days ahead, overdue after the due instant. */
export function invoiceStanding(input: { dueAt: Date | null; isPaid: boolean; now: Date }): InvoiceStanding {
  if (input.isPaid) return "paid";
  if (!input.dueAt) return "not_invoiced";
  const t = input.now.getTime();
  if (t > input.dueAt.getTime()) return "overdue";
  if (t >= input.dueAt.getTime() - REMINDER_DAYS_BEFORE * DAY_MS) return "due_soon";
  return "open";
}

/** Whole days an invoice is past its due date at `now` (0 when not past). */
export function daysOverdue(dueAt: Date, now: Date): number {
  return Math.max(0, Math.floor((now.getTime() - dueAt.getTime()) / DAY_MS));
}

export type ArrivalStatus = "applied" | "short" | "over" | "unmatched" | "late";

export interface ArrivalOutcome {
  status: ArrivalStatus;
  /** Applied to the payment from this arrival, cents. */
  appliedCents: number;
  /** Left in the firm's balance at the processor, cents. */
  leftCents: number;
  /** The payment is now paid in full. */
  isSettled: boolean;
}

/**
 * What a bank transfer that arrived does to the payment its reference names: applied up to what
 * is still owed; short when less, over when more (the rest stays in the firm's balance for
 * accounts to return or apply); late when it settles a payment after its due date; unmatched when
 * the reference names no open payment (nothing applied).
 */
export function applyArrival(input: { amountCents: number; owedCents: number | null; receivedAt: Date; dueAt: Date | null }): ArrivalOutcome {
  if (input.owedCents === null || input.owedCents <= 0) return { status: "unmatched", appliedCents: 0, leftCents: input.amountCents, isSettled: false };
  const appliedCents = Math.min(input.amountCents, input.owedCents);
  const leftCents = input.amountCents - appliedCents;
  const isSettled = appliedCents === input.owedCents;
  const status: ArrivalStatus = !isSettled ? "short" : leftCents > 0 ? "over" : input.dueAt && input.receivedAt.getTime() > input.dueAt.getTime() ? "late" : "applied";
  return { status, appliedCents, leftCents, isSettled };
}
