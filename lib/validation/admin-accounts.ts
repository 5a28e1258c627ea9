import { z } from "zod";

const day = z.iso.date("A date as YYYY-MM-DD.");

export const periodSchema = z
  .object({ from: day, to: day })
  .refine((p) => p.from <= p.to, { path: ["to"], message: "The period ends before it starts." })
  .refine((p) => Date.parse(p.to) - Date.parse(p.from) <= 366 * 86_400_000, { path: ["to"], message: "At most a year at a time." });

/** Whole UTC days: from 00:00 of `from` to the last millisecond of `to`. */
export function periodBounds(p: { from: string; to: string }): { from: Date; to: Date } {
  return { from: new Date(`${p.from}T00:00:00.000Z`), to: new Date(`${p.to}T23:59:59.999Z`) };
}

export const refundSchema = z.object({
  paymentId: z.string().min(1).max(64),
  amountCents: z.coerce.number().int("Whole cents only.").positive("The refund must be above zero."),
  reason: z.string().trim().min(3, "Say why the money goes back.").max(500),
  /** Made when the form opens; a second submit with the same key is refused. */
  idempotencyKey: z.string().min(8).max(100),
  /**
   * The amount again, sent by the form's "are you sure" step: money leaves only when the person
   * has seen it. A scripted or replayed call without it moves nothing.
   */
  confirmAmountCents: z.coerce.number().int().optional(),
});

export const ledgerQuerySchema = z.object({
  from: day.optional(),
  to: day.optional(),
  status: z.enum(["pending", "paid", "failed", "expired", "refunded", "partially_refunded"]).optional(),
  kind: z.enum(["deposit", "balance"]).optional(),
  q: z.string().trim().max(100).optional(),
  sort: z.enum(["createdAt", "paidAt", "amountCents", "reference", "status"]).optional(),
  dir: z.enum(["asc", "desc"]).optional(),
  page: z.coerce.number().int().min(1).max(10_000).optional(),
  pageSize: z.coerce.number().int().min(1).max(200).optional(),
});

export const findingNoteSchema = z.object({
  findingKey: z.string().regex(/^(payment|refund|processor):[A-Za-z0-9_-]{1,100}$/, "Not a finding."),
  note: z.string().trim().min(3, "Write what you found or did.").max(2_000),
  /** Marks the finding resolved (explained or mended); a later note without it reopens it. */
  resolve: z.boolean().default(false),
});
