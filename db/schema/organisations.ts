import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { CLIENT_ROLES, createdAt, id, ts } from "./common";

export const PAYMENT_TERMS = ["prepay", "net30", "net45", "net60"] as const;
export type PaymentTerms = (typeof PAYMENT_TERMS)[number];

/** A client firm. */
export const organisations = sqliteTable(
  "organisations",
  {
    id: id(),
    name: text("name").notNull(),
    slug: text("slug").notNull(),
    billingEmail: text("billing_email"),
    billingContact: text("billing_contact"),
    defaultPoNumber: text("default_po_number"),
    unitsPref: text("units_pref", { enum: ["mm", "in"] }).notNull().default("mm"),
    /** Paying on account: "prepay" (card or transfer up front) until accounts approves net terms. */
    paymentTerms: text("payment_terms", { enum: PAYMENT_TERMS }).notNull().default("prepay"),
    /** Most the firm may owe on account at once (open invoices + a new order), cents. */
    creditLimitCents: integer("credit_limit_cents").notNull().default(0),
    termsApprovedById: text("terms_approved_by_id").references(() => users.id),
    termsApprovedAt: ts("terms_approved_at"),
    /** The payment processor's customer record (bank-transfer account details hang on it). */
    processorCustomerId: text("processor_customer_id"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("organisations_slug_uq").on(t.slug)],
);
export type Organisation = typeof organisations.$inferSelect;
export type NewOrganisation = typeof organisations.$inferInsert;

/** A client user's firm; one firm per user. The role itself lives on users.role. */
export const memberships = sqliteTable(
  "memberships",
  {
    id: id(),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("memberships_user_uq").on(t.userId), index("memberships_org_idx").on(t.orgId)],
);
export type Membership = typeof memberships.$inferSelect;

/** An invitation to join a firm (client_admin) or the bureau's staff (admin). */
export const invitations = sqliteTable(
  "invitations",
  {
    id: id(),
    email: text("email").notNull(),
    orgId: text("org_id").references(() => organisations.id, { onDelete: "cascade" }),
    role: text("role").notNull(),
    tokenHash: text("token_hash").notNull(),
    invitedById: text("invited_by_id").references(() => users.id),
    expiresAt: ts("expires_at").notNull(),
    acceptedAt: ts("accepted_at"),
    revokedAt: ts("revoked_at"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("invitations_token_uq").on(t.tokenHash), index("invitations_email_idx").on(t.email)],
);
export type Invitation = typeof invitations.$inferSelect;
export const CLIENT_INVITE_ROLES = CLIENT_ROLES;
