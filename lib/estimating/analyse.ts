import { steinerVolume } from "./grow";
import { toIndexed, type IndexedMesh } from "./indexed";
import { bounds, type Bounds } from "./measure";
import type { SliceAhead, SliceJob } from "./slice-ahead";
import type { Sections } from "./slice";
import { candidatePairs, finestLayerOf } from "./stages/search-space";
import { chooseStage } from "./stages/choose";
import { boxSizes, measureStage } from "./stages/measure";
import { fineSliceJob } from "./stages/slice";
import { readStage, resolveOptions } from "./stages/read";
import { planPieces } from "./stages/pieces";
import { asPieces } from "./stages/as-pieces";
import { estimateResult } from "./stages/result";
import { fitStage } from "./stages/fit";
import { noticesFor } from "./stages/notices";
import { materialWarnings } from "./warnings";
import type { Axis, EstimateResult, EstimateWarning } from "./types";

import type { AnalyseInput, ProgressFn } from "./analyse-input";

export type { AnalyseInput, AnalyseOptions, ProgressFn } from "./analyse-input";


export { SHELL_FALLBACKS } from "./stages/fit";

const AXIS_INDEX = { x: 0, y: 1, z: 2 } as const;

/**
 * The whole estimate of one part, stage by stage (`stages/`): read, measure, choose (the
 * candidate search, which slices, plans, prices and dates each candidate), then the result.
 * Pure: every input is passed in, `now` included.
 */
export async function analyse(input: AnalyseInput, onProgress: ProgressFn = () => {}): Promise<EstimateResult> {
  const { options: o, catalogue: cat } = input;
  const card = cat.rateCard;
  const warnings: EstimateWarning[] = [];
  const cautions: string[] = [];
  const { material, allowanceMm: t, shellWalls: wallsOverride, quantity, printMode } = resolveOptions(input);

  onProgress(0.02, "reading");
  const read = await readStage(input, warnings);
  // the distinct corners and three indices a triangle (a streamed file arrives so already)
  const mesh = toIndexed(read.mesh);
  const box = bounds(mesh.vertices);
  // what the search may use; a bad option is reported in its turn, after the mesh's own faults
  let fit: ReturnType<typeof fitStage> | undefined, fitError: unknown;
  try { fit = fitStage(input, material); } catch (e) { fitError = e; }
  // the fine slicing along each up axis the search will plan, on the slicing helper while this thread measures
  const ahead = input.sliceAhead && fit ? sliceAhead(input.sliceAhead, mesh, box, fit, o.cellKey, t) : null;

  onProgress(0.25, "measuring");
  const ms = measureStage(mesh, t, o.weldToleranceMm, warnings, box);
  const { m } = ms;
  const volume = ms.volumeMm3, M = ms.meanCurvatureMm;
  const nearNet = steinerVolume(volume, m.areaMm2, M, t);

  onProgress(0.4, "fitting");
  if (!fit) throw fitError;
  const { rules, plant, cells, ledger, orientation } = fit;
  onProgress(0.5, "slicing");
  const fineSlices = ahead?.();
  const searchInput = {
    mesh, ms, cells, material, card, rules, plant, allowanceMm: t, quantity, printMode, wallsOverride,
    cellKey: o.cellKey, orientation, ledger, now: input.now, fineSlices,
    priceOptions: { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest, freightZone: o.freightZone }, machiningAsked: { finishBedFace: o.finishBedFace, trimLines: o.trimLines },
  };
  const choice = chooseStage(searchInput, warnings);
  onProgress(0.75, "planning");
  onProgress(0.9, "pricing");
  const liftingCaution = noticesFor({ choice, material, materials: cat.materials, cells, options: o, quantity, card, netSize: ms.netSize }, warnings, cautions);
  const { split, chosen: { pricing: pr } } = choice;

  // A part no cell takes whole: each piece its own estimate, summed, with the joining
  const fineH = finestLayerOf(cells);
  const pieces = split && !o.orientation ? planPieces(searchInput, o.cellKey ? cells.filter((x) => x.key === o.cellKey) : cells, split, fineH, pr) : null;

  onProgress(1, "done");
  const result = estimateResult({ input, read, ms, nearNet, choice, material, card, quantity, plant, ledger, warnings, cautions, allowanceMm: t, liftingCaution });
  if (!pieces) return result;
  // the expansion across the beads follows the pieces' build (each along its own length)
  const p0 = pieces.pieces[0]!, up0 = { x: 0, y: 1, z: 2 }[p0.chosen.orientation.up];
  const pieceSpans = { acrossBeadMm: p0.ms.netSize[up0]!, alongBeadMm: Math.max(...p0.ms.netSize.filter((_, i) => i !== up0)), vertical: p0.chosen.vertical };
  const across = materialWarnings(material, { cureTempC: o.cureTempC, partCtePpmPerK: o.partCtePpmPerK }, pieceSpans).filter((w) => w.code === "material-cte-across");
  const piecewise = { ...result, warnings: [...result.warnings.filter((w) => w.code !== "material-cte-across"), ...across] };
  return asPieces(piecewise, pieces, card, material, quantity, ledger);
}

/**
 * Starts the fine slicing of every up axis the search will plan (the pairs need only the grown
 * box) on the slicing helper; the function returned gives the sections by axis, this thread
 * cutting whatever the helper has not done. Null when the helper does not take the work.
 */
function sliceAhead(helper: SliceAhead, mesh: IndexedMesh, box: Bounds, fit: ReturnType<typeof fitStage>, cellKey: string | undefined, t: number): (() => Map<Axis, Sections>) | null {
  const { grownSize } = boxSizes(box, t);
  const h = finestLayerOf(fit.cells);
  const jobs: SliceJob[] = [];
  for (const { orientation: { up } } of candidatePairs(grownSize, fit.cells, cellKey, fit.orientation)) {
    const ai = AXIS_INDEX[up];
    // a part too tall to plan is refused by the search in its turn
    const job = jobs.some((j) => j.up === up) ? null : fineSliceJob(box.min[ai], box.max[ai], up, h, t);
    if (job) jobs.push(job);
  }
  const run = helper.start(mesh, jobs);
  if (!run) return null;
  return () => {
    const cut = run.finish();
    return new Map(jobs.map((j, i) => [j.up, cut[i]!]));
  };
}
