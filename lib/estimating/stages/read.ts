import { EstimateInputError } from "../errors";
import { readModel, type ReadModelResult } from "../read-model";
import type { AnalyseInput } from "../analyse";
import type { IndexedMesh } from "../indexed";
import type { EstimateWarning, MaterialParams, Mesh, PrintMode } from "../types";

/** The options of one run, checked and with the catalogue's defaults filled in. */
export interface ResolvedOptions {
  material: MaterialParams;
  allowanceMm: number;
  /** Wall count set by hand (shell only); null = from the allowance and the bead. */
  shellWalls: number | null;
  quantity: number;
  printMode: PrintMode;
}

export function bad(code: string, message: string): never {
  throw new EstimateInputError(code, message);
}

/** Checks the options against the catalogue (bad ones throw an EstimateInputError). */
export function resolveOptions(input: AnalyseInput): ResolvedOptions {
  const { options: o, catalogue: cat } = input;
  const material = o.materialKey ? cat.materials.find((m) => m.key === o.materialKey) : cat.materials[0];
  if (!material) bad("option:material", `There is no material "${String(o.materialKey).slice(0, 40)}" in the catalogue.`);
  if (o.cellKey && !cat.cells.some((c) => c.key === o.cellKey)) bad("option:cell", `There is no printing cell "${o.cellKey.slice(0, 40)}".`);
  if (cat.cells.length === 0) bad("option:cell", "The catalogue has no printing cells.");
  const t = o.allowanceMm ?? cat.rateCard.defaultAllowanceMm;
  if (!Number.isFinite(t) || t < 0 || t > 200) bad("option:allowance", "The finish allowance must be between 0 and 200 mm.");
  const walls = o.shellWalls ?? null;
  if (walls !== null && (!Number.isInteger(walls) || walls < 1 || walls > 50)) bad("option:shell-walls", "Shell walls must be a whole number from 1 to 50.");
  const quantity = o.quantity ?? 1;
  if (!Number.isInteger(quantity) || quantity < 1 || quantity > 1000) bad("option:quantity", "The quantity must be a whole number from 1 to 1000.");
  if (o.printMode !== undefined && o.printMode !== "shell" && o.printMode !== "solid") bad("option:print-mode", "The print mode must be shell or solid.");
  const printMode: PrintMode = o.printMode ?? "shell";
  return { material, allowanceMm: t, shellWalls: printMode === "shell" ? walls : null, quantity, printMode };
}

/** Stage 1: the file's triangles in millimetres (units guessed when not given). */
export async function readStage(input: AnalyseInput, warnings: EstimateWarning[]): Promise<ReadModelResult<Mesh | IndexedMesh>> {
  const o = input.options;
  const read = input.read ?? await readModel(input.bytes ?? new Uint8Array(0), input.fileName, { units: o.units, toleranceMm: o.toleranceMm, bodies: o.bodies });
  if (read.unitsGuessed) warnings.push({ code: "units-guessed", message: read.unitsReason });
  return read;
}
