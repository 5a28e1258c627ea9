import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { rateCards } from "./catalogue";
import { createdAt, id, ts } from "./common";
import { LEAD_TIMES, parts, requests } from "./requests";

export const QUOTE_STATUSES = ["draft", "issued", "accepted", "superseded", "expired", "declined"] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];

export const quotes = sqliteTable(
  "quotes",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    status: text("status", { enum: QUOTE_STATUSES }).notNull().default("draft"),
    /** Set when a part gets a new file revision after this quote was made. */
    isStale: integer("is_stale", { mode: "boolean" }).notNull().default(false),
    subtotalCents: integer("subtotal_cents").notNull().default(0),
    marginBp: integer("margin_bp").notNull().default(0),
    marginCents: integer("margin_cents").notNull().default(0),
    taxBp: integer("tax_bp").notNull().default(0),
    taxCents: integer("tax_cents").notNull().default(0),
    totalCents: integer("total_cents").notNull().default(0),
    depositBp: integer("deposit_bp").notNull().default(5000),
    depositCents: integer("deposit_cents").notNull().default(0),
    currency: text("currency").notNull().default("usd"),
    validityDays: integer("validity_days").notNull().default(30),
    terms: text("terms").notNull().default(""),
    /** The terms-of-sale version current when the quote was issued; printed on its PDF. */
    termsVersion: integer("terms_version"),
    notes: text("notes").notNull().default(""),
    shipDate: ts("ship_date"),
    /** The delivery quoted (its ship date is `shipDate`); the request's choice when drafted. */
    leadTime: text("lead_time", { enum: LEAD_TIMES }).notNull().default("standard"),
    rateCardId: text("rate_card_id").references(() => rateCards.id),
    createdById: text("created_by_id").references(() => users.id),
    issuedById: text("issued_by_id").references(() => users.id),
    issuedAt: ts("issued_at"),
    validUntil: ts("valid_until"),
    acceptedAt: ts("accepted_at"),
    acceptedById: text("accepted_by_id").references(() => users.id),
    declinedAt: ts("declined_at"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("quotes_request_version_uq").on(t.requestId, t.version), index("quotes_status_idx").on(t.status)],
);
export type Quote = typeof quotes.$inferSelect;
export type NewQuote = typeof quotes.$inferInsert;

export const QUOTE_LINE_KINDS = [
  "material",
  "print",
  "machining",
  "engineering",
  "setup",
  "option",
  "crating",
  "freight",
  "other",
] as const;

export const quoteLines = sqliteTable(
  "quote_lines",
  {
    id: id(),
    quoteId: text("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    partId: text("part_id").references(() => parts.id),
    kind: text("kind", { enum: QUOTE_LINE_KINDS }).notNull(),
    description: text("description").notNull(),
    quantity: real("quantity").notNull().default(1),
    unitCents: integer("unit_cents").notNull(),
    amountCents: integer("amount_cents").notNull(),
    /** The automatic estimate's amount, kept when sales edits a line. */
    estimatedCents: integer("estimated_cents"),
    editReason: text("edit_reason"),
    sort: integer("sort").notNull().default(0),
  },
  (t) => [index("quote_lines_quote_idx").on(t.quoteId)],
);
export type QuoteLine = typeof quoteLines.$inferSelect;
export type NewQuoteLine = typeof quoteLines.$inferInsert;
