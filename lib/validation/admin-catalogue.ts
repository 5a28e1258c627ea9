import { LEAD_TIME_FALLBACKS, REMOVAL_FALLBACK_H } from "../estimating/card-fallbacks";
import { z } from "zod";
import type { CellParams, MaterialParams, RateCardParams } from "../estimating/types";
import { CELL_FIELDS, MATERIAL_FIELDS, RATE_CARD_FIELDS, shownUnit, toShown, type NumberField } from "./catalogue-fields";

/**
 * Catalogue forms (materials, printing cells, rate card), shared by the form and the server.
 * Each numeric field says its unit; money is whole cents, rates and shares whole basis points.
 */

const nonNeg = (f: NumberField) => {
  let s = z.coerce.number({ error: `${f.label}: enter a number.` }).refine(Number.isFinite, `${f.label}: enter a number.`);
  if (f.int) s = s.refine(Number.isInteger, `${f.label}: a whole number, please.`);
  s = s.refine((v) => v >= (f.min ?? 0), f.min !== undefined ? `${f.label} can not be below ${toShown(f, f.min)} ${shownUnit(f)}.` : `${f.label} can not be negative.`);
  if (f.positive) s = s.refine((v) => v > 0, `${f.label} must be above zero.`);
  if (f.max !== undefined) s = s.refine((v) => v <= f.max!, `${f.label} can not exceed ${toShown(f, f.max)} ${shownUnit(f)}.`);
  return s;
};

function numbers(fields: NumberField[]) {
  return Object.fromEntries(fields.map((f) => [f.name, nonNeg(f)])) as Record<string, ReturnType<typeof nonNeg>>;
}

const keyRule = z.string().trim().regex(/^[a-z0-9][a-z0-9-]{1,40}$/, "Key: lower-case letters, digits and dashes (2–41 characters).");
const text = (label: string, max = 200) => z.string().trim().min(1, `${label}: required.`).max(max);

/** An IANA time zone id the runtime knows (e.g. "UTC", "Etc/GMT+6"). */
const timeZoneRule = z
  .string()
  .trim()
  .min(1, "Plant time zone: required.")
  .max(64)
  .refine((tz) => {
    try {
      new Intl.DateTimeFormat("en-US", { timeZone: tz });
      return true;
    } catch {
      return false;
    }
  }, "Plant time zone: an IANA zone id, such as UTC or Etc/GMT+6.");

const dateList = (label: string) =>
  z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : v.split(/[\s,;]+/).filter(Boolean)))
    .pipe(z.array(z.string().regex(/^\d{4}-\d{2}-\d{2}$/, `${label}: dates as YYYY-MM-DD.`)).max(120));

export const rateCardSchema = z.object({
  key: keyRule,
  name: text("Name", 120),
  currency: z.string().trim().toLowerCase().regex(/^[a-z]{3}$/, "Currency: a 3-letter code."),
  source: z.string().trim().max(2000).default(""),
  plantTimeZone: timeZoneRule,
  holidays: dateList("Plant closed dates"),
  ...numbers(RATE_CARD_FIELDS),
});

export const materialSchema = z
  .object({
    key: keyRule,
    name: text("Name", 120),
    notes: z.string().trim().max(2000).default(""),
    source: z.string().trim().max(2000).default(""),
    isActive: z.coerce.boolean().default(true),
    ...numbers(MATERIAL_FIELDS),
  })
  .refine((m: Record<string, unknown>) => Number(m.meltTempMaxC) >= Number(m.meltTempMinC), { path: ["meltTempMaxC"], message: "The high melt temperature is below the low one." })
  .refine((m: Record<string, unknown>) => Number(m.maxLayerTimeS) > Number(m.minLayerTimeS), { path: ["maxLayerTimeS"], message: "The longest layer time must exceed the shortest." });

const listOfPositive = (label: string) =>
  z
    .union([z.string(), z.array(z.coerce.number())])
    .transform((v) => (Array.isArray(v) ? v : v.split(/[\s,;]+/).filter(Boolean).map(Number)))
    .pipe(z.array(z.number().finite().positive(`${label}: positive numbers only.`)).min(1, `${label}: at least one value.`).max(12));

export const cellSchema = z
  .object({
    key: keyRule,
    name: text("Name", 120),
    isActive: z.coerce.boolean().default(true),
    canPrintVertical: z.coerce.boolean().default(false),
    beadWidthsMm: listOfPositive("Bead widths"),
    layerHeightsMm: listOfPositive("Layer heights"),
    workingWeekdays: z.array(z.coerce.number().int().min(0).max(6)).min(1, "Pick at least one working day."),
    holidays: z
      .union([z.string(), z.array(z.string())])
      .transform((v) => (Array.isArray(v) ? v : v.split(/[\s,;]+/).filter(Boolean)))
      .pipe(z.array(z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Holidays: dates as YYYY-MM-DD.")).max(60)),
    ...numbers(CELL_FIELDS),
  })
  .refine((c: Record<string, unknown>) => Number(c.speedMaxMmS) >= Number(c.speedMinMmS), { path: ["speedMaxMmS"], message: "The fastest speed is below the slowest." })
  .refine((c: Record<string, unknown>) => Number(c.shiftsPerDay) * Number(c.hoursPerShift) <= 24, { path: ["hoursPerShift"], message: "Shifts × hours exceed a day." });

const pick = (o: Record<string, unknown>, fields: NumberField[]) => Object.fromEntries(fields.map((f) => [f.name, Number(o[f.name])]));

/** Parsed form → the engine's typed params (the schema has checked every number). */
export function toRateCardParams(o: z.output<typeof rateCardSchema>): RateCardParams {
  const r = o as Record<string, unknown>;
  return { key: o.key, name: o.name, currency: o.currency, source: o.source, plantTimeZone: o.plantTimeZone, holidays: o.holidays, ...pick(r, RATE_CARD_FIELDS) } as unknown as RateCardParams;
}

export function toMaterialParams(o: z.output<typeof materialSchema>): MaterialParams {
  const r = o as Record<string, unknown>;
  return { key: String(r.key), name: String(r.name), notes: String(r.notes ?? ""), source: String(r.source ?? ""), ...pick(r, MATERIAL_FIELDS) } as unknown as MaterialParams;
}

export function toCellParams(o: z.output<typeof cellSchema>): CellParams {
  const r = o as Record<string, unknown>;
  const n = (k: string) => Number(r[k]);
  return {
    key: String(r.key),
    name: String(r.name),
    envelopeMm: { x: n("envelopeX"), y: n("envelopeY"), z: n("envelopeZ") },
    extruderOutputKgPerH: n("extruderOutputKgPerH"),
    beadWidthsMm: r.beadWidthsMm as number[],
    layerHeightsMm: r.layerHeightsMm as number[],
    defaultBeadWidthMm: n("defaultBeadWidthMm"),
    defaultLayerHeightMm: n("defaultLayerHeightMm"),
    speedMinMmS: n("speedMinMmS"),
    speedMaxMmS: n("speedMaxMmS"),
    canPrintVertical: Boolean(r.canPrintVertical),
    printRateCentsPerH: n("printRateCentsPerH"),
    accelerationMmS2: n("accelerationMmS2"),
    calendar: {
      workingWeekdays: [...new Set(r.workingWeekdays as number[])].sort(),
      shiftsPerDay: n("shiftsPerDay"),
      hoursPerShift: n("hoursPerShift"),
      holidays: r.holidays as string[],
    },
  };
}

/** Rate card → form values (the closed dates as one line). */
export function rateCardFormValues(c: RateCardParams): Record<string, unknown> {
  // a card saved before removal and the delivery choices shows the figures the engine uses for it
  return { removalHours: REMOVAL_FALLBACK_H, ...LEAD_TIME_FALLBACKS, ...c, plantTimeZone: c.plantTimeZone ?? "UTC", holidays: (c.holidays ?? []).join(", ") };
}

/** Typed params → flat form values (the inverse of the above), for prefilling the forms. */
export function cellFormValues(c: CellParams): Record<string, unknown> {
  return {
    ...c,
    envelopeX: c.envelopeMm.x,
    envelopeY: c.envelopeMm.y,
    envelopeZ: c.envelopeMm.z,
    beadWidthsMm: c.beadWidthsMm.join(", "),
    layerHeightsMm: c.layerHeightsMm.join(", "),
    workingWeekdays: c.calendar.workingWeekdays,
    shiftsPerDay: c.calendar.shiftsPerDay,
    hoursPerShift: c.calendar.hoursPerShift,
    holidays: c.calendar.holidays.join(", "),
  };
}
