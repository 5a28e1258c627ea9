import { EstimateInputError } from "../errors";
import type { Mesh } from "../types";
import { scanIges } from "./step-iges";
import { meanSideMm, toMesh, type StepBody } from "./step-mesh";
import { dropOcct, loadOcct, occtHeapBytes, occtLoadMs, withKernelLog, type OcctModule, type OcctParams, type OcctResult } from "./step-occt";
import { stepInstanceCount } from "./step-instances";
import { scanStep } from "./step-scan";
import { stepLengthUnits } from "./step-units";

/**
 * STEP (ISO 10303-21; AP203, AP214, AP242) and IGES reader: the file is checked byte by byte
 * (step-scan.ts, step-iges.ts), then tessellated by the OpenCascade kernel (npm occt-import-js)
 * into the engine's triangle soup, in millimetres from the file's own units.
 *
 * Tessellation tolerance (linear deflection: the largest distance between a facet and the exact
 * surface). The mesh is inscribed in curved faces, so it loses volume there: about ⅔·d per unit
 * of curved area (a circle's chord segments lose ⅔·sagitta·length; common geometry). For a compact
 * part of mean side L at most ~6L² of its area is curved, so the relative volume error is at most
 * about 4·d/L. d = 2e-4·L bounds it near 0.1 %; measured on the shipped test models it was
 * 0.005–0.05 % (rounded cube, cone, CAx-IF parts: see step.test.ts), at roughly twice the
 * kernel's default triangle count. L is the mean side of the bounding box, the size the kernel's
 * own ratio mode uses, so one kernel pass gives the part-size-driven tolerance. It is clamped to
 * [0.001, 0.5] mm: the upper bound keeps the chord error of multi-metre parts well inside a
 * finish allowance of a few mm (the mesh lies inside convex faces, so a coarse one would
 * under-size the near-net shape); a clamped case costs a second kernel pass with the absolute
 * value. The angular deflection of 0.2 rad (≈ 31 segments a circle) keeps small holes and fillets,
 * which the linear bound alone leaves coarse, within about 0.7 % of their own small volume.
 */
export const TOLERANCE_RATIO = 2e-4;
export const MIN_TOLERANCE_MM = 0.001;
export const MAX_TOLERANCE_MM = 0.5;
export const ANGULAR_DEFLECTION_RAD = 0.2;
/** Largest file accepted, bytes. The kernel's WASM heap is capped at 2 GiB by its build; a
 * synthetic 9.6 MB STEP assembly grew it by about 4.4 MB per MB of file (lib/estimating/bench-step.ts
 * --copies 500), so 150 MB stays near 0.7 GB of heap. Time, not memory, is the tighter bound on
 * big assemblies (about 70 ms a body there): the worker pool's time limit covers it. */
export const MAX_CAD_FILE_BYTES = 150 * 1024 * 1024;

export interface ReadStepOptions {
  format: "step" | "iges";
  /** Linear deflection, mm; when absent it is chosen from the part size (see above). */
  toleranceMm?: number;
  /** Indices (into `bodyNames`) of the bodies to keep; all when absent. */
  bodies?: number[];
  /** Override of MAX_CAD_FILE_BYTES. */
  maxBytes?: number;
}

export interface ReadStepResult {
  /** Kept bodies only; `mesh.bodyNames[mesh.bodyOfTriangle[t]]` names triangle t's body. */
  mesh: Mesh;
  /** Every body of the file, by body index (the numbers `opts.bodies` takes). */
  bodyNames: string[];
  /** Per body of the file: name, triangles, size and whether it was kept — for a body picker. */
  bodies: StepBody[];
  /** File body index of each kept body, in the order of `mesh.bodyNames`. */
  keptBodies: number[];
  /** Linear deflection used, mm (nominal: the kernel measures the box it scales by itself). */
  toleranceMm: number;
  angularDeflectionRad: number;
  /** The file's declared length unit ("mm", "in", "m", …, "unknown"); several joined by "+". */
  sourceUnit: string;
  /** Size of the (first) source unit in mm; NaN when the file declares none (mm assumed). */
  sourceMmPerUnit: number;
  stats: { moduleLoadMs: number; kernelMs: number; kernelPasses: number; wasmHeapBytes: number };
}

function optionError(message: string): never {
  throw new EstimateInputError("cad:bad-option", message);
}

/** Kernel diagnostics that mean geometry was dropped (seen from occt-import-js 0.0.23). */
const KERNEL_ERROR = /\bERR\b|Fails Count|Unresolved Reference|Incorrect Syntax/i;

function runKernel(occt: OcctModule, bytes: Uint8Array, format: "step" | "iges", params: OcctParams): OcctResult {
  const label = format === "step" ? "STEP" : "IGES";
  let out: { value: OcctResult; log: string[] };
  try {
    out = withKernelLog(() => (format === "step" ? occt.ReadStepFile(bytes, params) : occt.ReadIgesFile(bytes, params)));
  } catch {
    dropOcct();
    throw new EstimateInputError(`${format}:kernel-failed`, `The CAD kernel failed on this ${label} file (it ran out of memory or hit an internal error); try a simpler export or fewer bodies.`);
  }
  const problem = out.log.map((l) => l.replace(/\*+/g, "").trim()).find((l) => KERNEL_ERROR.test(l));
  if (problem) throw new EstimateInputError(`${format}:kernel-error`, `The ${label} file has errors the CAD kernel could not resolve ("${problem.slice(0, 160)}"); re-export it from the CAD system.`);
  if (!out.value?.success) {
    const said = out.log.map((l) => l.replace(/\*+/g, "").trim()).filter((l) => l && !/^Total number of loaded entities/i.test(l));
    // A file that parses cleanly but yields nothing holds no shape (only points, curves, product data).
    if (said.length === 0) throw new EstimateInputError(`${format}:no-shapes`, `The CAD kernel found no shape to tessellate in this ${label} file (it may carry only points, curves, drawing or product data).`);
    throw new EstimateInputError(`${format}:unreadable`, `The CAD kernel could not read this ${label} file ("${said[0]!.slice(0, 160)}").`);
  }
  return out.value;
}

/**
 * Read a STEP or IGES file into the engine's mesh, in mm. Bodies are the parts of the file's
 * product tree (assembly instances expanded); `opts.bodies` keeps a subset. Throws
 * EstimateInputError naming the problem for every file it cannot use.
 */
export async function readStepOrIges(bytes: Uint8Array, opts: ReadStepOptions): Promise<ReadStepResult> {
  const { format } = opts;
  if (format !== "step" && format !== "iges") optionError(`Unknown CAD format "${String(format)}".`);
  const tol = opts.toleranceMm;
  if (tol !== undefined && !(Number.isFinite(tol) && tol >= 1e-4 && tol <= 100)) optionError("The tessellation tolerance must be between 0.0001 and 100 mm.");
  if (opts.bodies && !opts.bodies.every((b) => Number.isInteger(b) && b >= 0)) optionError("Body indices must be whole numbers from 0.");
  const maxBytes = opts.maxBytes ?? MAX_CAD_FILE_BYTES;
  const label = format === "step" ? "STEP" : "IGES";
  if (bytes.length > maxBytes) throw new EstimateInputError(`${format}:too-large`, `The ${label} file is ${(bytes.length / 2 ** 20).toFixed(0)} MB, more than the ${(maxBytes / 2 ** 20).toFixed(0)} MB accepted.`);

  let units: { symbol: string; mmPerUnit: number }[];
  if (format === "step") {
    const layout = scanStep(bytes);
    // Before the kernel: an assembly whose nested copies expand past the limit is refused here.
    stepInstanceCount(bytes, layout);
    units = stepLengthUnits(bytes, layout);
  } else units = [scanIges(bytes).unit];
  units = units.filter((u) => u.symbol !== "unknown");

  const occt = await loadOcct();
  const base: OcctParams = { linearUnit: "millimeter", angularDeflection: ANGULAR_DEFLECTION_RAD };
  const t0 = performance.now();
  let passes = 1;
  let toleranceMm: number;
  let result: OcctResult;
  if (tol !== undefined) {
    toleranceMm = tol;
    result = runKernel(occt, bytes, format, { ...base, linearDeflectionType: "absolute_value", linearDeflection: tol });
  } else {
    result = runKernel(occt, bytes, format, { ...base, linearDeflectionType: "bounding_box_ratio", linearDeflection: TOLERANCE_RATIO });
    const nominal = TOLERANCE_RATIO * meanSideMm(result);
    toleranceMm = Math.min(MAX_TOLERANCE_MM, Math.max(MIN_TOLERANCE_MM, nominal));
    if (toleranceMm !== nominal && nominal > 0) {
      passes = 2;
      result = runKernel(occt, bytes, format, { ...base, linearDeflectionType: "absolute_value", linearDeflection: toleranceMm });
    }
  }
  const kernelMs = performance.now() - t0;

  const bodyCount = result.meshes?.length ?? 0;
  const wanted = opts.bodies ? new Set(opts.bodies) : null;
  if (wanted && bodyCount > 0) {
    const outside = [...wanted].find((b) => b >= bodyCount);
    if (outside !== undefined) throw new EstimateInputError(`${format}:body-index`, `Body ${outside} does not exist: the ${label} file has ${bodyCount} bodies (0 to ${bodyCount - 1}).`);
  }
  const { mesh, bodies, bodyNames, keptIndices } = toMesh(result, format, wanted ? (i) => wanted.has(i) : null);
  return {
    mesh,
    bodyNames,
    bodies,
    keptBodies: keptIndices,
    toleranceMm,
    angularDeflectionRad: ANGULAR_DEFLECTION_RAD,
    sourceUnit: units.length ? units.map((u) => u.symbol).join("+") : "unknown",
    sourceMmPerUnit: units[0]?.mmPerUnit ?? Number.NaN,
    stats: { moduleLoadMs: occtLoadMs() ?? 0, kernelMs, kernelPasses: passes, wasmHeapBytes: occtHeapBytes(occt) },
  };
}

/** Load the kernel now (a worker calls this at start so the first file does not pay for it). */
export async function warmStepKernel(): Promise<{ moduleLoadMs: number; wasmHeapBytes: number }> {
  const occt = await loadOcct();
  return { moduleLoadMs: occtLoadMs() ?? 0, wasmHeapBytes: occtHeapBytes(occt) };
}
