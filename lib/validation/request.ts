import { z } from "zod";
import { plantToday } from "../dates";
import { fToC } from "../units";
import { decodeListCursor } from "./list-cursor";

/**
 * The new-request form's schemas, shared by the browser (react-hook-form + zodResolver) and the
 * server actions, which parse again. Lengths the user types are in their units; `toDraftFields`
 * and `partToRow` convert to millimetres and °C for storage.
 */

export const CURE_PROCESSES = ["room", "oven", "autoclave"] as const;
export const TEMP_UNITS = ["C", "F"] as const;
/** Delivery choices an estimate offers (lib/estimating/lead-times.ts). */
export const LEAD_TIME_KEYS = ["standard", "expedite", "economy"] as const;

/** Highest cure temperature we accept as typed, °C (above any polymer tool's rating). */
export const MAX_CURE_C = 450;

const optionalNumber = (schema: z.ZodNumber) =>
  z.preprocess((v) => (v === "" || v === null || v === undefined || (typeof v === "number" && Number.isNaN(v)) ? undefined : typeof v === "string" ? Number(v) : v), schema.optional());

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2027-03-15.")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), "That is not a calendar date.");

export const projectSchema = z
  .object({
    projectName: z.string().trim().min(2, "Name the project (at least 2 characters).").max(120, "Use at most 120 characters."),
    neededBy: z.union([isoDate, z.literal("")]).optional(),
    cureProcess: z.enum(CURE_PROCESSES),
    cureTemp: optionalNumber(z.number({ error: "Enter a number." })),
    cureTempUnit: z.enum(TEMP_UNITS),
    partCtePpmPerK: optionalNumber(z.number({ error: "Enter a number." }).min(-5, "Too low for a laminate.").max(100, "At most 100 ppm/K.")),
    isControlled: z.boolean(),
    /** The delivery the client picks on the review step; standard until they do. */
    leadTime: z.enum(LEAD_TIME_KEYS).default("standard"),
    notes: z.string().max(4000, "Use at most 4000 characters.").default(""),
  })
  .superRefine((v, ctx) => {
    if (v.cureProcess !== "room" && v.cureTemp === undefined) {
      ctx.addIssue({ code: "custom", path: ["cureTemp"], message: `Enter the ${v.cureProcess} cure temperature.` });
    }
    if (v.cureTemp !== undefined) {
      const c = v.cureTempUnit === "F" ? fToC(v.cureTemp) : v.cureTemp;
      if (c < -50 || c > MAX_CURE_C) ctx.addIssue({ code: "custom", path: ["cureTemp"], message: `Enter a cure temperature between −50 and ${MAX_CURE_C} °C.` });
    }
  });
export type ProjectInput = z.input<typeof projectSchema>;
export type ProjectValues = z.output<typeof projectSchema>;

export const PRINT_MODES = ["solid", "shell"] as const;

export const partSchema = z.object({
  id: z.string().min(1),
  name: z.string().trim().min(1, "Name the part.").max(120, "Use at most 120 characters."),
  materialKey: z.string().min(1, "Choose a material."),
  /** In the part's display units (see `units`). */
  allowance: z.coerce.number({ error: "Enter a number." }).min(0, "Cannot be negative.").max(100, "At most 100."),
  quantity: z.coerce.number({ error: "Enter a number." }).int("Whole parts only.").min(1, "At least 1.").max(50, "At most 50; call us for series."),
  printMode: z.enum(PRINT_MODES),
  units: z.enum(["mm", "in"]),
  unitsConfirmed: z.boolean(),
  cellKey: z.string().max(60).optional().or(z.literal("")),
  /** STEP/IGES assemblies: indices of the bodies to print; null or absent = every body. */
  bodies: z.array(z.number().int().min(0).max(99_999)).max(5_000).nullable().optional(),
});
export type PartInput = z.input<typeof partSchema>;
export type PartValues = z.output<typeof partSchema>;

/** The whole draft as the form holds it; saving a draft needs no more than this. */
export const draftSchema = z.object({
  requestId: z.string().min(1).optional(),
  project: projectSchema,
  parts: z.array(partSchema).max(20, "At most 20 parts per request."),
});
export type DraftInput = z.input<typeof draftSchema>;
export type DraftValues = z.output<typeof draftSchema>;

/**
 * What submitting adds: a needed-by date not already past (in the plant's calendar), at least one
 * part, every part's units confirmed and a file analysed (checked on the server).
 */
export const submitSchema = draftSchema.safeExtend({
  requestId: z.string().min(1),
  project: projectSchema.refine((p) => !p.neededBy || !isPastDay(p.neededBy), { path: ["neededBy"], message: "That date has passed; pick a date from today on." }),
  parts: z
    .array(
      partSchema.refine((p) => p.unitsConfirmed, { path: ["unitsConfirmed"], message: "Confirm the file's units." }),
    )
    .min(1, "Add at least one part.")
    .max(20, "At most 20 parts per request."),
});

export const MM_PER_IN = 25.4;

/** Is this "YYYY-MM-DD" day before today in the plant's calendar? */
export function isPastDay(ymd: string, now: Date = new Date()): boolean {
  return ymd < plantToday(now);
}

/** Storage form of the project step: °C, Date, null for blanks. */
export function toDraftFields(p: ProjectValues) {
  return {
    projectName: p.projectName,
    neededBy: p.neededBy ? new Date(`${p.neededBy}T00:00:00Z`) : null,
    cureProcess: p.cureProcess,
    cureTempC: p.cureTemp === undefined ? null : Math.round((p.cureTempUnit === "F" ? fToC(p.cureTemp) : p.cureTemp) * 10) / 10,
    partCtePpmPerK: p.partCtePpmPerK ?? null,
    isControlled: p.isControlled,
    leadTime: p.leadTime,
    notes: p.notes ?? "",
  };
}

/** Storage form of a part: allowance in millimetres. */
export function partToRow(p: PartValues) {
  return {
    name: p.name,
    materialKey: p.materialKey,
    allowanceMm: Math.round((p.units === "in" ? p.allowance * MM_PER_IN : p.allowance) * 1000) / 1000,
    quantity: p.quantity,
    printMode: p.printMode,
    units: p.units,
    unitsConfirmed: p.unitsConfirmed,
    cellKey: p.cellKey ? p.cellKey : null,
    selectedBodies: p.bodies?.length ? [...new Set(p.bodies)].sort((a, b) => a - b) : null,
  };
}

/** Accepting a quote: a PO number and the terms. */
export const acceptQuoteSchema = z.object({
  quoteId: z.string().min(1),
  poNumber: z.string().trim().min(1, "Enter your purchase order number.").max(60, "Use at most 60 characters.").regex(/^[\w ./#-]+$/, "Use letters, digits, spaces and . / # - _ only."),
  acceptTerms: z.literal(true, { error: "Accept the terms to go ahead." }),
  /** One of the firm's shipping addresses, freight priced to it; the default ship-to when absent. */
  shipToId: z.string().min(1, "Pick where the order ships.").max(64).optional(),
  /** How the order is paid: the deposit by card or bank transfer, or the whole on the firm's account (net terms). */
  payBy: z.enum(["card", "bank_transfer", "account"], { error: "Pick how to pay." }).default("card"),
  /** The buyer's purchase order as a PDF (optional), an upload of the user's. */
  poUploadId: z.string().min(1).max(64).optional(),
});
export type AcceptQuoteInput = z.input<typeof acceptQuoteSchema>;

export const messageSchema = z.object({
  requestId: z.string().min(1),
  parentId: z.string().min(1).optional(),
  body: z.string().trim().min(1, "Write a message.").max(5000, "Use at most 5000 characters."),
  uploadIds: z.array(z.string().min(1)).max(4).default([]),
});

export const inviteSchema = z.object({
  email: z.email("Enter a valid e-mail address.").max(320),
  role: z.enum(["client", "client_admin"]),
});

export const billingSchema = z.object({
  billingContact: z.string().trim().max(160).default(""),
  billingEmail: z.union([z.email("Enter a valid e-mail address.").max(320), z.literal("")]),
  defaultPoNumber: z.string().trim().max(60).regex(/^[\w ./#-]*$/, "Use letters, digits, spaces and . / # - _ only.").default(""),
});

/** Portal list query (/api/portal/requests). */
export const listQuerySchema = z.object({
  q: z.string().max(100).optional(),
  stage: z.string().max(300).optional(),
  sort: z.enum(["updatedAt", "reference", "projectName", "stage", "neededBy", "totalCents"]).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
  /** The previous page's `nextCursor` (keyset paging; takes the place of `offset`). */
  after: z
    .string()
    .max(400)
    .transform((s, ctx) => {
      const c = decodeListCursor(s);
      if (!c) {
        ctx.addIssue({ code: "custom", message: "That page cursor is not one this list gave." });
        return z.NEVER;
      }
      return c;
    })
    .optional(),
});
