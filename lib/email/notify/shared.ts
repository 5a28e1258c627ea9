import "server-only";
import type { Db } from "@/db/client";
import { getRequestContacts } from "@/db/queries/requests";
import { env } from "@/lib/env";
import { issueDocument, type IssueRequest } from "@/lib/documents/issue";
import { KIND_TITLES } from "@/lib/documents/numbering";
import { errorFields, logFor } from "@/lib/observability/log";
import type { SendEmailInput } from "../send";
import { formatDate } from "@/lib/dates";

/**
 * What the client e-mails of the order's life share (./request.ts, ./order.ts, ./payments.ts).
 * Each loads what it needs by id and queues the e-mail
 * as a durable job (lib/email/outbox.ts): tried at once, retried with back-off when the e-mail
 * API fails, never dropped; the idempotency key makes a retried notice go out once. They throw
 * only for an unknown id or a database failure.
 */

/** An instant's day in the plant's zone (lib/dates.ts); null when there is none. */
export const dateText = (d: Date | null | undefined) => (d ? formatDate(d) : null);

export const requestUrl = (requestId: string) => `${env().APP_URL}/portal/requests/${requestId}`;

export function recipients(...addresses: (string | null | undefined)[]): string[] {
  return [...new Set(addresses.filter((a): a is string => Boolean(a)).map((a) => a.toLowerCase()))];
}

export async function contactsOrThrow(db: Db, requestId: string) {
  const c = await getRequestContacts(db, requestId);
  if (!c) throw new Error(`notify: request ${requestId} not found`);
  return c;
}

/**
 * The PDF of the document a notice announces, issued now if its event's transaction did not
 * (idempotent per kind and source), ready to attach. A document that cannot be made is logged
 * and the notice goes without it: the order page lists it once it exists.
 */
export async function documentAttachment(db: Db, r: IssueRequest): Promise<{ attachments: NonNullable<SendEmailInput["attachments"]>; labels: string[] }> {
  try {
    const doc = await issueDocument(db, r);
    return { attachments: [{ filename: `${doc.number}.pdf`, content: doc.pdf, contentType: "application/pdf" }], labels: [`${KIND_TITLES[r.kind]} ${doc.number}`] };
  } catch (e) {
    logFor({ documentKind: r.kind, sourceId: r.sourceId }).error({ ...errorFields(e), event: "email.attachment_failed" }, "document could not be attached; the notice goes without it");
    return { attachments: [], labels: [] };
  }
}
