/**
 * What the documents' builders (./build.ts) read and share: the request and firm, the parties,
 * the cautions of every part, the quote's lines and totals, and an order's context.
 */
import type { Db } from "../../db/client";
import type { Tx } from "../../db/queries/audit";
import { getIssuedDocumentBySource, getQuoteWithLines, getRequestWithFirm } from "../../db/queries/issued-documents";
import { listPartsWithAnalysis } from "../../db/queries/parts";
import { getOrder } from "../../db/queries/payments";
import { addressLines } from "../validation/address";
import { getBillingAddress } from "../../db/queries/addresses";
import { bureauParty } from "./bureau";
import type { DocumentLine, DocumentTotals, Party } from "./types";

export type Q = Db | Tx;

/** Printed on every document of a part that can hurt someone, beside the analysis' own cautions. */
export const GENERAL_CAUTION =
  "Large printed tools are heavy and may be hot after printing or machining: use lifting equipment rated for the load, gloves and eye protection, and follow local codes, licensed rigging practice and your own engineering sign-off.";

export async function requestAndFirm(q: Q, requestId: string) {
  const row = await getRequestWithFirm(q, requestId);
  if (!row) throw new Error(`documents: request ${requestId} not found`);
  const billing = await getBillingAddress(q, row.request.orgId);
  return { ...row, firm: { ...row.firm, billing } };
}

type AddressLike = Parameters<typeof addressLines>[0];

/** The firm as billed: contact, billing address (the order's copy when it has one), e-mail. */
export function clientParty(firm: { name: string; billingContact: string | null; billingEmail: string | null; billing: AddressLike | null }, billTo?: AddressLike | null): Party {
  const address = billTo ?? firm.billing;
  return { name: firm.name, lines: [firm.billingContact, ...(address ? addressLines(address) : []), firm.billingEmail].filter((x): x is string => Boolean(x)) };
}

export function shipParty(a: (AddressLike & { label: string; zoneName?: string | null; deliveryNotes?: string | null; phone?: string | null }) | null | undefined, firmName: string, withZone = false): Party | null {
  if (!a) return null;
  const extra = [a.phone ? `Phone ${a.phone}` : null, a.deliveryNotes ? `Delivery: ${a.deliveryNotes}` : null, withZone && a.zoneName ? `Freight: ${a.zoneName}` : null];
  return { name: `${firmName}, ${a.label}`, lines: [...addressLines(a), ...extra].filter((x): x is string => Boolean(x)) };
}

/** "No tax charged: …" for an order accepted under an exemption certificate. */
export function taxNoteOf(ex: { certificateNumber: string; issuedBy: string; expiresOn: string } | null | undefined): string | null {
  if (!ex) return null;
  const until = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(new Date(ex.expiresOn));
  return `No tax charged: the buyer holds tax-exemption certificate ${ex.certificateNumber} (issued by ${ex.issuedBy}, valid until ${until}), on file with the bureau.`;
}

/** The cautions of every part's analysis, de-duplicated, then the general one. */
export async function cautionsFor(q: Q, requestId: string): Promise<{ cautions: string[]; parts: Awaited<ReturnType<typeof listPartsWithAnalysis>> }> {
  const parts = await listPartsWithAnalysis(q, requestId);
  const seen = new Set<string>();
  for (const p of parts) {
    const r = p.analysis?.status === "done" ? p.analysis.result : null;
    for (const c of r?.cautions ?? []) seen.add(`${parts.length > 1 ? `${p.part.name}: ` : ""}${c}`);
  }
  return { cautions: [...seen, GENERAL_CAUTION], parts };
}

export async function quoteWithLines(q: Q, quoteId: string) {
  const found = await getQuoteWithLines(q, quoteId);
  if (!found) throw new Error(`documents: quote ${quoteId} not found`);
  const { quote, lines } = found;
  return { quote, lines: lines.map((l): DocumentLine => ({ description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents })) };
}

export function quoteTotals(quote: { subtotalCents: number; marginCents: number; taxBp: number; taxCents: number; totalCents: number }): DocumentTotals {
  return { subtotalCents: quote.subtotalCents, marginCents: quote.marginCents, taxBp: quote.taxBp, taxCents: quote.taxCents, totalCents: quote.totalCents };
}

/** A gross amount's tax share at the quote's rate, so tax on a part payment matches the whole. */
export function taxIncluded(grossCents: number, orderTotalCents: number, orderTaxCents: number): number {
  if (orderTotalCents === 0) return 0;
  return Math.round((grossCents * orderTaxCents) / orderTotalCents);
}

export async function orderContext(q: Q, orderId: string) {
  const order = await getOrder(q, orderId);
  if (!order) throw new Error(`documents: order ${orderId} not found`);
  const { request, firm } = await requestAndFirm(q, order.requestId);
  const { quote, lines } = await quoteWithLines(q, order.quoteId);
  const quoteDoc = await getIssuedDocumentBySource(q, "quote", quote.id);
  // An order whose figures moved from the quote's (freight to its ship-to, no tax) keeps its own.
  const own = order.lines && order.subtotalCents !== null;
  const orderLines: DocumentLine[] = own ? order.lines!.map((l) => ({ description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents })) : lines;
  const totals: DocumentTotals = own
    ? { subtotalCents: order.subtotalCents!, marginCents: order.marginCents ?? 0, taxBp: order.taxBp ?? 0, taxCents: order.taxCents ?? 0, totalCents: order.totalCents }
    : quoteTotals(quote);
  const shipTo = shipParty(order.shipTo, firm.name);
  const client = clientParty(firm, order.billTo);
  const taxNote = taxNoteOf(order.taxExemption);
  /** What every order document's head says: who issues it, to whom, for which request and order. */
  const head = { bureau: bureauParty(), client, taxNote, requestId: request.id, orgId: request.orgId, reference: request.reference, projectName: request.projectName, poNumber: order.poNumber };
  return { order, request, firm, quote, lines: orderLines, totals, quoteNumber: quoteDoc?.number ?? null, shipTo, client, head };
}
