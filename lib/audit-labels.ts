/** The audit log in words: what each entry records, of what, and the fields it names (see lib/labels.ts). */

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
  "org.terms": "Payment terms set",
  "invoice.overdue": "Invoice overdue",
  "transfer.opened": "Bank transfer opened",
  "transfer.received": "Bank transfer arrived",
  "transfer.resolved": "Bank transfer settled by accounts",
  "payment.manual": "Payment recorded by accounts",
  "tax_exemption.upload": "Tax-exemption certificate sent",
  "tax_exemption.review": "Tax-exemption certificate reviewed",
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
  tax_exemption: "Tax-exemption certificate",
  transfer_funds: "Bank transfer",
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
