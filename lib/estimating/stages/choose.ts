import type { IndexedMesh } from "../indexed";
import { r2 } from "../round";
import { steinerVolume } from "../grow";
import { planMachining, type MachiningPlan } from "../machining";
import { fitCells, orientedSize, suggestSplit } from "../orient";
import type { Pricing } from "../pricing";
import type { Ledger } from "../ledger";
import type { Plant } from "../schedule";
import type {
  Axis, CellFit, CellParams, EstimateAlternative, EstimateStatus, EstimateWarning, MaterialParams, Orientation,
  PrintMode, RateCardParams, RemedyTried, ReviewReason, SplitSuggestion,
} from "../types";
import type { Sections } from "../slice";
import type { Measured } from "./measure";
import { planStage, wallsForAllowance, type BuildPlan, type ShellRules } from "./plan";
import { priceStage } from "./price";
import { scheduleStage, type PlacedSchedule } from "./schedule";
import { sectionsAt, sliceStage, type GrownSections } from "./slice";
import { alternative, compareCandidates, money } from "./candidates";
import { candidatePairs, finestLayerOf, presetsOf, sideBySide } from "./search-space";



export interface SearchInput {
  mesh: IndexedMesh;
  ms: Measured;
  cells: CellParams[];
  material: MaterialParams;
  card: RateCardParams;
  rules: ShellRules;
  plant: Plant;
  allowanceMm: number;
  quantity: number;
  printMode: PrintMode;
  wallsOverride: number | null;
  cellKey?: string;
  orientation?: Orientation;
  /** Fine sections cut already, by up axis (on the slicing helper, ../slice-ahead); the rest are cut when needed. */
  fineSlices?: Map<Axis, Sections>;
  /** The booked work on the cells and the router (with `now`), which each candidate is placed around. */
  ledger: Ledger;
  now: Date;
  priceOptions: { sealingCoat?: boolean; vacuumTest?: boolean; freightZone?: string | null };
  /** What the client asked machined beyond the net surface: the bed face (a flip), an open mold's trim line. */
  machiningAsked: { finishBedFace?: boolean; trimLines?: boolean };
}

/** Machining of a part (its net volume, surface and Steiner M) in one build, as asked. */
export function machiningOf(s: Pick<SearchInput, "card" | "allowanceMm" | "machiningAsked">, ms: Pick<Measured, "volumeMm3" | "meanCurvatureMm"> & { m: { areaMm2: number } }, sections: GrownSections): MachiningPlan {
  const nearNet = steinerVolume(ms.volumeMm3, ms.m.areaMm2, ms.meanCurvatureMm, s.allowanceMm);
  return planMachining(nearNet - ms.volumeMm3, ms.m.areaMm2, s.card, {
    bedFaceMm2: sections.bedFaceMm2, allowanceMm: s.allowanceMm, finishBedFace: s.machiningAsked.finishBedFace,
    trimLengthMm: s.machiningAsked.trimLines ? sections.outlineMm : 0,
  });
}

export interface Candidate {
  cell: CellParams;
  orientation: Orientation;
  fitsCell: boolean;
  sections: GrownSections;
  bp: BuildPlan;
  pricing: Pricing;
  schedule: PlacedSchedule;
  status: EstimateStatus;
  reasons: ReviewReason[];
  /** Built vertically: layers across the part's length along the cell's long axis (`cell` is then the vertical envelope). */
  vertical: boolean;
}

export interface Choice {
  chosen: Candidate;
  orientationChosenBy: "user" | "cost";
  fits: CellFit[];
  fitsAny: boolean;
  split: SplitSuggestion | null;
  alternatives: EstimateAlternative[];
  remedies: RemedyTried[];
  reviewReasons: ReviewReason[];
  candidatesPlanned: number;
}

/** What a candidate is planned for: the whole part, or one piece of a split part. */
export interface PartContext {
  ms: Measured;
  /** Machining of this part in a candidate's build (its sections). */
  machiningFor: (sections: GrownSections, cell: CellParams) => MachiningPlan;
}

/** One candidate planned, priced and dated. */
export function evaluateCandidate(
  s: SearchInput, part: PartContext, cell: CellParams, orientation: Orientation, fits: boolean, sections: GrownSections,
  beadWidthMm: number, printMode: PrintMode, partsPerBuild: number, vertical: boolean,
): Candidate {
  const { material, card } = s;
  const ms = part.ms;
  const bp = planStage(ms, { cell, beadWidthMm, sections, printMode, wallsOverride: printMode === "shell" ? s.wallsOverride : null, partsPerBuild }, material, card, s.rules, s.allowanceMm, s.quantity, part.machiningFor(sections, cell));
  const pricing = priceStage(ms, bp, cell, material, card, s.quantity, s.priceOptions);
  const schedule = scheduleStage(s.ledger, cell, card, bp, s.quantity);
  const reasons: ReviewReason[] = [];
  if (!fits) reasons.push({ code: "fits-no-cell", message: `The part does not fit the ${cell.name} cell in one piece.` });
  if (bp.flaggedLayers > 0) reasons.push({ code: "layers-outside-window", message: `${bp.flaggedLayers} of ${bp.layers.timeS.length * bp.builds} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}.` });
  return { cell, orientation, fitsCell: fits, sections, bp, pricing, schedule, status: reasons.length ? "needs-review" : "priced", reasons, vertical };
}

/**
 * Stage 3: the candidate search. Every cell × build orientation that fits × bead/layer preset of
 * that cell × print mode (× parts side by side when the quantity allows) is planned, priced and
 * dated; the pick is the printable plan with the lowest total at no later ship date (ties: the
 * earlier date). The part is sliced once per up axis at the catalogue's finest layer height
 * (independent of which cells are searched, so forcing a cell gives exactly the figures the
 * search computed for it); orientations and presets that cannot fit are pruned before planning.
 */
export function chooseStage(s: SearchInput, warnings: EstimateWarning[]): Choice {
  const { ms, cells, material } = s;
  const grown = ms.grownSize;
  const fineH = finestLayerOf(cells);
  const pairs = candidatePairs(grown, cells, s.cellKey, s.orientation);

  const fine = new Map<Axis, GrownSections>();
  const sectionsFor = (up: Axis, h: number) => {
    let f = fine.get(up);
    if (!f) { f = sliceStage(s.mesh, s.ms, up, fineH, s.allowanceMm, undefined, s.fineSlices?.get(up)); fine.set(up, f); }
    return sectionsAt(f, h);
  };

  const part: PartContext = { ms, machiningFor: (sec) => machiningOf(s, ms, sec) };
  const evaluate = (cell: CellParams, orientation: Orientation, fits: boolean, sections: GrownSections, beadWidthMm: number, printMode: PrintMode, partsPerBuild: number, vertical = false): Candidate =>
    evaluateCandidate(s, part, cell, orientation, fits, sections, beadWidthMm, printMode, partsPerBuild, vertical);

  const all: Candidate[] = [];
  for (const pair of pairs) {
    for (const preset of presetsOf(pair.cell)) {
      const sec = sectionsFor(pair.orientation.up, preset.layerHeightMm);
      const one = evaluate(pair.cell, pair.orientation, pair.fits, sec, preset.beadWidthMm, s.printMode, 1, pair.vertical);
      all.push(one);
      if (s.quantity > 1 && pair.fits && !pair.vertical) {
        const plan = orientedSize(grown, pair.orientation);
        const side = Math.min(s.quantity, sideBySide(pair.cell, [plan[0], plan[1]]));
        // Side by side lengthens each layer: worth trying when layers are short (dwell) and not already long.
        if (side > 1 && one.bp.dwellHours > 0) all.push(evaluate(pair.cell, pair.orientation, pair.fits, sec, preset.beadWidthMm, s.printMode, side));
      }
    }
  }
  all.sort(compareCandidates);
  const chosen = all[0]!;

  // alternatives: the best candidate of each cell
  const bestByCell = new Map<string, Candidate>();
  for (const c of all) if (!bestByCell.has(c.cell.key)) bestByCell.set(c.cell.key, c);
  const alternatives = [...bestByCell.values()].map((c) => alternative(c, chosen));

  // remedies tried, in the order a process engineer would
  const remedies: RemedyTried[] = [];
  const anyFlagged = all.some((c) => c.bp.flaggedLayers > 0);
  if (anyFlagged) {
    const cb = chosen.bp;
    if (s.printMode === "shell") {
      remedies.push({
        code: "shell-walls",
        tried: cb.shell?.wallsFromAllowance ? `${cb.shellWalls} walls, the fewest that hold the ${r2(s.allowanceMm)} mm allowance and a ${r2(s.rules.shellNetWallMm)} mm net wall` : `${cb.shellWalls} walls as set`,
        result: cb.flaggedLayers > 0 ? `${cb.flaggedLayers} layers still outside the window` : "layers inside the window",
      });
    } else {
      const bead = cb.beadWidthMm;
      const shellTry = evaluate(chosen.cell, chosen.orientation, chosen.fitsCell, chosen.sections, bead, "shell", cb.partsPerBuild, chosen.vertical);
      remedies.push({
        code: "shell-walls",
        tried: `a shell of ${wallsForAllowance(s.allowanceMm, bead, s.rules.shellNetWallMm)} walls instead of the solid print asked for (not applied)`,
        result: shellTry.bp.flaggedLayers > 0 ? `${shellTry.bp.flaggedLayers} layers would still be outside the window` : `all layers would be inside the window (${money(shellTry.pricing.totalCents)})`,
      });
    }
    const presetCount = new Set(all.map((c) => `${c.cell.key}|${c.bp.beadWidthMm}|${c.bp.layerHeightMm}`)).size;
    const cellsTried = [...bestByCell.keys()];
    remedies.push({ code: "preset", tried: `${presetCount} bead/layer presets`, result: `fewest layers outside: ${Math.min(...all.map((c) => c.bp.flaggedLayers))}` });
    remedies.push({ code: "cell", tried: `${cellsTried.length} cell${cellsTried.length === 1 ? "" : "s"} (${cellsTried.join(", ")})`, result: chosen.bp.flaggedLayers > 0 ? "no cell lays every layer inside the window" : `${chosen.cell.name} lays every layer inside the window` });
  }
  if (chosen.bp.dwellHours > 0 || all.some((c) => c.bp.partsPerBuild > 1)) {
    remedies.push({ code: "dwell", tried: "dwell before the next layer where a layer is shorter than the window", result: `${r2(chosen.bp.dwellHours)} h of dwell` });
    if (s.quantity > 1) {
      remedies.push({ code: "side-by-side", tried: `printing up to ${s.quantity} parts side by side so each layer takes longer`, result: chosen.bp.partsPerBuild > 1 ? `${chosen.bp.partsPerBuild} parts per build, ${chosen.bp.builds} build${chosen.bp.builds === 1 ? "" : "s"}` : "one part per build was cheaper or the bed too small" });
    }
  }

  const fits = fitCells(grown, cells, chosen.orientation, chosen.vertical ? { cell: chosen.cell.key } : undefined);
  const fitsAny = fits.some((f) => f.fits);
  const split = fitsAny ? null : suggestSplit(ms.netSize, s.allowanceMm, cells);
  const reviewReasons = [...chosen.reasons];
  if (!fitsAny) {
    const over = Math.max(...fits.map((f) => f.marginMm));
    warnings.push({
      code: "fits-no-cell",
      message: split
        ? `The part fits no printing cell (short by ${r2(-over)} mm at best); split it along ${split.axis} into ${split.pieces} pieces of ${r2(split.pieceLengthMm)} mm for the ${split.cell} cell. The estimate prices it as one print on ${chosen.cell.name}.`
        : `The part fits no printing cell (short by ${r2(-over)} mm at best) and no split along its longest axis fits either.`,
    });
    const i = reviewReasons.findIndex((r) => r.code === "fits-no-cell");
    const message = split ? `The part fits no printing cell whole; it must be split (${split.pieces} pieces along ${split.axis}), and the joint designed by the bureau's engineer.` : "The part fits no printing cell whole, and no split along its longest axis fits either.";
    if (i >= 0) reviewReasons[i] = { code: "fits-no-cell", message }; else reviewReasons.push({ code: "fits-no-cell", message });
    if (split) remedies.push({ code: "split", tried: `a split into ${split.pieces} pieces along ${split.axis}`, result: `each piece fits the ${split.cell} cell; priced as one print until the engineer plans the pieces` });
  } else if (!fits.find((f) => f.cell === chosen.cell.key)?.fitsChosen) {
    warnings.push({ code: "fits-not-chosen", message: `The part does not fit the ${chosen.cell.name} cell in the chosen orientation.` });
    if (!reviewReasons.some((r) => r.code === "fits-no-cell")) reviewReasons.push({ code: "fits-not-chosen", message: `The part does not fit the ${chosen.cell.name} cell in the chosen orientation.` });
  }
  if (chosen.bp.flaggedLayers > 0 && fitsAny) {
    // the split that would shorten the longest layer into the window (pieces along the longest plan axis)
    let longest = 0;
    for (let k = 0; k < chosen.bp.layers.timeS.length; k++) longest = Math.max(longest, chosen.bp.layers.timeS[k]!);
    const pieces = Math.ceil(longest / chosen.bp.partsPerBuild / material.maxLayerTimeS);
    remedies.push({ code: "split", tried: `a split into ${pieces} pieces across the longest layers`, result: "left to the bureau's engineer: joints change the tool" });
    reviewReasons.push({ code: "needs-engineer", message: `No cell, preset or wall count lays every layer inside the cooling window; the bureau's engineer will plan it (a split into about ${pieces} pieces, interlayer heating, or a different material).` });
  }
  const status: EstimateStatus = reviewReasons.length ? "needs-review" : "priced";
  return {
    chosen: { ...chosen, status }, orientationChosenBy: s.orientation ? "user" : "cost", fits, fitsAny, split,
    alternatives: alternatives.map((a) => (a.cell === chosen.cell.key ? { ...a, status } : a)), remedies, reviewReasons, candidatesPlanned: all.length,
  };
}
