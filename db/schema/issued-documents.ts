import { blob, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, ts } from "./common";
import { organisations } from "./organisations";
import { requests } from "./requests";

/** What the bureau issues as a numbered PDF (uploaded files live in `documents`). */
export const ISSUED_DOCUMENT_KINDS = ["quote", "deposit_invoice", "invoice", "credit_note", "packing_list"] as const;
export type IssuedDocumentKind = (typeof ISSUED_DOCUMENT_KINDS)[number];

/**
 * The last number handed out per series and calendar year. Raised in the same transaction that
 * inserts the document, so a number exists only with its document: no gaps, no repeats.
 */
export const documentSeries = sqliteTable(
  "document_series",
  {
    series: text("series").notNull(),
    year: integer("year").notNull(),
    lastNumber: integer("last_number").notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.series, t.year] })],
);

/**
 * A document the bureau issued. `data` is the frozen snapshot it was drawn from and `pdf` the
 * bytes sent to the client; neither is ever updated once written (a correction is a new quote
 * version or a credit note). `sourceId` is the quote, payment, refund or order it stands for.
 */
export const issuedDocuments = sqliteTable(
  "issued_documents",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    kind: text("kind", { enum: ISSUED_DOCUMENT_KINDS }).notNull(),
    series: text("series").notNull(),
    year: integer("year").notNull(),
    seq: integer("seq").notNull(),
    number: text("number").notNull(),
    sourceId: text("source_id").notNull(),
    data: text("data", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    pdf: blob("pdf", { mode: "buffer" }),
    pdfSha256: text("pdf_sha256"),
    issuedById: text("issued_by_id").references(() => users.id),
    issuedAt: ts("issued_at").notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("issued_documents_number_uq").on(t.number),
    uniqueIndex("issued_documents_series_seq_uq").on(t.series, t.year, t.seq),
    uniqueIndex("issued_documents_source_uq").on(t.kind, t.sourceId),
    index("issued_documents_request_idx").on(t.requestId, t.issuedAt),
  ],
);
export type IssuedDocument = typeof issuedDocuments.$inferSelect;

/** The bureau's terms of sale, versioned like the rest of the catalogue: an edit inserts version n+1. */
export const termsOfSale = sqliteTable(
  "terms_of_sale",
  {
    id: id(),
    version: integer("version").notNull(),
    isCurrent: integer("is_current", { mode: "boolean" }).notNull().default(true),
    title: text("title").notNull(),
    /** Plain text; paragraphs separated by blank lines. */
    body: text("body").notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("terms_of_sale_version_uq").on(t.version)],
);
export type TermsOfSale = typeof termsOfSale.$inferSelect;
