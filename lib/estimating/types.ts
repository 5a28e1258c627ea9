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

export type * from "./catalogue-types";
export type * from "./result-types";
