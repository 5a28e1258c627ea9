import { steinerVolume } from "./grow";
import { toIndexed } from "./indexed";
import { chooseStage } from "./stages/choose";
import { measureStage } from "./stages/measure";
import { readStage, resolveOptions } from "./stages/read";
import { planPieces } from "./stages/pieces";
import { asPieces } from "./stages/as-pieces";
import { estimateResult } from "./stages/result";
import { fitStage } from "./stages/fit";
import { noticesFor } from "./stages/notices";
import { materialWarnings } from "./warnings";
import type { EstimateResult, EstimateWarning } from "./types";

import type { AnalyseInput, ProgressFn } from "./analyse-input";

export type { AnalyseInput, AnalyseOptions, ProgressFn } from "./analyse-input";


export { SHELL_FALLBACKS } from "./stages/fit";

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

  onProgress(0.25, "measuring");
  const ms = measureStage(mesh, t, o.weldToleranceMm, warnings);
  const { m } = ms;
  const volume = ms.volumeMm3, M = ms.meanCurvatureMm;
  const nearNet = steinerVolume(volume, m.areaMm2, M, t);

  onProgress(0.4, "fitting");
  const { rules, plant, cells, ledger, orientation } = fitStage(input, material);
  onProgress(0.5, "slicing");
  const searchInput = {
    mesh, ms, cells, material, card, rules, plant, allowanceMm: t, quantity, printMode, wallsOverride,
    cellKey: o.cellKey, orientation, ledger, now: input.now,
    priceOptions: { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest, freightZone: o.freightZone }, machiningAsked: { finishBedFace: o.finishBedFace, trimLines: o.trimLines },
  };
  const choice = chooseStage(searchInput, warnings);
  onProgress(0.75, "planning");
  onProgress(0.9, "pricing");
  const liftingCaution = noticesFor({ choice, material, materials: cat.materials, cells, options: o, quantity, card, netSize: ms.netSize }, warnings, cautions);
  const { split, chosen: { pricing: pr } } = choice;

  // A part no cell takes whole: each piece its own estimate, summed, with the joining
  const fineH = Math.min(...cells.flatMap((x) => [...x.layerHeightsMm, x.defaultLayerHeightMm]).filter((v) => v > 0));
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
