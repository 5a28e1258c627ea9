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
}
