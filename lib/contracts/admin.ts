import { z } from "zod";
import { PAYMENT_STATE_LABEL, QUOTE_STATE_LABEL } from "@/lib/labels";
import { keysOf, pagedAnswer, wireDate } from "./wire";

/**
 * The back office's list routes, as sent (app/api/admin/**): one schema each, used by the route
 * (`response:` in defineRoute, checked outside production) and by the table that reads it.
 */

/** GET /api/admin/ledger: payments with their order. */
export const ledgerRow = z.object({
  id: z.string(),
  reference: z.string(),
  projectName: z.string(),
  firmName: z.string(),
  kind: z.enum(["deposit", "balance"]),
  status: keysOf(PAYMENT_STATE_LABEL),
  amountCents: z.number().int(),
  feeCents: z.number().int().nullable(),
  refundedCents: z.number().int(),
  currency: z.string(),
  createdAt: wireDate,
  paidAt: wireDate.nullable(),
  receiptNumber: z.string().nullable(),
});
export const ledgerAnswer = pagedAnswer(ledgerRow);
export type LedgerRow = z.infer<typeof ledgerRow>;
export type LedgerAnswer = z.infer<typeof ledgerAnswer>;

/** GET /api/admin/quotes: quote versions, with the win rate and turnaround of the period. */
export const quoteRow = z.object({
  id: z.string(),
  requestId: z.string(),
  reference: z.string(),
  projectName: z.string(),
  firmName: z.string(),
  version: z.number().int(),
  status: keysOf(QUOTE_STATE_LABEL),
  isStale: z.boolean(),
  totalCents: z.number().int(),
  currency: z.string(),
  issuedAt: wireDate.nullable(),
  validUntil: wireDate.nullable(),
  createdAt: wireDate,
});
export const quotesAnswer = pagedAnswer(quoteRow).extend({
  stats: z.object({
    winRate: z.object({ won: z.number(), lost: z.number(), open: z.number(), rate: z.number().nullable() }),
    turnaround: z.object({ count: z.number(), meanHours: z.number().nullable(), medianHours: z.number().nullable() }),
  }),
});
export type QuoteRow = z.infer<typeof quoteRow>;
export type QuotesAnswer = z.infer<typeof quotesAnswer>;

/** GET /api/admin/inbox: requests waiting for sales, most urgent first. */
export const inboxRow = z.object({
  id: z.string(),
  reference: z.string(),
  projectName: z.string(),
  firmName: z.string(),
  stage: z.string(),
  neededBy: wireDate.nullable(),
  submittedAt: wireDate.nullable(),
  isControlled: z.boolean(),
  cureProcess: z.string(),
  partCount: z.number().int(),
  staleQuotes: z.number().int(),
});
export const inboxAnswer = z.object({ rows: z.array(inboxRow) });
export type InboxRow = z.infer<typeof inboxRow>;

/** GET /api/admin/audit: the audit log, with the filters' choices. */
export const auditRow = z.object({
  id: z.string(),
  at: wireDate,
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  actorEmail: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
});
export const auditAnswer = pagedAnswer(auditRow).extend({
  options: z.object({ actors: z.array(z.object({ id: z.string(), email: z.string() })), entityTypes: z.array(z.string()) }),
});
export type AuditRow = z.infer<typeof auditRow>;
export type AuditAnswer = z.infer<typeof auditAnswer>;

/** GET /api/admin/staff: staff members and open invitations. */
export const staffRow = z.object({
  id: z.string(),
  name: z.string().nullable(),
  email: z.string(),
  role: z.string(),
  isControlledCleared: z.boolean(),
  disabledAt: wireDate.nullable(),
  twoFactorSince: wireDate.nullable(),
});
export const staffAnswer = z.object({
  rows: z.array(staffRow),
  invitations: z.array(z.object({ id: z.string(), email: z.string(), role: z.string(), expiresAt: wireDate, isExpired: z.boolean() })),
});
export type StaffRow = z.infer<typeof staffRow>;
export type StaffAnswer = z.infer<typeof staffAnswer>;


/** GET /api/admin/reconciliation: the ledger against the processor for a period, each finding with its notes. */
const findingKind = z.enum(["matched", "missing_ours", "missing_theirs", "amount_mismatch"]);
export const reconciliationFinding = z.object({
  kind: findingKind,
  subject: z.enum(["payment", "refund"]),
  paymentId: z.string().nullable(),
  orderId: z.string().nullable(),
  refundId: z.string().nullable(),
  processorId: z.string().nullable(),
  oursCents: z.number().int().nullable(),
  theirsCents: z.number().int().nullable(),
  differences: z.array(z.object({ field: z.enum(["amount", "fee", "refunded"]), oursCents: z.number().int().nullable(), theirsCents: z.number().int().nullable() })),
  note: z.string(),
  reference: z.string().optional(),
  firmName: z.string().optional(),
  paymentKind: z.string().optional(),
  findingKey: z.string(),
  isResolved: z.boolean(),
  notes: z.array(z.object({ note: z.string(), isResolved: z.boolean(), at: wireDate, author: z.string().nullable() })),
});
export const reconciliationAnswer = z.object({
  period: z.object({ from: z.string(), to: z.string() }),
  summary: z.record(findingKind, z.number().int()),
  findings: z.array(reconciliationFinding),
});
export type FindingKind = z.infer<typeof findingKind>;
export type ReconciliationFinding = z.infer<typeof reconciliationFinding>;
export type ReconciliationAnswer = z.infer<typeof reconciliationAnswer>;
