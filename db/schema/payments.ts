import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, ts } from "./common";
import { orders } from "./orders";
import { organisations } from "./organisations";

export const PAYMENT_STATUSES = ["pending", "paid", "failed", "expired", "refunded", "partially_refunded"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

export const PAYMENT_METHODS = ["card", "bank_transfer", "manual"] as const;
export type PaymentMethod = (typeof PAYMENT_METHODS)[number];

export const payments = sqliteTable(
  "payments",
  {
    id: id(),
    orderId: text("order_id")
      .notNull()
      .references(() => orders.id),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    kind: text("kind", { enum: ["deposit", "balance"] }).notNull(),
    status: text("status", { enum: PAYMENT_STATUSES }).notNull().default("pending"),
    amountCents: integer("amount_cents").notNull(),
    feeCents: integer("fee_cents"),
    refundedCents: integer("refunded_cents").notNull().default(0),
    currency: text("currency").notNull().default("usd"),
    checkoutSessionId: text("checkout_session_id"),
    checkoutUrl: text("checkout_url"),
    paymentIntentId: text("payment_intent_id"),
    chargeId: text("charge_id"),
    receiptUrl: text("receipt_url"),
    /** The bureau's own receipt number (`RC-<year>-<five digits>`), given when the money arrives. */
    receiptNumber: text("receipt_number"),
    /** card: a payment page; bank_transfer: the processor's bank-transfer method; manual: recorded by accounts. */
    method: text("method", { enum: PAYMENT_METHODS }).notNull().default("card"),
    /** Bank transfer: the reference the payer quotes, the account details to pay, and funds seen so far. */
    transferReference: text("transfer_reference"),
    transferDetails: text("transfer_details", { mode: "json" }).$type<TransferDetails>(),
    receivedCents: integer("received_cents").notNull().default(0),
    /** Manual payment: the bank's or cheque's reference, and accounts' note. */
    externalReference: text("external_reference"),
    note: text("note"),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
    paidAt: ts("paid_at"),
  },
  (t) => [
    uniqueIndex("payments_checkout_session_uq").on(t.checkoutSessionId),
    uniqueIndex("payments_receipt_number_uq").on(t.receiptNumber),
    index("payments_order_idx").on(t.orderId),
    index("payments_org_idx").on(t.orgId),
  ],
);
export type Payment = typeof payments.$inferSelect;

/** Where to send a bank transfer (the processor's account for this firm). */
export interface TransferDetails {
  bankName: string;
  accountHolder: string;
  accountNumber: string;
  routingNumber: string;
  swiftCode: string | null;
}

export const FUNDS_STATUSES = ["applied", "short", "over", "unmatched", "late"] as const;

/**
 * Money the processor saw arrive by bank transfer, one row per arrival, for reconciliation:
 * matched to a payment by its reference (or not), with what was applied and what is left in the
 * firm's balance at the processor.
 */
export const transferFunds = sqliteTable(
  "transfer_funds",
  {
    id: id(),
    /** The processor's id of the arrival (its cash-balance transaction). */
    processorId: text("processor_id").notNull(),
    processorCustomerId: text("processor_customer_id").notNull(),
    orgId: text("org_id").references(() => organisations.id),
    paymentId: text("payment_id").references(() => payments.id),
    amountCents: integer("amount_cents").notNull(),
    currency: text("currency").notNull().default("usd"),
    reference: text("reference"),
    /** Applied to the payment from this arrival, cents; the rest stays in the firm's balance. */
    appliedCents: integer("applied_cents").notNull().default(0),
    status: text("status", { enum: FUNDS_STATUSES }).notNull(),
    receivedAt: ts("received_at").notNull(),
    resolvedAt: ts("resolved_at"),
    resolvedById: text("resolved_by_id").references(() => users.id),
    resolution: text("resolution"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("transfer_funds_processor_uq").on(t.processorId), index("transfer_funds_org_idx").on(t.orgId), index("transfer_funds_status_idx").on(t.status)],
);
export type TransferFunds = typeof transferFunds.$inferSelect;
export type NewPayment = typeof payments.$inferInsert;

export const refunds = sqliteTable(
  "refunds",
  {
    id: id(),
    paymentId: text("payment_id")
      .notNull()
      .references(() => payments.id),
    amountCents: integer("amount_cents").notNull(),
    reason: text("reason").notNull(),
    status: text("status", { enum: ["pending", "succeeded", "failed"] }).notNull().default("pending"),
    stripeRefundId: text("stripe_refund_id"),
    idempotencyKey: text("idempotency_key").notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("refunds_idempotency_uq").on(t.idempotencyKey), uniqueIndex("refunds_stripe_uq").on(t.stripeRefundId)],
);
export type Refund = typeof refunds.$inferSelect;

/** Processed webhook events, for de-duplication by event id. */
export const webhookEvents = sqliteTable("webhook_events", {
  id: text("id").primaryKey(),
  type: text("type").notNull(),
  outcome: text("outcome").notNull(),
  receivedAt: ts("received_at")
    .notNull()
    .$defaultFn(() => new Date()),
});

/**
 * Accounts' notes on a reconciliation finding, and whether it is resolved (explained, or mended
 * at the processor). `findingKey` names what the finding is about: `payment:<id>`, `refund:<id>`
 * or `processor:<processor id>` for money the ledger does not know.
 */
export const reconciliationNotes = sqliteTable(
  "reconciliation_notes",
  {
    id: id(),
    findingKey: text("finding_key").notNull(),
    note: text("note").notNull(),
    isResolved: integer("is_resolved", { mode: "boolean" }).notNull().default(false),
    authorId: text("author_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("reconciliation_notes_key_idx").on(t.findingKey, t.createdAt)],
);
export type ReconciliationNote = typeof reconciliationNotes.$inferSelect;
