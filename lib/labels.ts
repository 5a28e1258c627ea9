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

/** What an audit entry records, in words; an unknown action falls back to its key. */
export const AUDIT_ACTION_LABEL: Record<string, string> = {
  "member.invite": "Colleague invited",
  "member.remove": "Colleague removed",
  "org.billing": "Billing details changed",
  "quote.accept": "Quote accepted",
  "quote.create": "Quote drafted",
  "quote.update": "Quote draft edited",
  "quote.issue": "Quote sent",
  "request.create": "Request made",
  "part.revision": "New file revision",
  "refund.request": "Refund asked for",
  "refund.failed": "Refund not made",
  "refund.made": "Refund made",
  // Entries written before the words above were settled.
  "refund.succeeded": "Refund made",
  "material.version": "Material edited",
  "cell.version": "Printing cell edited",
  "rate_card.version": "Rate card edited",
  "order.release_cell": "Cell time released",
  "order.ship": "Order shipped",
  "order.schedule": "Order scheduled",
  "order.reschedule": "Order rescheduled",
  "order.actuals": "Actual hours recorded",
  "order.inspection_report": "Inspection report filed",
  "message.post": "Message posted",
  "staff.update": "Staff member changed",
  "staff.invite": "Staff member invited",
  "staff.reinvite": "Staff invitation sent again",
  "staff.accept_invitation": "Staff invitation accepted",
  "ledger.export": "Ledger exported",
  "file.download": "File downloaded",
  "file.download_refused": "File download refused",
  "file.preview": "3D preview opened",
  "stage.change": "Stage changed",
  "payment.amount_mismatch": "Payment amount did not match",
  "payment.paid": "Payment received",
};

export function auditActionLabel(action: string): string {
  return AUDIT_ACTION_LABEL[action] ?? action.replace(/[._]/g, " ");
}

const AUDIT_ENTITY_LABEL: Record<string, string> = {
  user: "Person",
  organisation: "Client firm",
  request: "Request",
  part: "Part",
  revision: "File revision",
  quote: "Quote",
  order: "Order",
  payment: "Payment",
  material: "Material",
  cell: "Printing cell",
  rate_card: "Rate card",
  ledger: "Ledger",
  file: "File",
};

export function auditEntityLabel(entityType: string): string {
  return AUDIT_ENTITY_LABEL[entityType] ?? entityType.replace(/_/g, " ");
}

/** Names of the fields audit entries record, for the audit view. */
export const AUDIT_FIELD_LABEL: Record<string, string> = {
  processorReference: "processor reference",
  paymentIntentId: "processor reference",
  stripeRefundId: "processor reference",
  session: "payment page",
  refundId: "refund",
  refundedCents: "refunded (cents)",
  amountCents: "amount (cents)",
  totalCents: "total (cents)",
  cellKey: "cell",
  poNumber: "PO number",
  receiptNumber: "receipt number",
};
