import { PAYMENT_METHOD_LABEL, PAYMENT_TERMS_LABEL } from "../labels";
import { formatDate } from "../dates";
import { NET_DAYS } from "../payments/terms";
import type { Db } from "../../db/client";
import type { Tx } from "../../db/queries/audit";
import { getIssuedDocumentBySource, getQuoteWithLines, getRequestWithFirm, getTermsVersion } from "../../db/queries/issued-documents";
import { listPartsWithAnalysis } from "../../db/queries/parts";
import { getLatestBalanceTransfer, getOrder, getPayment, listReceivedDeposits } from "../../db/queries/payments";
import { getRefundWithPayment } from "../../db/queries/refunds";
import { zoneFor } from "../estimating/freight";
import { addressLines } from "../validation/address";
import { getBillingAddress, getDefaultShipTo } from "../../db/queries/addresses";
import { getCurrentRateCard, getRateCardById } from "../../db/queries/catalogue";
import { bureauParty } from "./bureau";
import type { BalanceInvoiceData, CreditNoteData, DepositInvoiceData, DocumentLine, DocumentTotals, PackingListData, Party, QuoteData } from "./types";

type Q = Db | Tx;

/** Printed on every document of a part that can hurt someone, beside the analysis' own cautions. */
export const GENERAL_CAUTION =
  "Large printed tools are heavy and may be hot after printing or machining: use lifting equipment rated for the load, gloves and eye protection, and follow local codes, licensed rigging practice and your own engineering sign-off.";

async function requestAndFirm(q: Q, requestId: string) {
  const row = await getRequestWithFirm(q, requestId);
  if (!row) throw new Error(`documents: request ${requestId} not found`);
  const billing = await getBillingAddress(q, row.request.orgId);
  return { ...row, firm: { ...row.firm, billing } };
}

type AddressLike = Parameters<typeof addressLines>[0];

/** The firm as billed: contact, billing address (the order's copy when it has one), e-mail. */
function clientParty(firm: { name: string; billingContact: string | null; billingEmail: string | null; billing: AddressLike | null }, billTo?: AddressLike | null): Party {
  const address = billTo ?? firm.billing;
  return { name: firm.name, lines: [firm.billingContact, ...(address ? addressLines(address) : []), firm.billingEmail].filter((x): x is string => Boolean(x)) };
}

function shipParty(a: (AddressLike & { label: string; zoneName?: string | null; deliveryNotes?: string | null; phone?: string | null }) | null | undefined, firmName: string, withZone = false): Party | null {
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
async function cautionsFor(q: Q, requestId: string): Promise<{ cautions: string[]; parts: Awaited<ReturnType<typeof listPartsWithAnalysis>> }> {
  const parts = await listPartsWithAnalysis(q, requestId);
  const seen = new Set<string>();
  for (const p of parts) {
    const r = p.analysis?.status === "done" ? p.analysis.result : null;
    for (const c of r?.cautions ?? []) seen.add(`${parts.length > 1 ? `${p.part.name}: ` : ""}${c}`);
  }
  return { cautions: [...seen, GENERAL_CAUTION], parts };
}

async function quoteWithLines(q: Q, quoteId: string) {
  const found = await getQuoteWithLines(q, quoteId);
  if (!found) throw new Error(`documents: quote ${quoteId} not found`);
  const { quote, lines } = found;
  return { quote, lines: lines.map((l): DocumentLine => ({ description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents })) };
}

function quoteTotals(quote: { subtotalCents: number; marginCents: number; taxBp: number; taxCents: number; totalCents: number }): DocumentTotals {
  return { subtotalCents: quote.subtotalCents, marginCents: quote.marginCents, taxBp: quote.taxBp, taxCents: quote.taxCents, totalCents: quote.totalCents };
}

/** A gross amount's tax share at the quote's rate, so tax on a part payment matches the whole. */
export function taxIncluded(grossCents: number, orderTotalCents: number, orderTaxCents: number): number {
  if (orderTotalCents === 0) return 0;
  return Math.round((grossCents * orderTaxCents) / orderTotalCents);
}

export async function buildQuoteData(q: Q, quoteId: string, now: Date): Promise<QuoteData> {
  const { quote, lines } = await quoteWithLines(q, quoteId);
  const { request, firm } = await requestAndFirm(q, quote.requestId);
  const defaultShipTo = await getDefaultShipTo(q, request.orgId);
  const card = await (quote.rateCardId ? getRateCardById(q as Db, quote.rateCardId) : getCurrentRateCard(q as Db));
  const zone = defaultShipTo && card?.params.freight ? zoneFor(card.params.freight, defaultShipTo.country, defaultShipTo.region) : null;
  const { cautions } = await cautionsFor(q, request.id);
  const terms = quote.termsVersion ? await getTermsVersion(q, quote.termsVersion) : null;
  return {
    kind: "quote",
    issuedAt: (quote.issuedAt ?? now).toISOString(),
    currency: quote.currency,
    bureau: bureauParty(),
    client: clientParty(firm),
    requestId: request.id,
    orgId: request.orgId,
    reference: request.reference,
    projectName: request.projectName,
    poNumber: null,
    cautions,
    shipTo: defaultShipTo ? shipParty({ ...defaultShipTo, zoneName: zone?.name ?? null }, firm.name, true) : null,
    version: quote.version,
    validUntil: quote.validUntil?.toISOString() ?? null,
    shipDate: quote.shipDate?.toISOString() ?? null,
    leadTime: quote.leadTime ?? "standard",
    lines,
    totals: quoteTotals(quote),
    depositBp: quote.depositBp,
    depositCents: quote.depositCents,
    terms: terms ? { version: terms.version, title: terms.title, paragraphs: terms.body.split(/\n\s*\n/).map((p) => p.trim()).filter(Boolean) } : null,
    quoteTerms: quote.terms,
    notes: quote.notes,
  };
}

async function orderContext(q: Q, orderId: string) {
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
  return { order, request, firm, quote, lines: orderLines, totals, quoteNumber: quoteDoc?.number ?? null, shipTo, taxNote: taxNoteOf(order.taxExemption), client: clientParty(firm, order.billTo) };
}

export async function buildDepositInvoiceData(q: Q, paymentId: string, now: Date): Promise<DepositInvoiceData> {
  const payment = await getPayment(q, paymentId);
  if (!payment || payment.kind !== "deposit") throw new Error(`documents: deposit payment ${paymentId} not found`);
  const { order, request, quote, quoteNumber, totals: orderTotals, shipTo, taxNote, client } = await orderContext(q, payment.orderId);
  const { cautions } = await cautionsFor(q, request.id);
  const tax = taxIncluded(payment.amountCents, order.totalCents, orderTotals.taxCents);
  const share = order.totalCents > 0 ? Math.round((payment.amountCents / order.totalCents) * 100) : 0;
  return {
    kind: "deposit_invoice",
    issuedAt: (payment.paidAt ?? now).toISOString(),
    currency: payment.currency,
    bureau: bureauParty(),
    client,
    shipTo,
    taxNote,
    requestId: request.id,
    orgId: request.orgId,
    reference: request.reference,
    projectName: request.projectName,
    poNumber: order.poNumber,
    cautions,
    quoteNumber,
    quoteVersion: quote.version,
    orderTotalCents: order.totalCents,
    depositBp: quote.depositBp,
    lines: [{ description: `Deposit, ${share}% of the order total on quotation ${quoteNumber ?? `v${quote.version}`}`, quantity: 1, unitCents: payment.amountCents - tax, amountCents: payment.amountCents - tax }],
    totals: { subtotalCents: payment.amountCents - tax, marginCents: 0, taxBp: orderTotals.taxBp, taxCents: tax, totalCents: payment.amountCents },
    paidAt: payment.paidAt?.toISOString() ?? null,
    paymentReference: payment.transferReference ?? payment.externalReference ?? payment.id.slice(0, 8).toUpperCase(),
    paidBy: PAYMENT_METHOD_LABEL[payment.method].toLowerCase(),
    termsVersion: order.termsVersion,
  };
}

export async function buildBalanceInvoiceData(q: Q, orderId: string, now: Date): Promise<BalanceInvoiceData> {
  const { order, request, quote, lines, quoteNumber, totals, shipTo, taxNote, client } = await orderContext(q, orderId);
  const { cautions } = await cautionsFor(q, request.id);
  const deposits = await listReceivedDeposits(q, orderId);
  const depositPayment = deposits[0] ?? null;
  const depositDoc = depositPayment ? await getIssuedDocumentBySource(q, "deposit_invoice", depositPayment.id) : null;
  const transferPay = await getLatestBalanceTransfer(q, orderId);
  const transfer = transferPay?.transferReference && transferPay.transferDetails ? { reference: transferPay.transferReference, ...transferPay.transferDetails } : null;
  const onAccount = order.paymentTerms !== "prepay";
  const termsLabel = PAYMENT_TERMS_LABEL[order.paymentTerms];
  const dueText = onAccount && order.dueAt
    ? `Due by ${formatDate(order.dueAt)} (${termsLabel}: ${NET_DAYS[order.paymentTerms as keyof typeof NET_DAYS]} days from the invoice date), on your purchase order ${order.poNumber}.`
    : "Due on receipt of this invoice (the parts have shipped).";
  return {
    kind: "invoice",
    issuedAt: now.toISOString(),
    currency: order.currency,
    bureau: bureauParty(),
    client,
    shipTo,
    taxNote,
    requestId: request.id,
    orgId: request.orgId,
    reference: request.reference,
    projectName: request.projectName,
    poNumber: order.poNumber,
    cautions,
    quoteNumber,
    quoteVersion: quote.version,
    lines,
    totals,
    deposit: { invoiceNumber: depositDoc?.number ?? null, amountCents: order.depositCents, isPaid: Boolean(depositPayment) },
    balanceDueCents: order.balanceCents,
    dueText,
    termsVersion: order.termsVersion,
    paymentTerms: onAccount ? termsLabel : null,
    dueAt: onAccount ? (order.dueAt?.toISOString() ?? null) : null,
    transfer,
  };
}

export async function buildCreditNoteData(q: Q, refundId: string, now: Date): Promise<CreditNoteData> {
  const found = await getRefundWithPayment(q, refundId);
  if (!found) throw new Error(`documents: refund ${refundId} not found`);
  const { refund, payment } = found;
  const { order, request, totals: orderTotals, client, taxNote } = await orderContext(q, payment.orderId);
  const invoice = payment.kind === "deposit" ? await getIssuedDocumentBySource(q, "deposit_invoice", payment.id) : await getIssuedDocumentBySource(q, "invoice", order.id);
  const tax = taxIncluded(refund.amountCents, order.totalCents, orderTotals.taxCents);
  return {
    kind: "credit_note",
    issuedAt: now.toISOString(),
    currency: payment.currency,
    bureau: bureauParty(),
    client,
    taxNote,
    requestId: request.id,
    orgId: request.orgId,
    reference: request.reference,
    projectName: request.projectName,
    poNumber: order.poNumber,
    cautions: [],
    invoiceNumber: invoice?.number ?? null,
    paymentKind: payment.kind,
    reason: refund.reason,
    lines: [{ description: `Refund of the ${payment.kind} payment${invoice ? ` invoiced on ${invoice.number}` : ""}: ${refund.reason}`, quantity: 1, unitCents: refund.amountCents - tax, amountCents: refund.amountCents - tax }],
    totals: { subtotalCents: refund.amountCents - tax, marginCents: 0, taxBp: orderTotals.taxBp, taxCents: tax, totalCents: refund.amountCents },
  };
}

export async function buildPackingListData(q: Q, orderId: string, now: Date, unitsPref: "mm" | "in" = "mm"): Promise<PackingListData> {
  const { order, request, shipTo, client } = await orderContext(q, orderId);
  const { cautions, parts } = await cautionsFor(q, request.id);
  const items = parts.map(({ part, revision, analysis }) => {
    const r = analysis?.status === "done" ? analysis.result : null;
    return {
      part: part.name,
      quantity: part.quantity,
      material: r?.material.name ?? part.materialKey,
      fileName: revision?.fileName ?? null,
      revision: revision?.revision ?? null,
      sizeMm: r ? r.bboxMm : null,
      partMassKg: r ? Math.round(r.partMassKg * 10) / 10 : null,
    };
  });
  const known = items.every((i) => i.partMassKg !== null);
  return {
    kind: "packing_list",
    issuedAt: now.toISOString(),
    currency: order.currency,
    bureau: bureauParty(),
    client,
    shipTo,
    requestId: request.id,
    orgId: request.orgId,
    reference: request.reference,
    projectName: request.projectName,
    poNumber: order.poNumber,
    cautions,
    items,
    totalMassKg: known ? Math.round(items.reduce((s, i) => s + (i.partMassKg ?? 0) * i.quantity, 0) * 10) / 10 : null,
    carrier: order.carrier,
    trackingNumber: order.trackingNumber,
    shippedAt: now.toISOString(),
    unitsPref,
    inspection: order.inspectionResult ? `${order.inspectionResult}${order.inspectionNotes ? `: ${order.inspectionNotes}` : ""}` : null,
  };
}
