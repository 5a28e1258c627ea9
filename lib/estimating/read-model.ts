import { EstimateInputError } from "./errors";
import { detectStl, readAsciiStl, readBinaryStl } from "./readers/stl";
import { readObj } from "./readers/obj";
import { read3mf, UNIT_MM } from "./readers/threemf";
import { isIndexed, scaleIndexed, type IndexedMesh } from "./indexed";
import type { LengthUnit, Mesh, MeshFormat } from "./types";

export interface ReadModelResult<M extends Mesh | IndexedMesh = Mesh> {
  /** A triangle soup, or (a binary STL streamed from disk by `readModelFile`) the indexed mesh. */
  mesh: M;
  format: MeshFormat;
  units: LengthUnit;
  unitsGuessed: boolean;
  /** One sentence saying how the units were decided. */
  unitsReason: string;
  /** Unit word the file itself declared (3MF, STEP), or null. */
  declaredUnit: string | null;
  /** STEP/IGES only: tessellation tolerance used and the bodies of the file. */
  cad?: CadInfo;
}

export interface CadInfo {
  toleranceMm: number;
  sourceUnit: string;
  bodies: { index: number; name: string; triangleCount: number; sizeMm: number[]; isKept: boolean }[];
}

/**
 * Largest extent (in file units) below which an unlabelled mesh is taken to be in inches.
 * Why: the bureau's smallest cell lays 10–15 mm beads, so a part under 150 mm is not a job it
 * takes, while 150 in (3.8 m) is an ordinary hull plug or layup tool. A file of 150 or more units
 * is read as millimetres. The caller shows the guess and lets the user force the units.
 */
export const INCH_GUESS_BELOW_UNITS = 150;

export function extension(fileName: string): string {
  const dot = fileName.lastIndexOf(".");
  return dot >= 0 ? fileName.slice(dot + 1).toLowerCase() : "";
}

function largestExtent(p: Float32Array): number {
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  for (let i = 0; i < p.length; i += 3) {
    const x = p[i]!, y = p[i + 1]!, z = p[i + 2]!;
    if (x < x0) x0 = x; if (x > x1) x1 = x;
    if (y < y0) y0 = y; if (y > y1) y1 = y;
    if (z < z0) z0 = z; if (z > z1) z1 = z;
  }
  return Math.max(x1 - x0, y1 - y0, z1 - z0);
}

function scale(p: Float32Array, s: number): void {
  if (s === 1) return;
  for (let i = 0; i < p.length; i++) p[i] = p[i]! * s;
}

/**
 * Reads a model file into a triangle soup in millimetres. Format from the extension, STL
 * flavour from the content. STEP/IGES are tessellated by `./readers/step` (loaded on demand,
 * it is large). Bad files throw `EstimateInputError`.
 */
export async function readModel(
  bytes: Uint8Array,
  fileName: string,
  opts: { units?: LengthUnit; toleranceMm?: number; bodies?: number[] } = {},
): Promise<ReadModelResult> {
  const ext = extension(fileName);
  if (bytes.length === 0) throw new EstimateInputError("file:empty", "The file is empty.");
  let mesh: Mesh;
  let format: MeshFormat;
  if (ext === "step" || ext === "stp" || ext === "igs" || ext === "iges") {
    format = ext === "igs" || ext === "iges" ? "iges" : "step";
    const { readStepOrIges } = await import("./readers/step");
    const r = await readStepOrIges(bytes, { format, toleranceMm: opts.toleranceMm, bodies: opts.bodies });
    // The file's own units win; the mesh is already in millimetres. Inches are reported as
    // inches so the portal shows the client the unit their CAD system used.
    const units: LengthUnit = r.sourceUnit === "in" ? "in" : "mm";
    const bodies = r.bodies.map((b) => ({ index: b.index, name: b.name, triangleCount: b.triangleCount, sizeMm: [...b.sizeMm], isKept: b.isKept }));
    return {
      mesh: r.mesh,
      format,
      units,
      unitsGuessed: false,
      unitsReason: `The ${format.toUpperCase()} file declares its length unit (${r.sourceUnit}); it was tessellated in millimetres at a tolerance of ${round(r.toleranceMm * 1000) / 1000} mm.`,
      declaredUnit: r.sourceUnit,
      cad: { toleranceMm: r.toleranceMm, sourceUnit: r.sourceUnit, bodies },
    };
  }
  if (ext === "3mf") {
    const r = read3mf(bytes);
    const units: LengthUnit = r.unit === "inch" || r.unit === "foot" ? "in" : "mm";
    return { mesh: r.mesh, format: "3mf", units, unitsGuessed: false, unitsReason: `The 3MF model declares unit="${r.unit}" (1 unit = ${UNIT_MM[r.unit]} mm).`, declaredUnit: r.unit };
  }
  if (ext === "obj") {
    mesh = readObj(bytes);
    format = "obj";
  } else if (ext === "stl" || ext === "") {
    format = detectStl(bytes);
    mesh = format === "stl-binary" ? readBinaryStl(bytes) : readAsciiStl(bytes);
  } else {
    throw new EstimateInputError("file:unsupported", `Files of type ".${ext.slice(0, 10)}" are not supported; send STL, OBJ, 3MF, STEP or IGES.`);
  }
  return withUnits(mesh, format, opts.units);
}

/**
 * A unitless mesh (STL, OBJ) in millimetres: the user's units when given, else guessed from its
 * size (`INCH_GUESS_BELOW_UNITS`); inches are scaled in place (an indexed mesh by `scaleIndexed`,
 * which keeps it the indexed form of the scaled soup).
 */
export function withUnits<M extends Mesh | IndexedMesh>(mesh: M, format: MeshFormat, given: LengthUnit | undefined): ReadModelResult<M> {
  let units: LengthUnit;
  let unitsGuessed: boolean;
  let unitsReason: string;
  if (given) {
    units = given;
    unitsGuessed = false;
    unitsReason = `Units set to ${units} by the user.`;
  } else {
    const ext0 = largestExtent(isIndexed(mesh) ? mesh.vertices : mesh.positions);
    units = ext0 < INCH_GUESS_BELOW_UNITS ? "in" : "mm";
    unitsGuessed = true;
    unitsReason = units === "in"
      ? `The file carries no units; its largest extent is ${round(ext0)} units, under ${INCH_GUESS_BELOW_UNITS}, too small for a part in millimetres, so inches are assumed. Please confirm.`
      : `The file carries no units; its largest extent is ${round(ext0)} units, so millimetres are assumed. Please confirm.`;
  }
  let out: M = mesh;
  if (units === "in") {
    if (isIndexed(mesh)) out = scaleIndexed(mesh, 25.4) as M;
    else scale(mesh.positions, 25.4);
  }
  return { mesh: out, format, units, unitsGuessed, unitsReason, declaredUnit: null };
}

function round(v: number): number {
  return Math.round(v * 100) / 100;
}
