import { z } from "zod";
import { LINE_KINDS } from "../quoting/lines";

const cents = z.coerce.number().int("Whole cents only.").min(0, "Amounts can not be negative.").max(100_000_000_00);

export const quoteLineSchema = z.object({
  partId: z.string().max(64).nullable().default(null),
  kind: z.enum(LINE_KINDS),
  description: z.string().trim().min(1, "Describe the line.").max(300),
  quantity: z.coerce.number().finite().positive("Quantity must be above zero.").max(1_000_000),
  unitCents: cents,
  amountCents: cents,
  estimatedCents: cents.nullable().default(null),
  editReason: z.string().trim().max(500).nullable().default(null),
});

export const saveQuoteSchema = z.object({
  requestId: z.string().min(1).max(64),
  /** The draft being edited; absent for a new version. */
  quoteId: z.string().max(64).optional(),
  /** The analyses the lines were prefilled from; issuing refuses when a part has a newer one. */
  basisAnalysisIds: z.array(z.string().max(64)).max(100).default([]),
  lines: z.array(quoteLineSchema).min(1, "A quote needs at least one line.").max(200),
  marginBp: z.coerce.number().int().min(0, "Margin can not be negative.").max(50_000),
  taxBp: z.coerce.number().int().min(0, "Tax can not be negative.").max(10_000),
  depositBp: z.coerce.number().int().min(0).max(10_000, "The deposit can not exceed the total."),
  validityDays: z.coerce.number().int().min(1, "At least one day.").max(365),
  terms: z.string().trim().max(5_000).default(""),
  notes: z.string().trim().max(5_000).default(""),
  shipDate: z.iso.date().nullable().optional(),
  /** The delivery quoted (the client's choice on the request unless sales changes it). */
  leadTime: z.enum(["standard", "expedite", "economy"]).default("standard"),
  issue: z.boolean().default(false),
});
export type SaveQuoteInput = z.input<typeof saveQuoteSchema>;

export const staffMessageSchema = z.object({
  requestId: z.string().min(1).max(64),
  body: z.string().trim().min(1, "Write a message.").max(5_000),
});

export const quoteListQuerySchema = z.object({
  status: z.enum(["draft", "issued", "accepted", "superseded", "expired", "declined"]).optional(),
  q: z.string().trim().max(100).optional(),
  sort: z.enum(["issuedAt", "createdAt", "totalCents", "reference", "status"]).optional(),
  dir: z.enum(["asc", "desc"]).optional(),
  page: z.coerce.number().int().min(1).max(10_000).optional(),
  pageSize: z.coerce.number().int().min(1).max(200).optional(),
});
