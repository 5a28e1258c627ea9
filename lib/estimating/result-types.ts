/**
 * The estimate's plain-data result: what the CLI prints and the API returns, per piece, the
 * alternatives and the delivery choices. Same units-in-names rule as ./types.ts.
 */
import type { Pricing } from "./pricing";
import type { Axis, CellFit, CostLine, EstimateWarning, LengthUnit, MeshFormat, Orientation, SplitSuggestion } from "./types";

/** The JSON the CLI prints and the API returns. Plain data only. */
export interface EstimateResult extends Pricing {
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
  // lines, subtotal, margin, tax, total, deposit, balance and the crate: the price (Pricing, ../pricing)
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
