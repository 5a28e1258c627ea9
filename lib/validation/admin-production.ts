import { z } from "zod";
import { STAGES } from "../../db/schema/common";

export const scheduleSchema = z.object({
  orderId: z.string().min(1).max(64),
  cellKey: z.string().min(1).max(64),
  /** Local date-time from the form, read as UTC (the plant's calendar is kept in UTC). */
  start: z.string().min(1, "Pick a start.").refine((s) => !Number.isNaN(Date.parse(s.endsWith("Z") ? s : `${s}Z`)), "Not a date and time."),
});

export const moveStageSchema = z.object({
  orderId: z.string().min(1).max(64),
  to: z.enum(STAGES),
  note: z.string().trim().max(1_000).optional(),
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
