import "server-only";
import { createElement } from "react";
import { getDb, type Db } from "@/db/client";
import { getQuoteWithRequest } from "@/db/queries/client-quotes";
import { getMessageWithAuthor, listThreadClientEmails } from "@/db/queries/messages";
import QuoteReadyEmail from "@/emails/quote-ready";
import RequestReceivedEmail from "@/emails/request-received";
import StaffMessageEmail from "@/emails/staff-message";
import { env } from "@/lib/env";
import { formatCents } from "@/lib/money";
import { queueEmail } from "../outbox";
import { formatDay } from "@/lib/dates";
import { contactsOrThrow, dateText, documentAttachment, recipients, requestUrl } from "./shared";

/** The request's notices: received (to the client and the sales inbox), quote ready, a staff message on its thread. */
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
