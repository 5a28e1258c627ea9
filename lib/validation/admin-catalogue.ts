import { LEAD_TIME_FALLBACKS, REMOVAL_FALLBACK_H } from "../estimating/card-fallbacks";
import { z } from "zod";
import type { CellParams, MaterialParams, RateCardParams } from "../estimating/types";

/**
 * Catalogue forms (materials, printing cells, rate card), shared by the form and the server.
 * Each numeric field says its unit; money is whole cents, rates and shares whole basis points.
 */
export interface NumberField {
  name: string;
  label: string;
  unit: string;
  /** Whole numbers only (cents, basis points, counts). */
  int?: boolean;
  min?: number;
  max?: number;
  /** Must be above zero (densities, rates that divide). */
  positive?: boolean;
  /**
   * How the form shows the stored value: stored ÷ divisor, in `unit` (cents as dollars, basis
   * points as percent). The server and the API keep the stored unit.
   */
  display?: { unit: string; divisor: number };
}

/** The unit a form shows for a field. */
export const shownUnit = (f: NumberField) => f.display?.unit ?? f.unit;
/** A stored value as the form shows it, and back (rounded to the stored unit's whole numbers when `int`). */
export const toShown = (f: NumberField, stored: number) => (f.display ? stored / f.display.divisor : stored);
export function fromShown(f: NumberField, shown: unknown): unknown {
  if (!f.display || shown === "" || shown === null || shown === undefined) return shown;
  const v = Number(shown);
  if (!Number.isFinite(v)) return shown;
  const stored = v * f.display.divisor;
  return f.int ? Math.round(stored) : stored;
}


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

export const RATE_CARD_FIELDS: NumberField[] = [
  { name: "printRateCentsPerH", label: "Print rate", unit: "¢/h", display: { unit: "$/h", divisor: 100 }, int: true },
  { name: "dwellRateCentsPerH", label: "Dwell rate", unit: "¢/h", display: { unit: "$/h", divisor: 100 }, int: true },
  { name: "machiningRateCentsPerH", label: "Machining rate", unit: "¢/h", display: { unit: "$/h", divisor: 100 }, int: true },
  { name: "engineeringRateCentsPerH", label: "Engineering rate", unit: "¢/h", display: { unit: "$/h", divisor: 100 }, int: true },
  { name: "engineeringHoursPerPart", label: "Engineering hours per part", unit: "h" },
  { name: "setupFeeCents", label: "Setup fee", unit: "¢", display: { unit: "$", divisor: 100 }, int: true },
  { name: "purgeKg", label: "Purge per build", unit: "kg" },
  { name: "startupScrapFraction", label: "Start-up scrap", unit: "fraction", max: 1 },
  { name: "roughingRemovalMm3PerMin", label: "Roughing removal rate", unit: "mm³/min", positive: true },
  { name: "finishingFeedMmPerMin", label: "Finishing feed", unit: "mm/min", positive: true },
  { name: "cutterRadiusMm", label: "Cutter radius", unit: "mm", positive: true },
  { name: "targetScallopMm", label: "Target scallop height", unit: "mm", positive: true },
  { name: "toolChangeMinutes", label: "Tool change time", unit: "min" },
  { name: "toolChangeCount", label: "Tool changes", unit: "count", int: true },
  { name: "machiningSetupHours", label: "Machining setup", unit: "h" },
  { name: "sealingCoatCentsPerM2", label: "Sealing coat", unit: "¢/m²", display: { unit: "$/m²", divisor: 100 }, int: true },
  { name: "vacuumTestCents", label: "Vacuum-integrity test", unit: "¢/part", display: { unit: "$/part", divisor: 100 }, int: true },
  { name: "crateBaseCents", label: "Crate base", unit: "¢", display: { unit: "$", divisor: 100 }, int: true },
  { name: "crateCentsPerKg", label: "Crate per kg", unit: "¢/kg", display: { unit: "$/kg", divisor: 100 }, int: true },
  { name: "crateCentsPerM3", label: "Crate per m³", unit: "¢/m³", display: { unit: "$/m³", divisor: 100 }, int: true },
  { name: "cratePaddingMm", label: "Crate padding per side", unit: "mm" },
  { name: "freightBaseCents", label: "Freight base", unit: "¢", display: { unit: "$", divisor: 100 }, int: true },
  { name: "freightCentsPerKg", label: "Freight per kg", unit: "¢/kg", display: { unit: "$/kg", divisor: 100 }, int: true },
  { name: "marginBp", label: "Margin", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 50_000 },
  { name: "taxBp", label: "Tax", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 10_000 },
  { name: "depositBp", label: "Deposit share", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 10_000 },
  { name: "quoteValidityDays", label: "Quote validity", unit: "days", int: true, min: 1, max: 365 },
  { name: "defaultAllowanceMm", label: "Default finish allowance", unit: "mm", max: 100 },
  { name: "coolingHoursBase", label: "Cooling base", unit: "h" },
  { name: "coolingHoursPerKg", label: "Cooling per kg", unit: "h/kg" },
  { name: "coolingHoursMax", label: "Cooling cap", unit: "h" },
  { name: "finishingDays", label: "Finishing", unit: "working days", int: true },
  { name: "inspectionDays", label: "Inspection", unit: "working days", int: true },
  { name: "packingDays", label: "Packing", unit: "working days", int: true },
  { name: "liftingCautionKg", label: "Lifting caution above", unit: "kg" },
  { name: "printSetupHours", label: "Cell set-up before printing", unit: "h", max: 48 },
  { name: "removalHours", label: "Lifting the print off the bed", unit: "h", max: 48 },
  { name: "overtimePremiumBp", label: "Expedited: overtime premium on set-up and machining", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 30_000 },
  { name: "expediteFeeCents", label: "Expedited: finishing, inspection and packing on overtime", unit: "¢", display: { unit: "$", divisor: 100 }, int: true, positive: true },
  { name: "economyDiscountBp", label: "Economy: discount", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 5_000 },
  { name: "economyExtraDays", label: "Economy: later than standard by", unit: "working days", int: true, min: 1, max: 60 },
  { name: "economyMaxLoadBp", label: "Economy: offered while cells are booked at most", unit: "bp", display: { unit: "%", divisor: 100 }, int: true, max: 10_000 },
  { name: "shellNetWallMm", label: "Shell net wall after machining", unit: "mm", positive: true, max: 200 },
  { name: "ribSpacingMm", label: "Shell rib spacing", unit: "mm", positive: true, max: 5000 },
  { name: "ribBeads", label: "Rib width", unit: "beads", int: true, positive: true, max: 10 },
  { name: "skinLayers", label: "Skin layers (top and bottom)", unit: "layers", int: true, positive: true, max: 50 },
  { name: "maxBridgeMm", label: "Longest unsupported bridge", unit: "mm", positive: true, max: 2000 },
  { name: "shiftStartHour", label: "First shift starts", unit: "h (plant time)", max: 23 },
];

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

export const MATERIAL_FIELDS: NumberField[] = [
  { name: "densityGPerCm3", label: "Density", unit: "g/cm³", positive: true, max: 5 },
  { name: "pricePerKgCents", label: "Price per kg", unit: "¢/kg", display: { unit: "$/kg", divisor: 100 }, int: true },
  { name: "meltTempMinC", label: "Melt temperature, low", unit: "°C" },
  { name: "meltTempMaxC", label: "Melt temperature, high", unit: "°C" },
  { name: "dryingTempC", label: "Drying temperature", unit: "°C" },
  { name: "dryingHours", label: "Drying time", unit: "h" },
  { name: "glassTransitionC", label: "Glass transition", unit: "°C" },
  { name: "maxServiceTempC", label: "Max service temperature", unit: "°C" },
  { name: "cteAlongPpmPerK", label: "CTE along the bead", unit: "ppm/K" },
  { name: "cteAcrossPpmPerK", label: "CTE across the bead", unit: "ppm/K" },
  { name: "minLayerTimeS", label: "Shortest layer time", unit: "s", positive: true },
  { name: "maxLayerTimeS", label: "Longest layer time", unit: "s", positive: true },
];

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

export const CELL_FIELDS: NumberField[] = [
  { name: "envelopeX", label: "Envelope X", unit: "mm", positive: true, max: 50_000 },
  { name: "envelopeY", label: "Envelope Y", unit: "mm", positive: true, max: 50_000 },
  { name: "envelopeZ", label: "Envelope Z", unit: "mm", positive: true, max: 50_000 },
  { name: "extruderOutputKgPerH", label: "Extruder output", unit: "kg/h", positive: true },
  { name: "defaultBeadWidthMm", label: "Default bead width", unit: "mm", positive: true },
  { name: "defaultLayerHeightMm", label: "Default layer height", unit: "mm", positive: true },
  { name: "speedMinMmS", label: "Slowest speed", unit: "mm/s", positive: true },
  { name: "speedMaxMmS", label: "Fastest speed", unit: "mm/s", positive: true },
  { name: "printRateCentsPerH", label: "Print rate", unit: "¢/h", int: true },
  { name: "accelerationMmS2", label: "Head acceleration", unit: "mm/s²", positive: true, max: 20_000 },
  { name: "shiftsPerDay", label: "Shifts per day", unit: "count", int: true, positive: true, max: 3 },
  { name: "hoursPerShift", label: "Hours per shift", unit: "h", positive: true, max: 12 },
];

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
