import type { Stage } from "../db/schema/common";

/**
 * The product's words for its stored values: what every screen, e-mail and export shows for a
 * stage, a payment's or a quote's state, a document's kind, an audit entry. Keys stay in code and
 * the API; people read these. DEVELOPERS.md ("Glossary") lists the same words with their meaning:
 * a new screen reuses them rather than printing a raw value.
 */

export const STAGE_LABEL: Record<Stage, string> = {
  draft: "Draft",
  submitted: "Submitted",
  quoted: "Quote ready",
  accepted: "Accepted, deposit due",
  deposit_paid: "Deposit paid",
  scheduled: "Scheduled",
  printing: "Printing",
  cooling: "Cooling",
  machining: "Machining",
  inspection: "Inspection",
  finishing: "Finishing",
  packed: "Packed",
  shipped: "Shipped",
  delivered: "Delivered",
  closed: "Closed",
  on_hold: "On hold",
  cancelled: "Cancelled",
};

/** One tone per stage, by who has the order: the client and sales, the shop floor, the carrier. */
export type LabelTone = "neutral" | "accent" | "ok" | "warn" | "danger" | "info";
export const STAGE_TONE: Record<Stage, LabelTone> = {
  draft: "neutral",
  submitted: "info",
  quoted: "info",
  accepted: "info",
  deposit_paid: "accent",
  scheduled: "accent",
  printing: "accent",
  cooling: "accent",
  machining: "accent",
  inspection: "accent",
  finishing: "accent",
  packed: "accent",
  shipped: "ok",
  delivered: "ok",
  closed: "neutral",
  on_hold: "warn",
  cancelled: "danger",
};

/** A stage's name, in the middle of a sentence ("The order is deposit paid" reads badly). */
export function stageName(stage: Stage): string {
  const label = STAGE_LABEL[stage];
  return stage === "accepted" ? "accepted" : label.charAt(0).toLowerCase() + label.slice(1);
}

export type PaymentState = "pending" | "paid" | "failed" | "expired" | "refunded" | "partially_refunded";
/** A card payment's state. `expired` is a payment page left without paying: nothing was taken. */
export const PAYMENT_STATE_LABEL: Record<PaymentState, string> = {
  pending: "Awaiting payment",
  paid: "Paid",
  failed: "Declined",
  expired: "Not completed",
  refunded: "Refunded",
  partially_refunded: "Part refunded",
};
export const PAYMENT_STATE_TONE: Record<PaymentState, LabelTone> = {
  pending: "info",
  paid: "ok",
  failed: "danger",
  expired: "neutral",
  refunded: "warn",
  partially_refunded: "warn",
};

export type RefundState = "pending" | "succeeded" | "failed";
export const REFUND_STATE_LABEL: Record<RefundState, string> = { pending: "Being returned", succeeded: "Returned", failed: "Not returned" };
export const REFUND_STATE_TONE: Record<RefundState, LabelTone> = { pending: "info", succeeded: "ok", failed: "danger" };

export type QuoteState = "draft" | "issued" | "accepted" | "superseded" | "expired" | "declined";
export const QUOTE_STATE_LABEL: Record<QuoteState, string> = {
  draft: "Draft",
  issued: "Open",
  accepted: "Accepted",
  superseded: "Replaced",
  expired: "Expired",
  declined: "Declined",
};
export const QUOTE_STATE_TONE: Record<QuoteState, LabelTone> = {
  draft: "neutral",
  issued: "accent",
  accepted: "ok",
  superseded: "neutral",
  expired: "warn",
  declined: "danger",
};

/** How the client's part is cured in the tool: sets the temperature the tool must take. */
export const CURE_LABEL: Record<"room" | "oven" | "autoclave", string> = { room: "Room-temperature cure", oven: "Oven cure", autoclave: "Autoclave cure" };

export const PAYMENT_KIND_LABEL: Record<"deposit" | "balance", string> = { deposit: "Deposit", balance: "Balance" };

export const DOCUMENT_KIND_LABEL: Record<string, string> = {
  quote: "Quotation",
  inspection_report: "Inspection report",
  invoice: "Invoice",
  receipt: "Receipt",
  attachment: "Attachment",
  drawing: "Drawing",
};

export * from "./audit-labels";

export type PaymentTermsKey = "prepay" | "net30" | "net45" | "net60";
/** How a firm pays: up front (deposit, then balance), or on account on net terms. */
export const PAYMENT_TERMS_LABEL: Record<PaymentTermsKey, string> = {
  prepay: "Deposit and balance",
  net30: "Net 30",
  net45: "Net 45",
  net60: "Net 60",
};

/** How a payment is made. Screens say "bank transfer", never the processor's object names. */
export const PAYMENT_METHOD_LABEL: Record<"card" | "bank_transfer" | "manual", string> = {
  card: "Card",
  bank_transfer: "Bank transfer",
  manual: "Recorded by accounts",
};

/** What a bank transfer that arrived did. */
export const FUNDS_STATUS_LABEL: Record<"applied" | "short" | "over" | "unmatched" | "late", string> = {
  applied: "Applied in full",
  short: "Short",
  over: "Over",
  unmatched: "Unknown reference",
  late: "Late",
};
export const FUNDS_STATUS_TONE: Record<keyof typeof FUNDS_STATUS_LABEL, LabelTone> = {
  applied: "ok",
  short: "warn",
  over: "warn",
  unmatched: "danger",
  late: "warn",
};

/** An invoice on terms. */
export const INVOICE_STANDING_LABEL: Record<"paid" | "not_invoiced" | "open" | "due_soon" | "overdue", string> = {
  paid: "Paid",
  not_invoiced: "Invoiced when it ships",
  open: "Open",
  due_soon: "Due soon",
  overdue: "Overdue",
};
export const INVOICE_STANDING_TONE: Record<keyof typeof INVOICE_STANDING_LABEL, LabelTone> = {
  paid: "ok",
  not_invoiced: "neutral",
  open: "info",
  due_soon: "warn",
  overdue: "danger",
};

/** A tax-exemption certificate; "expired" is an approved one past its expiry. */
export const EXEMPTION_STATE_LABEL: Record<"pending" | "approved" | "rejected" | "expired", string> = {
  pending: "Waiting for accounts",
  approved: "Approved",
  rejected: "Not accepted",
  expired: "Expired",
};
export const EXEMPTION_STATE_TONE: Record<keyof typeof EXEMPTION_STATE_LABEL, LabelTone> = {
  pending: "info",
  approved: "ok",
  rejected: "danger",
  expired: "warn",
};
