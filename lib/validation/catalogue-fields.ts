/**
 * The catalogue forms' numeric fields (rate card, materials, printing cells): each says its unit
 * and bounds, and how the form shows the stored value. The schemas (./admin-catalogue.ts) are
 * built from these lists, so the form and the server check the same thing.
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
