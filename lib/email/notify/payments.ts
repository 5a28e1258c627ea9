import "server-only";
import { createElement } from "react";
import { getDb, type Db } from "@/db/client";
import { getOrderWithRequest, getPayment } from "@/db/queries/payments";
import BalanceDueEmail from "@/emails/balance-due";
import InvoiceReminderEmail from "@/emails/invoice-reminder";
import { listTermsInvoices } from "@/db/queries/account-terms";
import { listPaymentsForOrder } from "@/db/queries/payments";
import { PAYMENT_TERMS_LABEL } from "@/lib/labels";
import DepositReceivedEmail from "@/emails/deposit-received";
import { env } from "@/lib/env";
import { formatCents } from "@/lib/money";
import RefundIssuedEmail from "@/emails/refund-issued";
import { getRefundWithPayment } from "@/db/queries/refunds";
import { queueEmail } from "../outbox";
import { formatDate } from "@/lib/dates";
import { contactsOrThrow, documentAttachment, recipients, requestUrl } from "./shared";

/** The money notices: a payment received, the balance due, an account invoice's reminder or overdue notice, a refund. */
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
