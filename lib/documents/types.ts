import type { IssuedDocumentKind } from "../../db/schema/issued-documents";

/**
 * The frozen snapshot a document is drawn from. Written once at issue into
 * `issued_documents.data`; the PDF is rendered from it and nothing else, so the document shows
 * what was true when it was issued even after the order, the firm or the catalogue change.
 * Money in integer cents, masses in kg, dates as ISO strings (UTC).
 */
export interface Party {
  name: string;
  lines: string[];
}

export interface DocumentLine {
  description: string;
  quantity: number;
  unitCents: number;
  amountCents: number;
}

export interface DocumentTotals {
  /** Sum of the lines. */
  subtotalCents: number;
  /** The bureau's margin on the lines; the PDF spreads it inside the lines, as every client screen does. */
  marginCents: number;
  taxBp: number;
  taxCents: number;
  totalCents: number;
}

interface Base {
  kind: IssuedDocumentKind;
  /** Filled from the numbering when the document is inserted. */
  number?: string;
  issuedAt: string;
  /** Scope of the document (not printed). */
  requestId: string;
  orgId: string;
  currency: string;
  bureau: Party;
  client: Party;
  reference: string;
  projectName: string;
  poNumber: string | null;
  cautions: string[];
  /** Where the order ships (invoices, packing list) or where freight was priced to (quote). */
  shipTo?: Party | null;
  /** Why no tax is charged (a valid exemption certificate), printed under the totals. */
  taxNote?: string | null;
}

export interface QuoteData extends Base {
  kind: "quote";
  version: number;
  validUntil: string | null;
  shipDate: string | null;
  /** The delivery quoted: standard, expedited or economy (older documents: standard). */
  leadTime?: "standard" | "expedite" | "economy";
  lines: DocumentLine[];
  totals: DocumentTotals;
  depositBp: number;
  depositCents: number;
  terms: { version: number; title: string; paragraphs: string[] } | null;
  /** The quote's own commercial terms as sales wrote them (payment, duties…). */
  quoteTerms: string;
  notes: string;
}

export interface DepositInvoiceData extends Base {
  kind: "deposit_invoice";
  quoteNumber: string | null;
  quoteVersion: number;
  orderTotalCents: number;
  depositBp: number;
  lines: DocumentLine[];
  totals: DocumentTotals;
  paidAt: string | null;
  paymentReference: string | null;
  /** How it was paid ("card", "bank transfer"…); absent on documents issued before transfers. */
  paidBy?: string | null;
  termsVersion: number | null;
}

/** Where to send a bank transfer and the reference to quote, printed on an invoice. */
export interface TransferInstructions {
  reference: string;
  bankName: string;
  accountHolder: string;
  accountNumber: string;
  routingNumber: string;
  swiftCode: string | null;
}

export interface BalanceInvoiceData extends Base {
  kind: "invoice";
  quoteNumber: string | null;
  quoteVersion: number;
  lines: DocumentLine[];
  totals: DocumentTotals;
  deposit: { invoiceNumber: string | null; amountCents: number; isPaid: boolean };
  balanceDueCents: number;
  dueText: string;
  termsVersion: number | null;
  /** Net terms ("Net 30") and the due date, for an invoice on account. */
  paymentTerms?: string | null;
  dueAt?: string | null;
  /** The bank transfer opened for this balance, when there is one. */
  transfer?: TransferInstructions | null;
}

export interface CreditNoteData extends Base {
  kind: "credit_note";
  invoiceNumber: string | null;
  paymentKind: "deposit" | "balance";
  reason: string;
  lines: DocumentLine[];
  totals: DocumentTotals;
}

export interface PackingItem {
  part: string;
  quantity: number;
  material: string;
  fileName: string | null;
  revision: number | null;
  sizeMm: [number, number, number] | null;
  partMassKg: number | null;
}

export interface PackingListData extends Base {
  kind: "packing_list";
  items: PackingItem[];
  totalMassKg: number | null;
  carrier: string | null;
  trackingNumber: string | null;
  shippedAt: string;
  unitsPref: "mm" | "in";
  inspection: string | null;
}

export type DocumentData = QuoteData | DepositInvoiceData | BalanceInvoiceData | CreditNoteData | PackingListData;
