/**
 * The catalogue's plain-data types: materials, cells (with their calendars) and the rate card,
 * as the database stores them in JSON columns. Same units-in-names rule as ./types.ts.
 */
import type { FreightRules } from "./freight";

/** A material of the catalogue (the database stores it as JSON in `materials.params`). */
export interface MaterialParams {
  key: string;
  name: string;
  densityGPerCm3: number;
  pricePerKgCents: number;
  meltTempMinC: number;
  meltTempMaxC: number;
  dryingTempC: number;
  dryingHours: number;
  glassTransitionC: number;
  /** Highest tool service temperature the bureau accepts for this material. */
  maxServiceTempC: number;
  cteAlongPpmPerK: number;
  cteAcrossPpmPerK: number;
  /** Cooling window for one layer: shortest and longest time between laying a layer and the next. */
  minLayerTimeS: number;
  maxLayerTimeS: number;
  notes: string;
  /** Where the figures come from ("memory", "common practice", a paper...). */
  source: string;
  /** Extruder output class: commodity, engineering or high-temperature polymer (older rows: from the melt range, see extruder.ts). */
  family?: MaterialFamily;
}

/** Material families an extruder's output is stated for (a screw lays less of a hotter, stiffer melt). */
export type MaterialFamily = "commodity" | "engineering" | "high-temp";

/** Dryer hoppers of a cell: each dries one material; capacity per hopper, kg. */
export interface DryerParams {
  hoppers: number;
  hopperKg: number;
}

/** A cell that also prints vertically: layers stacked along its long axis, each layer inside the section. */
export interface VerticalPrintParams {
  /** Travel along which vertical layers are stacked, mm. */
  longAxisMm: number;
  /** Largest layer (the part's cross-section) in a vertical build, mm. */
  sectionMm: { x: number; y: number };
}

export interface WorkingCalendar {
  /** 0 = Sunday … 6 = Saturday. */
  workingWeekdays: number[];
  shiftsPerDay: number;
  hoursPerShift: number;
  /** ISO dates (YYYY-MM-DD) the plant is closed. */
  holidays: string[];
}

/** A printing cell (database: JSON in `cells.params`). */
export interface CellParams {
  key: string;
  name: string;
  envelopeMm: { x: number; y: number; z: number };
  extruderOutputKgPerH: number;
  beadWidthsMm: number[];
  layerHeightsMm: number[];
  defaultBeadWidthMm: number;
  defaultLayerHeightMm: number;
  speedMinMmS: number;
  speedMaxMmS: number;
  canPrintVertical: boolean;
  calendar: WorkingCalendar;
  /** Cell time while depositing, per hour (each cell bills its own rate; older rows fall back to the rate card's). */
  printRateCentsPerH?: number;
  /** Head acceleration along the path, mm/s² (corners and short segments slow down). */
  accelerationMmS2?: number;
  /** Screw diameter class of the extruder, mm (older rows: none stated). */
  screwMm?: number;
  /** Extruder output by material family, kg/h; a family not listed uses `extruderOutputKgPerH`. */
  outputKgPerHByFamily?: Partial<Record<MaterialFamily, number>>;
  /** Hottest melt the barrel and nozzle reach, °C; a material needing more is never run on the cell (older rows: no limit). */
  maxMeltTempC?: number;
  /** Dryer hoppers feeding the cell (older rows: none, no drying planned). */
  dryer?: DryerParams;
  /** Vertical printing along the long axis (older rows: horizontal only). */
  verticalPrint?: VerticalPrintParams;
}

/**
 * The bureau's rate card (database: JSON in `rate_cards.params`). Every constant the estimator
 * uses lives here, so nothing is hidden in the code. Money in integer cents.
 */
export interface RateCardParams {
  key: string;
  name: string;
  currency: string;
  /** Cell time while depositing, per hour. */
  printRateCentsPerH: number;
  /** Cell time while waiting for a layer to cool (dwell), per hour. */
  dwellRateCentsPerH: number;
  machiningRateCentsPerH: number;
  engineeringRateCentsPerH: number;
  /** Engineering hours per part (toolpaths, build plan, review). */
  engineeringHoursPerPart: number;
  /** Fixed setup fee per order line. */
  setupFeeCents: number;
  /** Purge material per build, kg. */
  purgeKg: number;
  /** Start-up scrap as a fraction of deposited mass (0.03 = 3 %). */
  startupScrapFraction: number;
  /** Roughing removal rate of the near-net stock, mm³ per minute. */
  roughingRemovalMm3PerMin: number;
  /** Finishing feed of the ball / bull-nose cutter, mm per minute. */
  finishingFeedMmPerMin: number;
  /** Radius of the finishing cutter's ball (or bull-nose corner), mm. */
  cutterRadiusMm: number;
  /** Target scallop (cusp) height left by the finishing stepover, mm. */
  targetScallopMm: number;
  toolChangeMinutes: number;
  toolChangeCount: number;
  /** Feed cutting an open mold's trim line, mm/min (absent: the engine's fallback). */
  trimFeedMmPerMin?: number;
  machiningSetupHours: number;
  /** Sealing coat on the net surface, per m². */
  sealingCoatCentsPerM2: number;
  /** Vacuum-integrity test of a mold, per part. */
  vacuumTestCents: number;
  crateBaseCents: number;
  crateCentsPerKg: number;
  crateCentsPerM3: number;
  /** Padding around the part inside the crate, mm per side. */
  cratePaddingMm: number;
  /** Freight when the card has no zone table (cards saved before freight by destination). */
  freightBaseCents: number;
  freightCentsPerKg: number;
  /** Freight by destination: the zone table, dimensional weight and the closed trailer's limits. */
  freight?: FreightRules;
  /** Margin on the subtotal, basis points. */
  marginBp: number;
  /** Tax on subtotal + margin, basis points. */
  taxBp: number;
  /** Share of the total paid up front, basis points (common practice: 5000 = half). */
  depositBp: number;
  quoteValidityDays: number;
  /** Default finish allowance, mm (common practice: 0.25 in = 6.35 mm). */
  defaultAllowanceMm: number;
  /** Cooling in the cell before the print can be lifted: base + per kg, capped (calendar hours). */
  coolingHoursBase: number;
  coolingHoursPerKg: number;
  coolingHoursMax: number;
  /** Working days after machining for finishing (options, sealing) and for inspection and packing. */
  finishingDays: number;
  inspectionDays: number;
  packingDays: number;
  /** Mass above which the lifting caution is shown, kg. */
  liftingCautionKg: number;
  /** Cell set-up before the first layer (bed, purge, program check), working hours on shifts. */
  printSetupHours?: number;
  /** Shells: net wall left after machining, mm; the printed wall holds this plus the allowance. */
  shellNetWallMm?: number;
  /** Shells: internal rib grid spacing, mm, and rib width in beads. */
  ribSpacingMm?: number;
  ribBeads?: number;
  /** Shells: solid layers in each top and bottom skin. */
  skinLayers?: number;
  /** Longest span a bead bridges unsupported, mm (a flat top over ribs wider than this needs support ribs). */
  maxBridgeMm?: number;
  /** The plant's time zone (an IANA zone id) in which shifts and dates are counted. */
  plantTimeZone?: string;
  /** Local hour the first shift starts. */
  shiftStartHour?: number;
  /** Dates (YYYY-MM-DD, plant time) the whole bureau is closed, added to each cell's own. */
  holidays?: string[];
  /** Joining a split part: set-up hours a joint, bonding hours per m² of joint face, band machined each side of a joint, mm. */
  joinSetupHours?: number;
  joinBondHoursPerM2?: number;
  joinBandMm?: number;
  /** The router's (machining) own calendar; the printing cell's when absent. */
  routerCalendar?: WorkingCalendar;
  /** Lifting a print off the bed and clearing the cell, working hours (the cell is held until then). */
  removalHours?: number;
  /** Expedited delivery: premium on set-up, machining and joining labour worked on extra shifts and weekends, basis points (5000 = time and a half). */
  overtimePremiumBp?: number;
  /** Expedited delivery: flat charge for finishing, inspection and packing on extra shifts and weekends. */
  expediteFeeCents?: number;
  /** Economy delivery: discount on the subtotal, basis points, for a date this many working days after standard. */
  economyDiscountBp?: number;
  economyExtraDays?: number;
  /** Economy is offered only while the cells' booked share of working hours up to its date stays at or under this, basis points. */
  economyMaxLoadBp?: number;
  /** Where the figures come from. */
  source: string;
}
