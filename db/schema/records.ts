import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, ts } from "./common";
import { organisations } from "./organisations";
import { requests } from "./requests";

/** Messages between the client and the bureau on a request; threaded by parentId. */
export const messages = sqliteTable(
  "messages",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    authorId: text("author_id")
      .notNull()
      .references(() => users.id),
    parentId: text("parent_id"),
    isFromStaff: integer("is_from_staff", { mode: "boolean" }).notNull().default(false),
    body: text("body").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("messages_request_idx").on(t.requestId, t.createdAt)],
);
export type Message = typeof messages.$inferSelect;

export const DOCUMENT_KINDS = ["quote", "inspection_report", "invoice", "receipt", "attachment", "drawing"] as const;

/** Files attached to a request: reports, invoices, message attachments. */
export const documents = sqliteTable(
  "documents",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    messageId: text("message_id").references(() => messages.id),
    kind: text("kind", { enum: DOCUMENT_KINDS }).notNull(),
    title: text("title").notNull(),
    fileKey: text("file_key"),
    fileName: text("file_name"),
    sizeBytes: integer("size_bytes"),
    contentType: text("content_type"),
    /** Generated documents (invoices, quote pages) keep their data here instead of a file. */
    data: text("data", { mode: "json" }).$type<Record<string, unknown>>(),
    uploadedById: text("uploaded_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("documents_request_idx").on(t.requestId)],
);
export type Document = typeof documents.$inferSelect;

/** Who did what, when: every staff action, every file download. */
export const auditLog = sqliteTable(
  "audit_log",
  {
    id: id(),
    actorId: text("actor_id").references(() => users.id),
    action: text("action").notNull(),
    entityType: text("entity_type").notNull(),
    entityId: text("entity_id"),
    orgId: text("org_id"),
    before: text("before", { mode: "json" }).$type<unknown>(),
    after: text("after", { mode: "json" }).$type<unknown>(),
    ip: text("ip"),
    at: createdAt(),
  },
  (t) => [index("audit_log_at_idx").on(t.at), index("audit_log_entity_idx").on(t.entityType, t.entityId)],
);
export type AuditEntry = typeof auditLog.$inferSelect;

/** Messages accepted by the e-mail API (the local fake stores every message here). */
export const emailOutbox = sqliteTable(
  "email_outbox",
  {
    id: id(),
    providerId: text("provider_id"),
    fromAddress: text("from_address").notNull(),
    toAddresses: text("to_addresses", { mode: "json" }).$type<string[]>().notNull(),
    subject: text("subject").notNull(),
    html: text("html"),
    text: text("text"),
    tags: text("tags", { mode: "json" }).$type<{ name: string; value: string }[]>(),
    /** What was attached (name, type, size, SHA-256), not the bytes. */
    attachments: text("attachments", { mode: "json" }).$type<{ filename: string; contentType: string | null; sizeBytes: number; sha256: string }[]>(),
    createdAt: createdAt(),
  },
  (t) => [index("email_outbox_created_idx").on(t.createdAt)],
);
export type OutboxMessage = typeof emailOutbox.$inferSelect;
export type NewOutboxMessage = typeof emailOutbox.$inferInsert;

export const EMAIL_JOB_STATUSES = ["queued", "sending", "sent", "failed"] as const;

/**
 * E-mails to send, as durable jobs: rendered once when queued, sent at once, and on a failure
 * tried again with growing waits (`nextAttemptAt`) up to a bound, then `failed` for staff to see
 * and send again. The idempotency key goes with every attempt, so the e-mail API sends it once.
 */
export const emailJobs = sqliteTable(
  "email_jobs",
  {
    id: id(),
    toAddresses: text("to_addresses", { mode: "json" }).$type<string[]>().notNull(),
    fromAddress: text("from_address"),
    replyTo: text("reply_to", { mode: "json" }).$type<string[]>(),
    subject: text("subject").notNull(),
    html: text("html").notNull(),
    text: text("text").notNull(),
    tags: text("tags", { mode: "json" }).$type<{ name: string; value: string }[]>(),
    /** Files sent with it (issued documents' PDFs), base64, kept until the job is sent so a retry carries them. */
    attachments: text("attachments", { mode: "json" }).$type<StoredAttachment[]>(),
    idempotencyKey: text("idempotency_key").notNull(),
    status: text("status", { enum: EMAIL_JOB_STATUSES }).notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: ts("next_attempt_at"),
    /** While `sending`: past this instant another process may take the job over. */
    leaseUntil: ts("lease_until"),
    lastError: text("last_error"),
    providerId: text("provider_id"),
    createdAt: createdAt(),
    sentAt: ts("sent_at"),
  },
  (t) => [index("email_jobs_status_next_idx").on(t.status, t.nextAttemptAt)],
);
export type EmailJob = typeof emailJobs.$inferSelect;
/** An e-mail job's attachment as stored: its bytes in base64. */
export interface StoredAttachment {
  filename: string;
  contentType: string | null;
  contentBase64: string;
}
