import type { Crate, FreightQuote, FreightRules } from "./freight";
/**
 * Shared plain-data types of the estimating engine. Pure TypeScript: no framework imports.
 * Units are in the names: Mm = millimetres, Kg = kilograms, S = seconds, Cents = integer money,
 * Bp = basis points (1/100 of a percent), C = degrees Celsius.
 */

/** A triangle soup read from a file, in millimetres once units are applied. */
export interface Mesh {
  /** 9 floats per triangle: x1 y1 z1 x2 y2 z2 x3 y3 z3. */
  positions: Float32Array;
  triangleCount: number;
  /** Optional: body (shell) index per triangle, when the file names bodies (3MF objects, STEP solids). */
  bodyOfTriangle?: Uint32Array;
  /** Optional: one name per body index. */
  bodyNames?: string[];
}

export type MeshFormat = "stl-binary" | "stl-ascii" | "obj" | "3mf" | "step" | "iges";
export type LengthUnit = "mm" | "in";

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

export type Axis = "x" | "y" | "z";

/** A build orientation: which axis of the file points up, and whether the two others swap in plan. */
export interface Orientation {
  up: Axis;
  /** When true the file's remaining axes are swapped to align with the cell's x and y. */
  swapped: boolean;
}

export interface CellFit {
  cell: string;
  cellName: string;
  /** Fits in the best allowed axis-aligned orientation. */
  fits: boolean;
  /** Smallest clearance over the three axes in that orientation, mm (negative = too big). */
  marginMm: number;
  bestOrientation: Orientation;
  buildHeightMm: number;
  /** Fits in the orientation chosen for the estimate. */
  fitsChosen: boolean;
  marginChosenMm: number;
  /** The part fits this cell only built vertically (layers across its length along the cell's long axis). */
  vertical?: boolean;
}

export interface SplitSuggestion {
  axis: Axis;
  pieces: number;
  pieceLengthMm: number;
  cell: string;
  marginMm: number;
  /** Each piece fits that cell built vertically. */
  vertical?: boolean;
}

export interface CostLine {
  key: string;
  label: string;
  quantity: number;
  unit: string;
  unitCents: number;
  amountCents: number;
}

export interface EstimateWarning {
  code: string;
  message: string;
}

/** The JSON the CLI prints and the API returns. Plain data only. */
export interface EstimateResult {
  kind: "estimate";
  fileName: string;
  format: MeshFormat;
  triangles: number;
  units: LengthUnit;
  unitsGuessed: boolean;
  unitsReason: string;
  /** STEP/IGES: the tessellation tolerance used, mm. */
  toleranceMm?: number;
  /** STEP/IGES: the file's unit and bodies (index, name, triangles, size, kept). */
  cad?: {
    toleranceMm: number;
    sourceUnit: string;
    bodies: { index: number; name: string; triangleCount: number; sizeMm: number[]; isKept: boolean }[];
  };
  bboxMm: [number, number, number];
  bboxMinMm: [number, number, number];
  volumeMm3: number;
  areaMm2: number;
  watertight: boolean;
  openEdges: number;
  nonManifoldEdges: number;
  inconsistentEdges: number;
  degenerateTriangles: number;
  shells: number;
  weldToleranceMm: number;
  /** ½ Σ edge length × signed exterior dihedral angle, mm (Steiner's M). */
  meanCurvatureIntegralMm: number;
  allowanceMm: number;
  nearNetVolumeMm3: number;
  allowanceVolumeMm3: number;
  /** Σ grown layer section areas × layer height before the sections are rescaled to the Steiner volume (see analyse.ts), for comparison. */
  slicedVolumeMm3: number;
  orientation: Orientation;
  /** "user": forced; "cost": the candidate search's pick ("min-height" in estimates made before the search). */
  orientationChosenBy: "user" | "min-height" | "cost";
  fits: CellFit[];
  fitsAny: boolean;
  split: SplitSuggestion | null;
  cell: string;
  beadWidthMm: number;
  layerHeightMm: number;
  shellWalls: number | null;
  speedMmS: number;
  layers: number;
  flaggedLayers: number;
  printHours: number;
  dwellHours: number;
  coolingHours: number;
  /** Per-layer series for a chart, downsampled to at most 2000 points (means per bucket, flagged if any). */
  layerChart: { zMm: number[]; timeS: number[]; dwellS: number[]; flagged: boolean[]; stride: number };
  material: {
    key: string;
    name: string;
    densityGPerCm3: number;
    glassTransitionC: number;
    maxServiceTempC: number;
    cteAlongPpmPerK: number;
    cteAcrossPpmPerK: number;
    minLayerTimeS: number;
    maxLayerTimeS: number;
  };
  depositedKg: number;
  purgeKg: number;
  scrapKg: number;
  massKg: number;
  /** Net (machined) part mass, kg: what is lifted at delivery. */
  partMassKg: number;
  liftingCaution: boolean;
  machining: {
    /** The face on the bed in the chosen build, mm², left as printed unless asked (older estimates: absent). */
    bedFaceMm2?: number;
    bedFaceFinished?: boolean;
    /** Router set-ups: 2 when the part is flipped to finish its bed face. */
    setups?: number;
    trimLengthMm?: number;
    trimHours?: number;
    roughingHours: number;
    finishingHours: number;
    toolChangeHours: number;
    setupHours: number;
    stepoverMm: number;
    scallopMm: number;
  };
  machiningHours: number;
  quantity: number;
  lines: CostLine[];
  subtotalCents: number;
  marginCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  balanceCents: number;
  /** The crate and its freight to the destination zone it was priced for (cards with a zone table). */
  crate?: Crate & { freight: FreightQuote };
  validUntil: string;
  schedule: {
    queueHours: number;
    printStart: string;
    printEnd: string;
    coolingEnd: string;
    machiningEnd: string;
    shipDate: string;
    /** Set-up on shifts before the first layer. */
    setupStart: string;
    /** The first charge goes into its dryer hopper; it is dry before printStart. */
    dryingStart: string;
    /** Printing runs on calendar time: deposition and dwell only, from printStart to printEnd. */
    printContinuous: true;
    timeZone: string;
  };
  shipDate: string;
  /** Delivery choices: `standard` (this estimate's own date and total), `expedite`, and `economy` where capacity allows. */
  leadTimes: LeadTime[];
  warnings: EstimateWarning[];
  cautions: string[];
  /** "priced": a printable plan inside the cooling window; "needs-review": the bureau's engineer quotes it (the figures are staff's indicative ones). */
  status: EstimateStatus;
  reviewReasons: ReviewReason[];
  printMode: BuildMode;
  /** Shell build of the chosen plan (null for a solid print). */
  shell: ShellPlanSummary | null;
  /** Mean laying speed over the whole path from segment lengths and acceleration, mm/s (speedMmS is the programmed peak). */
  meanSpeedMmS: number;
  /** Pellet drying of the chosen material on the chosen cell: hours before the first layer, the hopper, and the sustained feed it allows (null: the cell states no dryer). */
  drying: { hours: number; tempC: number; dryerKg: number; maxKgPerH: number } | null;
  /** Sustained deposition the plan is capped at, kg/h, what sets it, and the extruder's screw class. */
  feed: { kgPerH: number; limitedBy: "extruder" | "dryer"; extruderKgPerH: number; screwMm: number | null };
  /** Cell hourly print rate of the chosen cell, cents per hour. */
  printRateCentsPerH: number;
  /** Parts laid side by side in one build, and how many builds. */
  batch: { partsPerBuild: number; builds: number };
  /** The chosen candidate's search key and the best candidate of every other cell (cheapest first). */
  alternatives: EstimateAlternative[];
  /** What the search tried to bring layers inside the cooling window, in order. */
  remedies: RemedyTried[];
  /** How many candidates (cell × orientation × preset × print mode) were planned. */
  candidatesPlanned: number;
  /** A part no cell takes whole: each piece's own estimate (the top-level figures are their sums, plus the joining). */
  pieces?: PieceEstimate[];
  /** The joints of a part priced as pieces (the `joining` line bills `hours`). */
  joint?: { cuts: number; faceAreaMm2: number; contourMm: number; hours: number };
}

/** One piece of a split part, planned, priced (its own lines, before margin) and dated on its own. */
export interface PieceEstimate {
  index: number;
  axis: Axis;
  /** Where the piece starts and ends along the split axis (file coordinates, net), mm. */
  fromMm: number;
  toMm: number;
  cell: string;
  cellName: string;
  printMode: BuildMode;
  orientation: Orientation;
  beadWidthMm: number;
  layerHeightMm: number;
  layers: number;
  flaggedLayers: number;
  printHours: number;
  dwellHours: number;
  coolingHours: number;
  /** Cell set-up before its first layer, working hours. */
  setupHours: number;
  depositedKg: number;
  massKg: number;
  partMassKg: number;
  machiningHours: number;
  drying: EstimateResult["drying"];
  schedule: { setupStart: string; dryingStart: string; printStart: string; printEnd: string; coolingEnd: string; machiningStart: string; machiningEnd: string };
  lines: CostLine[];
  subtotalCents: number;
  status: EstimateStatus;
}

export type EstimateStatus = "priced" | "needs-review";
/** How the part is filled: a shell (walls, ribs, skins) or solid. */
export type PrintMode = "shell" | "solid";
/** The build as reported: the fill, and "vertical-" when the layers run across a long part's length on a cell that prints vertically. */
export type BuildMode = PrintMode | "vertical-shell" | "vertical-solid";

export interface ReviewReason {
  code: string;
  message: string;
}

export interface RemedyTried {
  code: string;
  tried: string;
  result: string;
}

export interface ShellPlanSummary {
  walls: number;
  wallThicknessMm: number;
  ribSpacingMm: number;
  ribWidthMm: number;
  skinLayers: number;
  /** How flat tops over the ribs close: "direct" (the bead bridges the rib spacing) or "support-ribs". */
  bridging: "direct" | "support-ribs";
  /** True when the wall count came from the allowance and bead (not set by hand). */
  wallsFromAllowance: boolean;
}

export interface EstimateAlternative {
  cell: string;
  cellName: string;
  orientation: Orientation;
  beadWidthMm: number;
  layerHeightMm: number;
  printMode: BuildMode;
  shellWalls: number | null;
  printHours: number;
  dwellHours: number;
  massKg: number;
  flaggedLayers: number;
  totalCents: number;
  shipDate: string;
  status: EstimateStatus;
  /** Why this one was not chosen ("" for the chosen one). */
  whyNot: string;
}

export type LeadTimeKey = "standard" | "expedite" | "economy";

/** One delivery choice: its ship date (plant's calendar) and its total. */
export interface LeadTime {
  key: LeadTimeKey;
  shipDate: string;
  totalCents: number;
  /** Added to (expedite) or taken from (economy, negative) the standard subtotal before margin and tax. */
  adjustmentCents: number;
  /** Expedite: booked jobs it goes ahead of (each still meets its own promised date). */
  jumped?: number;
}
