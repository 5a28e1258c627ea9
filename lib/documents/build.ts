import { PAYMENT_METHOD_LABEL, PAYMENT_TERMS_LABEL } from "../labels";
import { formatDate } from "../dates";
import { NET_DAYS } from "../payments/terms";
import type { Db } from "../../db/client";
import { getIssuedDocumentBySource, getTermsVersion } from "../../db/queries/issued-documents";
import { getLatestBalanceTransfer, getPayment, listReceivedDeposits } from "../../db/queries/payments";
import { getRefundWithPayment } from "../../db/queries/refunds";
import { zoneFor } from "../estimating/freight";
import { getDefaultShipTo } from "../../db/queries/addresses";
import { getCurrentRateCard, getRateCardById } from "../../db/queries/catalogue";
import { bureauParty } from "./bureau";
import type { BalanceInvoiceData, CreditNoteData, DepositInvoiceData, PackingListData, QuoteData } from "./types";

import { cautionsFor, clientParty, orderContext, quoteTotals, quoteWithLines, requestAndFirm, shipParty, taxIncluded, type Q } from "./build-context";

/** The frozen data of each issued document, built from the database at the moment of issue. */
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

export async function buildDepositInvoiceData(q: Q, paymentId: string, now: Date): Promise<DepositInvoiceData> {
  const payment = await getPayment(q, paymentId);
  if (!payment || payment.kind !== "deposit") throw new Error(`documents: deposit payment ${paymentId} not found`);
  const { order, request, quote, quoteNumber, totals: orderTotals, shipTo, head } = await orderContext(q, payment.orderId);
  const { cautions } = await cautionsFor(q, request.id);
  const tax = taxIncluded(payment.amountCents, order.totalCents, orderTotals.taxCents);
  const share = order.totalCents > 0 ? Math.round((payment.amountCents / order.totalCents) * 100) : 0;
  return {
    kind: "deposit_invoice",
    issuedAt: (payment.paidAt ?? now).toISOString(),
    currency: payment.currency,
    ...head,
    shipTo,
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
  const { order, request, quote, lines, quoteNumber, totals, shipTo, head } = await orderContext(q, orderId);
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
    ...head,
    shipTo,
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
  const { order, totals: orderTotals, head } = await orderContext(q, payment.orderId);
  const invoice = payment.kind === "deposit" ? await getIssuedDocumentBySource(q, "deposit_invoice", payment.id) : await getIssuedDocumentBySource(q, "invoice", order.id);
  const tax = taxIncluded(refund.amountCents, order.totalCents, orderTotals.taxCents);
  return {
    kind: "credit_note",
    issuedAt: now.toISOString(),
    currency: payment.currency,
    ...head,
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
