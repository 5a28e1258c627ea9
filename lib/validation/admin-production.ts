import { z } from "zod";
import { STAGES } from "../../db/schema/common";

export const scheduleSchema = z.object({
  orderId: z.string().min(1).max(64),
  cellKey: z.string().min(1).max(64),
  /** Local date-time from the form, read as UTC (the plant's calendar is kept in UTC). */
  start: z.string().min(1, "Pick a start.").refine((s) => !Number.isNaN(Date.parse(s.endsWith("Z") ? s : `${s}Z`)), "Not a date and time."),
});

/** Stage moves the form confirms first: the client sees them and they stop the job. */
export const CONFIRMED_MOVES = ["on_hold", "cancelled"] as const;
export type ConfirmedMove = (typeof CONFIRMED_MOVES)[number];
export const isConfirmedMove = (to: string): to is ConfirmedMove => (CONFIRMED_MOVES as readonly string[]).includes(to);

export const moveStageSchema = z
  .object({
    orderId: z.string().min(1).max(64),
    to: z.enum(STAGES),
    note: z.string().trim().max(1_000).optional(),
    /**
     * A hold or a cancel carries the target again as `confirm` (the form sends it after its
     * "are you sure" step), so a replayed or scripted call without it changes nothing.
     */
    confirm: z.enum(CONFIRMED_MOVES).optional(),
  })
  .superRefine((v, ctx) => {
    if (!isConfirmedMove(v.to)) return;
    if (v.confirm !== v.to) {
      ctx.addIssue({ code: "custom", path: ["confirm"], message: v.to === "cancelled" ? "Confirm the cancellation first." : "Confirm the hold first." });
    }
    if (v.to === "cancelled" && (v.note ?? "").length < 3) {
      ctx.addIssue({ code: "custom", path: ["note"], message: "Give the reason for cancelling; the client sees it on their timeline." });
    }
  });

const optHours = z
  .union([z.literal(""), z.null(), z.coerce.number().finite().min(0, "Can not be negative.").max(100_000)])
  .transform((v) => (v === "" ? null : v))
  .optional();

export const actualsSchema = z.object({
  orderId: z.string().min(1).max(64),
  actualPrintHours: optHours,
  actualMaterialKg: optHours,
  actualMachiningHours: optHours,
  inspectionResult: z.union([z.literal(""), z.enum(["pass", "fail", "conditional"])]).transform((v) => (v === "" ? null : v)).optional(),
  inspectionNotes: z.string().trim().max(5_000).optional(),
  /** The `uploadId` the inspectionReport upload route answered. */
  reportUploadId: z.string().max(64).optional(),
  carrier: z.string().trim().max(100).optional(),
  trackingNumber: z.string().trim().max(100).optional(),
});

export const calendarQuerySchema = z.object({
  cell: z.string().min(1).max(64),
  from: z.iso.date().optional(),
  days: z.coerce.number().int().min(1).max(90).default(21),
});
