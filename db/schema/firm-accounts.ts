import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, ts } from "./common";
import { organisations } from "./organisations";
import { uploads } from "./requests";

export const ADDRESS_KINDS = ["billing", "shipping"] as const;
export type AddressKind = (typeof ADDRESS_KINDS)[number];

/**
 * A firm's address book: one billing address (asked at sign-up) and any number of shipping
 * addresses, one of them the default. Orders keep a copy of the ship-to they picked, so an edit
 * or removal here never changes an order; a removed address is archived, not deleted.
 */
export const addresses = sqliteTable(
  "addresses",
  {
    id: id(),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: ADDRESS_KINDS }).notNull(),
    /** The firm's own name for it ("Main yard", "Tooling hall"). */
    label: text("label").notNull(),
    /** Attention of (a person or a dock). */
    attention: text("attention"),
    line1: text("line1").notNull(),
    line2: text("line2"),
    city: text("city").notNull(),
    /** ISO 3166-2 subdivision code without the country ("TX"), where the country has them. */
    region: text("region"),
    postalCode: text("postal_code").notNull(),
    /** ISO 3166-1 alpha-2. */
    country: text("country").notNull(),
    phone: text("phone"),
    /** Delivery notes for the carrier (dock hours, forklift on site). */
    deliveryNotes: text("delivery_notes"),
    isDefault: integer("is_default", { mode: "boolean" }).notNull().default(false),
    archivedAt: ts("archived_at"),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("addresses_org_idx").on(t.orgId, t.kind)],
);
export type Address = typeof addresses.$inferSelect;
export type NewAddress = typeof addresses.$inferInsert;

export const EXEMPTION_STATUSES = ["pending", "approved", "rejected"] as const;
export type ExemptionStatus = (typeof EXEMPTION_STATUSES)[number];

/**
 * A firm's tax-exemption certificate (resale or manufacturing exemption): the uploaded
 * certificate, its number, the authority that issued it and its expiry. Accounts approves it;
 * approved and unexpired, orders accepted and invoices issued carry no tax and say why.
 */
export const taxExemptions = sqliteTable(
  "tax_exemptions",
  {
    id: id(),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    certificateNumber: text("certificate_number").notNull(),
    /** Who issued it (a state or province, as ISO 3166-2, e.g. "US-TX"). */
    issuedBy: text("issued_by").notNull(),
    expiresOn: ts("expires_on").notNull(),
    uploadId: text("upload_id").references(() => uploads.id),
    status: text("status", { enum: EXEMPTION_STATUSES }).notNull().default("pending"),
    reviewNote: text("review_note"),
    reviewedById: text("reviewed_by_id").references(() => users.id),
    reviewedAt: ts("reviewed_at"),
    uploadedById: text("uploaded_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("tax_exemptions_org_idx").on(t.orgId, t.status)],
);
export type TaxExemption = typeof taxExemptions.$inferSelect;
