import { z } from "zod";
import { STAGES } from "../../db/schema/common";
import { fromPlantInput } from "../dates";

export const scheduleSchema = z.object({
  orderId: z.string().min(1).max(64),
  cellKey: z.string().min(1).max(64),
  /**
   * The form's `datetime-local` value, read as the plant's wall-clock time (lib/dates.ts); an
   * instant with a trailing "Z" is taken as it is.
   */
  start: z
    .string()
    .min(1, "Pick a start.")
    .refine((s) => (s.endsWith("Z") ? !Number.isNaN(Date.parse(s)) : fromPlantInput(s) !== null), "Not a date and time."),
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
     * A hold, a cancel or a step back along the flow carries the target again as `confirm` (the
     * form sends it after its "are you sure" step), so a replayed or scripted call without it
     * changes nothing. Steps back are checked in the action, which knows where the order is.
     */
    confirm: z.enum(STAGES).optional(),
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

export const fileReportSchema = z.object({
  orderId: z.string().min(1).max(64),
  /** The `uploadId` the inspectionReport upload route answered. */
  uploadId: z.string().min(1).max(64),
});

export const calendarQuerySchema = z.object({
  cell: z.string().min(1).max(64),
  from: z.iso.date().optional(),
  days: z.coerce.number().int().min(1).max(90).default(21),
});

/** A date-time from the form: the plant's wall-clock `datetime-local`, or an instant ending in "Z". */
const plantDateTime = (what: string) =>
  z
    .string()
    .min(1, `Pick ${what}.`)
    .refine((s) => (s.endsWith("Z") ? !Number.isNaN(Date.parse(s)) : fromPlantInput(s) !== null), "Not a date and time.");
export const instantOf = (s: string): Date => (s.endsWith("Z") ? new Date(s) : fromPlantInput(s)!);

/** Moving a booked job: a new print start and the reason the client will read. */
export const moveJobSchema = z.object({
  orderId: z.string().min(1).max(64),
  start: plantDateTime("a new start"),
  reason: z.string().trim().min(3, "Say why the job moves; the client reads it if the ship date changes.").max(500),
});

/** Taking a cell or the router out of service for maintenance. */
export const maintenanceBlockSchema = z
  .object({
    resourceKey: z.string().min(1).max(64),
    start: plantDateTime("a start"),
    end: plantDateTime("an end"),
    reason: z.string().trim().min(3, "Say what the maintenance is.").max(200),
  })
  .refine((v) => instantOf(v.end).getTime() > instantOf(v.start).getTime(), { path: ["end"], message: "The end must be after the start." });

export const removeBlockSchema = z.object({ id: z.string().min(1).max(64) });

/** A block of a booked job ends at another time than planned (finished early, running late). */
export const blockEndSchema = z.object({
  orderId: z.string().min(1).max(64),
  kind: z.enum(["print", "cooling", "machining"]),
  endsAt: plantDateTime("when it ends"),
  reason: z.string().trim().min(3, "Say why; the client reads it if the ship date changes.").max(500),
});
