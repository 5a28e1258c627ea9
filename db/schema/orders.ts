import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users } from "./auth";
import { createdAt, id, STAGES, ts } from "./common";
import { PAYMENT_TERMS, organisations } from "./organisations";
import { quotes } from "./quotes";
import { requests } from "./requests";

/** Commercial and production record made when a quote is accepted (1:1 with its request). */
export const orders = sqliteTable(
  "orders",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organisations.id),
    quoteId: text("quote_id")
      .notNull()
      .references(() => quotes.id),
    poNumber: text("po_number").notNull(),
    /** The terms-of-sale version the client accepted (the one printed on the accepted quote). */
    termsVersion: integer("terms_version"),
    totalCents: integer("total_cents").notNull(),
    depositCents: integer("deposit_cents").notNull(),
    balanceCents: integer("balance_cents").notNull(),
    currency: text("currency").notNull().default("usd"),
    cellKey: text("cell_key"),
    plannedStart: ts("planned_start"),
    plannedShip: ts("planned_ship"),
    /** "prepay": deposit, then balance at shipping; net terms: one invoice at shipping, due N days later. */
    paymentTerms: text("payment_terms", { enum: PAYMENT_TERMS }).notNull().default("prepay"),
    /** The buyer's purchase order as a PDF (optional), an upload of the firm's. */
    poUploadId: text("po_upload_id"),
    /** The ship-to picked at acceptance and the firm's billing address then, copied (AddressSnapshot). */
    shipTo: text("ship_to", { mode: "json" }).$type<AddressSnapshot>(),
    billTo: text("bill_to", { mode: "json" }).$type<AddressSnapshot>(),
    /**
     * The order's own lines and figures when they differ from the accepted quote's (freight
     * re-priced for the ship-to, tax exemption); null = the quote's.
     */
    lines: text("lines", { mode: "json" }).$type<OrderLine[]>(),
    subtotalCents: integer("subtotal_cents"),
    marginCents: integer("margin_cents"),
    taxBp: integer("tax_bp"),
    taxCents: integer("tax_cents"),
    /** The certificate that made the order tax-free, copied at acceptance. */
    taxExemption: text("tax_exemption", { mode: "json" }).$type<{ certificateNumber: string; issuedBy: string; expiresOn: string }>(),
    /** Net terms: when the invoice was issued and when it falls due; reminders sent. */
    invoicedAt: ts("invoiced_at"),
    dueAt: ts("due_at"),
    reminderSentAt: ts("reminder_sent_at"),
    overdueNoticeAt: ts("overdue_notice_at"),
    carrier: text("carrier"),
    trackingNumber: text("tracking_number"),
    actualPrintHours: real("actual_print_hours"),
    actualMaterialKg: real("actual_material_kg"),
    actualMachiningHours: real("actual_machining_hours"),
    inspectionResult: text("inspection_result", { enum: ["pass", "fail", "conditional"] }),
    inspectionNotes: text("inspection_notes"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("orders_request_uq").on(t.requestId), index("orders_org_idx").on(t.orgId)],
);
export type Order = typeof orders.$inferSelect;

/** An address as an order keeps it, with the freight zone it was priced to. */
export interface AddressSnapshot {
  addressId: string | null;
  label: string;
  attention: string | null;
  line1: string;
  line2: string | null;
  city: string;
  region: string | null;
  postalCode: string;
  country: string;
  phone: string | null;
  deliveryNotes: string | null;
  zoneKey?: string | null;
  zoneName?: string | null;
}

/** A line of an order whose figures differ from its quote's. */
export interface OrderLine {
  kind: string;
  partId: string | null;
  description: string;
  quantity: number;
  unitCents: number;
  amountCents: number;
}
export type NewOrder = typeof orders.$inferInsert;

export const SCHEDULE_BLOCK_KINDS = ["print", "cooling", "machining", "finishing"] as const;

/** A block of time on a printing cell's calendar. */
export const scheduleBlocks = sqliteTable(
  "schedule_blocks",
  {
    id: id(),
    orderId: text("order_id")
      .notNull()
      .references(() => orders.id, { onDelete: "cascade" }),
    cellKey: text("cell_key").notNull(),
    kind: text("kind", { enum: SCHEDULE_BLOCK_KINDS }).notNull(),
    startsAt: ts("starts_at").notNull(),
    endsAt: ts("ends_at").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("schedule_blocks_cell_idx").on(t.cellKey, t.startsAt)],
);
export type ScheduleBlock = typeof scheduleBlocks.$inferSelect;

/** Time production takes a cell or the router out of service (maintenance); estimates and bookings respect it. */
export const maintenanceBlocks = sqliteTable(
  "maintenance_blocks",
  {
    id: id(),
    /** A printing cell's key, or "router". */
    resourceKey: text("resource_key").notNull(),
    startsAt: ts("starts_at").notNull(),
    endsAt: ts("ends_at").notNull(),
    reason: text("reason").notNull(),
    createdById: text("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("maintenance_blocks_resource_idx").on(t.resourceKey, t.startsAt)],
);
export type MaintenanceBlock = typeof maintenanceBlocks.$inferSelect;

/** An order's planned ship date moved (a job moved, delayed or finished early), with the reason staff gave. */
export const shipDateChanges = sqliteTable(
  "ship_date_changes",
  {
    id: id(),
    orderId: text("order_id")
      .notNull()
      .references(() => orders.id, { onDelete: "cascade" }),
    fromDate: ts("from_date"),
    toDate: ts("to_date").notNull(),
    reason: text("reason").notNull(),
    /** Whether the client was e-mailed (a move of a working day or more). */
    isNotified: integer("is_notified", { mode: "boolean" }).notNull().default(false),
    actorId: text("actor_id").references(() => users.id),
    at: ts("at")
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [index("ship_date_changes_order_idx").on(t.orderId, t.at)],
);
export type ShipDateChange = typeof shipDateChanges.$inferSelect;

/** Every stage transition, with who and when. */
export const stageEvents = sqliteTable(
  "stage_events",
  {
    id: id(),
    requestId: text("request_id")
      .notNull()
      .references(() => requests.id, { onDelete: "cascade" }),
    fromStage: text("from_stage", { enum: STAGES }),
    toStage: text("to_stage", { enum: STAGES }).notNull(),
    actorId: text("actor_id").references(() => users.id),
    note: text("note"),
    plannedAt: ts("planned_at"),
    at: ts("at")
      .notNull()
      .$defaultFn(() => new Date()),
  },
  (t) => [index("stage_events_request_idx").on(t.requestId, t.at)],
);
export type StageEvent = typeof stageEvents.$inferSelect;
