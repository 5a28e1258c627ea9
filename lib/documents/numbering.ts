import type { IssuedDocumentKind } from "../../db/schema/issued-documents";

export { SERIES_BY_KIND, formatDocumentNumber, parseDocumentNumber, seriesYear } from "../../db/document-number";

/** Human names of the kinds, for lists, e-mails and the PDFs' titles. */
export const KIND_TITLES: Record<IssuedDocumentKind, string> = {
  quote: "Quotation",
  deposit_invoice: "Deposit invoice",
  invoice: "Invoice",
  credit_note: "Credit note",
  packing_list: "Packing list",
};
