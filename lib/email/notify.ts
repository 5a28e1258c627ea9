import "server-only";
import { createElement } from "react";
import { getDb, type Db } from "@/db/client";
import { listCurrentCells } from "@/db/queries/catalogue";
import { getQuoteWithRequest } from "@/db/queries/client-quotes";
import { getOrderWithRequest, getPayment } from "@/db/queries/payments";
import { getMessageWithAuthor, listThreadClientEmails } from "@/db/queries/messages";
import { getRequestContacts } from "@/db/queries/requests";
import BalanceDueEmail from "@/emails/balance-due";
import InvoiceReminderEmail from "@/emails/invoice-reminder";
import { listTermsInvoices } from "@/db/queries/account-terms";
import { listPaymentsForOrder } from "@/db/queries/payments";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import DepositReceivedEmail from "@/emails/deposit-received";
import QuoteReadyEmail from "@/emails/quote-ready";
import RequestReceivedEmail from "@/emails/request-received";
import ScheduledEmail from "@/emails/scheduled";
import ShipDateChangedEmail from "@/emails/ship-date-changed";
import ShippedEmail from "@/emails/shipped";
import StaffMessageEmail from "@/emails/staff-message";
import { env } from "@/lib/env";
import { formatCents } from "@/lib/money";
import { formatMass } from "@/lib/units";
import { issueDocument, type IssueRequest } from "@/lib/documents/issue";
import { KIND_TITLES } from "@/lib/documents/numbering";
import RefundIssuedEmail from "@/emails/refund-issued";
import { getRefundWithPayment } from "@/db/queries/refunds";
import { errorFields, logFor } from "@/lib/observability/log";
import { queueEmail } from "./outbox";
import type { SendEmailInput } from "./send";
import { formatDate, formatDay } from "@/lib/dates";

/**
 * The client e-mails of the order's life. Each loads what it needs by id and queues the e-mail
 * as a durable job (lib/email/outbox.ts): tried at once, retried with back-off when the e-mail
 * API fails, never dropped; the idempotency key makes a retried notice go out once. They throw
 * only for an unknown id or a database failure.
 */

/** An instant's day in the plant's zone (lib/dates.ts); null when there is none. */
const dateText = (d: Date | null | undefined) => (d ? formatDate(d) : null);

const requestUrl = (requestId: string) => `${env().APP_URL}/portal/requests/${requestId}`;

function recipients(...addresses: (string | null | undefined)[]): string[] {
  return [...new Set(addresses.filter((a): a is string => Boolean(a)).map((a) => a.toLowerCase()))];
}

async function contactsOrThrow(db: Db, requestId: string) {
  const c = await getRequestContacts(db, requestId);
  if (!c) throw new Error(`notify: request ${requestId} not found`);
  return c;
}

/**
 * The PDF of the document a notice announces, issued now if its event's transaction did not
 * (idempotent per kind and source), ready to attach. A document that cannot be made is logged
 * and the notice goes without it: the order page lists it once it exists.
 */
async function documentAttachment(db: Db, r: IssueRequest): Promise<{ attachments: NonNullable<SendEmailInput["attachments"]>; labels: string[] }> {
  try {
    const doc = await issueDocument(db, r);
    return { attachments: [{ filename: `${doc.number}.pdf`, content: doc.pdf, contentType: "application/pdf" }], labels: [`${KIND_TITLES[r.kind]} ${doc.number}`] };
  } catch (e) {
    logFor({ documentKind: r.kind, sourceId: r.sourceId }).error({ ...errorFields(e), event: "email.attachment_failed" }, "document could not be attached; the notice goes without it");
    return { attachments: [], labels: [] };
  }
}

/** To the client who submitted, and a copy to the bureau's sales inbox. */
export async function notifyRequestReceived(requestId: string, db: Db = getDb()) {
  const c = await contactsOrThrow(db, requestId);
  const base = {
    reference: c.reference,
    projectName: c.projectName,
    firmName: c.firmName,
    partCount: c.partCount,
    estimateTotal: null,
    isControlled: c.isControlled,
  };
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `Request ${c.reference} received`,
    react: createElement(RequestReceivedEmail, { ...base, url: requestUrl(requestId), forSales: false }),
    tags: [{ name: "template", value: "request-received" }],
    idempotencyKey: `request-received/${requestId}`,
  }, db);
  await queueEmail({
    to: env().SALES_INBOX,
    subject: `New request ${c.reference} from ${c.firmName}`,
    react: createElement(RequestReceivedEmail, { ...base, url: `${env().APP_URL}/admin/sales/requests/${requestId}`, forSales: true }),
    tags: [{ name: "template", value: "request-received-sales" }],
    idempotencyKey: `request-received-sales/${requestId}`,
  }, db);
}

export async function notifyQuoteReady(quoteId: string, db: Db = getDb()) {
  const row = await getQuoteWithRequest(db, quoteId);
  if (!row) throw new Error(`notify: quote ${quoteId} not found`);
  const { quote } = row;
  const c = await contactsOrThrow(db, row.request.id);
  const doc = await documentAttachment(db, { kind: "quote", sourceId: quote.id });
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `Quote ${quote.version} for ${c.reference} is ready`,
    attachments: doc.attachments,
    react: createElement(QuoteReadyEmail, {
      reference: c.reference,
      projectName: c.projectName,
      version: quote.version,
      total: formatCents(quote.totalCents, quote.currency),
      deposit: formatCents(quote.depositCents, quote.currency),
      validUntil: dateText(quote.validUntil) ?? "see the quote",
      shipDate: quote.shipDate ? formatDay(quote.shipDate) : null,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "quote-ready" }],
    idempotencyKey: `quote-ready/${quoteId}`,
  }, db);
}

/** A deposit (or balance) payment recorded as paid. */
export async function notifyDepositReceived(paymentId: string, db: Db = getDb()) {
  const payment = await getPayment(db, paymentId);
  if (!payment) throw new Error(`notify: payment ${paymentId} not found`);
  const row = await getOrderWithRequest(db, payment.orderId);
  if (!row) throw new Error(`notify: order ${payment.orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const what = payment.kind === "deposit" ? "Deposit" : "Balance";
  const doc = payment.kind === "deposit" ? await documentAttachment(db, { kind: "deposit_invoice", sourceId: payment.id }) : { attachments: [], labels: [] };
  await queueEmail({
    attachments: doc.attachments,
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: `${what} received for ${c.reference}`,
    react: createElement(DepositReceivedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      kind: payment.kind,
      amount: formatCents(payment.amountCents, payment.currency),
      poNumber: row.order.poNumber,
      receiptNumber: payment.receiptNumber,
      receiptUrl: `${env().APP_URL}/portal/payments/${payment.id}`,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "deposit-received" }],
    idempotencyKey: `payment-received/${paymentId}`,
  }, db);
}

export async function notifyScheduled(orderId: string, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const start = row.order.plannedStart;
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `${c.reference} is scheduled`,
    react: createElement(ScheduledEmail, {
      reference: c.reference,
      projectName: c.projectName,
      cellName: row.order.cellKey ? ((await listCurrentCells(db, { activeOnly: false })).find((x) => x.key === row.order.cellKey)?.params.name ?? null) : null,
      printStart: dateText(start),
      shipDate: dateText(row.order.plannedShip),
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "scheduled" }],
    // A re-planned order gets a fresh notice with the new dates.
    idempotencyKey: `scheduled/${orderId}/${start?.getTime() ?? "none"}/${row.order.plannedShip?.getTime() ?? "none"}`,
  }, db);
}

/** The client's planned ship date moved by a working day or more: both dates and the reason staff gave. */
export async function notifyShipDateChanged(orderId: string, change: { id: string; fromDate: Date; toDate: Date; reason: string }, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  await queueEmail({
    to: recipients(c.creatorEmail),
    subject: `${c.reference}: planned ship date now ${formatDate(change.toDate)}`,
    react: createElement(ShipDateChangedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      fromDate: formatDate(change.fromDate),
      toDate: formatDate(change.toDate),
      reason: change.reason,
      isLater: change.toDate.getTime() > change.fromDate.getTime(),
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "ship-date-changed" }],
    idempotencyKey: `ship-date-changed/${change.id}`,
  }, db);
}

export async function notifyShipped(orderId: string, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const kg = row.order.actualMaterialKg;
  const doc = await documentAttachment(db, { kind: "packing_list", sourceId: orderId });
  await queueEmail({
    attachments: doc.attachments,
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: `${c.reference} has shipped`,
    react: createElement(ShippedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      carrier: row.order.carrier,
      trackingNumber: row.order.trackingNumber,
      massText: kg ? formatMass(kg, c.unitsPref) : null,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "shipped" }],
    idempotencyKey: `shipped/${orderId}`,
  }, db);
}

export async function notifyBalanceDue(orderId: string, db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const doc = await documentAttachment(db, { kind: "invoice", sourceId: orderId });
  await queueEmail({
    attachments: doc.attachments,
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: `Balance due for ${c.reference}`,
    react: createElement(BalanceDueEmail, {
      reference: c.reference,
      projectName: c.projectName,
      balance: formatCents(row.order.balanceCents, row.order.currency),
      poNumber: row.order.poNumber,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "balance-due" }],
    idempotencyKey: `balance-due/${orderId}`,
  }, db);
}

/**
 * An invoice on net terms coming due (the reminder) or past due (the overdue notice), to the
 * client who ordered and the firm's billing address. One of each per invoice.
 */
export async function notifyInvoiceReminder(orderId: string, which: "reminder" | "overdue", db: Db = getDb()) {
  const row = await getOrderWithRequest(db, orderId);
  if (!row) throw new Error(`notify: order ${orderId} not found`);
  const [inv] = (await listTermsInvoices(db, { orgId: row.order.orgId })).filter((i) => i.orderId === orderId);
  if (!inv?.dueAt) throw new Error(`notify: order ${orderId} has no invoice on terms`);
  const c = await contactsOrThrow(db, row.request.id);
  const transfer = (await listPaymentsForOrder(db, orderId)).find((p) => p.kind === "balance" && p.status === "pending" && p.transferReference);
  await queueEmail({
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: which === "overdue" ? `Overdue: ${inv.invoiceNumber ?? "invoice"} for ${c.reference}` : `Due ${formatDate(inv.dueAt)}: ${inv.invoiceNumber ?? "invoice"} for ${c.reference}`,
    react: createElement(InvoiceReminderEmail, {
      reference: c.reference,
      projectName: c.projectName,
      invoiceNumber: inv.invoiceNumber,
      amount: formatCents(inv.owedCents, row.order.currency),
      dueDate: formatDate(inv.dueAt),
      terms: PAYMENT_TERMS_LABEL[row.order.paymentTerms],
      poNumber: row.order.poNumber,
      isOverdue: which === "overdue",
      transferReference: transfer?.transferReference ?? null,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: which === "overdue" ? "invoice-overdue" : "invoice-reminder" }],
    idempotencyKey: `invoice-${which}/${orderId}`,
  }, db);
}

/** A refund that went through, with its credit note. */
export async function notifyRefund(refundId: string, db: Db = getDb()) {
  const r = await getRefundWithPayment(db, refundId);
  if (!r || r.refund.status !== "succeeded") throw new Error(`notify: succeeded refund ${refundId} not found`);
  const row = await getOrderWithRequest(db, r.payment.orderId);
  if (!row) throw new Error(`notify: order ${r.payment.orderId} not found`);
  const c = await contactsOrThrow(db, row.request.id);
  const doc = await documentAttachment(db, { kind: "credit_note", sourceId: refundId });
  await queueEmail({
    to: recipients(c.creatorEmail, c.billingEmail),
    subject: `Refund on ${c.reference}`,
    attachments: doc.attachments,
    react: createElement(RefundIssuedEmail, {
      reference: c.reference,
      projectName: c.projectName,
      amount: formatCents(r.refund.amountCents, r.payment.currency),
      reason: r.refund.reason,
      attached: doc.labels,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "refund-issued" }],
    idempotencyKey: `refund/${refundId}`,
  }, db);
}

/** Longest message body copied into the notice (characters); the rest is read on the request page. */
export const MESSAGE_EXCERPT_CHARS = 2_000;

/**
 * A staff message on a request's thread, to the clients on it (the creator and every client who
 * posted there). A controlled request's notice carries no body: only that there is a new message.
 */
export async function notifyStaffMessage(messageId: string, db: Db = getDb()) {
  const m = await getMessageWithAuthor(db, messageId);
  if (!m || !m.isFromStaff) throw new Error(`notify: staff message ${messageId} not found`);
  const c = await contactsOrThrow(db, m.requestId);
  const to = await listThreadClientEmails(db, m.requestId);
  if (to.length === 0) return;
  const body = c.isControlled ? null : m.body.slice(0, MESSAGE_EXCERPT_CHARS);
  await queueEmail({
    to,
    subject: `New message on ${c.reference}`,
    react: createElement(StaffMessageEmail, {
      reference: c.reference,
      projectName: c.projectName,
      authorName: m.authorName ?? "Our sales team",
      body,
      isTruncated: body !== null && m.body.length > MESSAGE_EXCERPT_CHARS,
      isControlled: c.isControlled,
      url: requestUrl(c.id),
    }),
    tags: [{ name: "template", value: "staff-message" }],
    idempotencyKey: `staff-message/${messageId}`,
  }, db);
}
