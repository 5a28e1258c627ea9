import { canMelt, extruderOutputFor } from "./extruder";
import { steinerVolume } from "./grow";
import { toIndexed, type IndexedMesh } from "./indexed";
import { downsampleLayers } from "./plan";
import { buildModeOf, chooseStage } from "./stages/choose";
import { measureStage } from "./stages/measure";
import { cellPrintRate } from "./stages/price";
import { bad, readStage, resolveOptions } from "./stages/read";
import type { ReadModelResult } from "./read-model";
import { leadTimeOptions } from "./lead-times";
import { Ledger, ROUTER_KEY, type BookedSpan } from "./placement";
import { plantOf } from "./stages/schedule";
import { planPieces, type PiecesPlan } from "./stages/pieces";
import type { BuildPlan } from "./stages/plan";
import { materialWarnings } from "./warnings";
import type { Axis, Mesh, CellParams, EstimateResult, PieceEstimate, EstimateWarning, LengthUnit, MaterialParams, Orientation, PrintMode, RateCardParams } from "./types";

export interface AnalyseOptions {
  units?: LengthUnit;
  materialKey?: string;
  allowanceMm?: number;
  cellKey?: string;
  /** "shell" (the default: walls, internal ribs, skins) or "solid". */
  printMode?: PrintMode;
  /** Shell wall count set by hand; null/undefined = from the finish allowance and the bead. A number with no printMode means a shell. */
  shellWalls?: number | null;
  /** File axis that points up, or a full orientation; default: the lowest build that fits. */
  orientation?: Axis | Orientation;
  quantity?: number;
  sealingCoat?: boolean;
  vacuumTest?: boolean;
  /** Finish the face printed on the bed too (the part is flipped for a second set-up); by default it is left as printed. */
  finishBedFace?: boolean;
  /** An open mold: cut its trim line along the edge. */
  trimLines?: boolean;
  /** The client's stated cure temperature, °C (oven ≈ 120, autoclave ≈ 177). */
  cureTempC?: number;
  /** Expansion of the part laid up on the tool, ppm/K (carbon laminate ≈ 2–4). */
  partCtePpmPerK?: number;
  weldToleranceMm?: number;
  /** STEP/IGES tessellation tolerance, mm. */
  toleranceMm?: number;
  /** STEP/IGES: indices of the bodies to print; all when absent. */
  bodies?: number[];
  /** Destination zone of the rate card's freight table (the firm's default ship-to); the card's default when absent. */
  freightZone?: string | null;
}

export interface AnalyseInput {
  /** The file's bytes; or, instead, `read`: the model already read (the CLI streams it from disk). */
  bytes?: Uint8Array;
  /** A model read by `readModel`/`readModelFile` (a soup or already indexed). */
  read?: ReadModelResult<Mesh | IndexedMesh>;
  fileName: string;
  options: AnalyseOptions;
  catalogue: { materials: MaterialParams[]; cells: CellParams[]; rateCard: RateCardParams };
  now: Date;
  /**
   * Working hours of work not yet on the calendar, by cell key or `router` (taken first-fit from
   * now, with no slack): accepted, unscheduled orders, or a what-if queue.
   */
  queue?: Record<string, number>;
  /** Booked jobs and maintenance blocks on each cell (by key) and the router (`router`). */
  booked?: Record<string, BookedSpan[]>;
}

export type ProgressFn = (fraction: number, stage: string) => void;

const r2 = (v: number) => Math.round(v * 100) / 100;
const r4 = (v: number) => Math.round(v * 1e4) / 1e4;

/** Shell figures for a rate card saved before shells were planned (same values as the seed's). */
export const SHELL_FALLBACKS = { shellNetWallMm: 12.7, ribSpacingMm: 400, ribBeads: 1, skinLayers: 3, maxBridgeMm: 60 };

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
  const { m, netSize } = ms;
  const volume = ms.volumeMm3, M = ms.meanCurvatureMm;
  const nearNet = steinerVolume(volume, m.areaMm2, M, t);

  onProgress(0.4, "fitting");
  const rules = {
    shellNetWallMm: card.shellNetWallMm ?? SHELL_FALLBACKS.shellNetWallMm, ribSpacingMm: card.ribSpacingMm ?? SHELL_FALLBACKS.ribSpacingMm,
    ribBeads: card.ribBeads ?? SHELL_FALLBACKS.ribBeads, skinLayers: card.skinLayers ?? SHELL_FALLBACKS.skinLayers, maxBridgeMm: card.maxBridgeMm ?? SHELL_FALLBACKS.maxBridgeMm,
  };
  const plant = plantOf(card);
  // a material a cell cannot melt is never planned on it
  const cells = cat.cells.filter((c) => canMelt(c, material));
  if (o.cellKey && !cells.some((c) => c.key === o.cellKey)) {
    const cell = cat.cells.find((c) => c.key === o.cellKey)!;
    bad("option:cell", `The ${cell.name} cell reaches ${cell.maxMeltTempC} °C; ${material.name} needs at least ${material.meltTempMinC} °C.`);
  }
  if (cells.length === 0) bad("option:material", `No printing cell reaches the ${material.meltTempMinC} °C ${material.name} needs.`);
  for (const [key, hours] of Object.entries({ ...input.queue })) {
    if (key !== ROUTER_KEY && !cat.cells.some((c) => c.key === key)) bad("option:queue", `The queue names "${key.slice(0, 40)}", which is neither a printing cell of the catalogue (${cat.cells.map((c) => c.key).join(", ")}) nor "${ROUTER_KEY}".`);
    if (!Number.isFinite(hours) || hours < 0) bad("option:queue", `The queue's hours on ${key.slice(0, 40)} must be zero or more, not ${hours}.`);
  }
  const ledger = new Ledger({ booked: input.booked, hours: input.queue }, input.now.getTime(), plant);
  const orientation: Orientation | undefined = o.orientation ? (typeof o.orientation === "string" ? { up: o.orientation, swapped: false } : o.orientation) : undefined;
  onProgress(0.5, "slicing");
  const choice = chooseStage({
    mesh, ms, cells, material, card, rules, plant, allowanceMm: t, quantity, printMode, wallsOverride,
    cellKey: o.cellKey, orientation, ledger, now: input.now,
    priceOptions: { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest, freightZone: o.freightZone }, machiningAsked: { finishBedFace: o.finishBedFace, trimLines: o.trimLines },
  }, warnings);
  const c = choice.chosen, bp = c.bp, mach = c.bp.machining, cell = c.cell, plan = bp.layers, pr = c.pricing, sched = c.schedule;
  const h = bp.layerHeightMm, w = bp.beadWidthMm, z0 = c.sections.z0, layerCount = c.sections.layerCount;
  onProgress(0.75, "planning");
  onProgress(0.9, "pricing");

  if (plan.extruderLimited) {
    warnings.push({ code: "extruder-limited", message: bp.feed.limitedBy === "dryer"
      ? `The ${cell.name} dryer keeps only ${r2(bp.feed.kgPerH)} kg/h of ${material.name} dry, too little for this bead at the cell's minimum speed; deposition is capped there.`
      : `The ${cell.name} extruder cannot feed this bead at the cell's minimum speed; deposition is capped at its output.` });
  }
  if (bp.flaggedLayers > 0) {
    warnings.push({ code: "layers-too-long", message: `${bp.flaggedLayers} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}: the layer below cools too far and may bond poorly. The search tried shell walls, every bead/layer preset and cell; the bureau's engineer will plan a split or interlayer heating.` });
  }
  const { depositedKg, scrapKg, massKg, partMassKg, printHours, dwellHours, coolingHours } = bp;
  const allowanceVolume = bp.allowanceVolumeMm3;
  const queueHours = r2(sched.waitHours);
  const validUntil = new Date(input.now.getTime() + card.quoteValidityDays * 86_400_000).toISOString().slice(0, 10);

  // expansion in the chosen build: across the beads along the build direction, along them in the layers
  const upIndex = { x: 0, y: 1, z: 2 }[c.orientation.up];
  const spans = { acrossBeadMm: netSize[upIndex]!, alongBeadMm: Math.max(...netSize.filter((_, i) => i !== upIndex)), vertical: c.vertical };
  warnings.push(...materialWarnings(material, { cureTempC: o.cureTempC, partCtePpmPerK: o.partCtePpmPerK }, spans, cat.materials.filter((x) => cells.some((cl) => canMelt(cl, x)))));
  const liftingCaution = partMassKg > card.liftingCautionKg;
  if (liftingCaution) {
    // what is lifted at delivery is the machined part; the print weighs more until machined
    cautions.push(`Heavy part: about ${r2(partMassKg)} kg (${r2(partMassKg / 0.45359237)} lb) machined, about ${r2(depositedKg / quantity)} kg as printed. Lift it with equipment rated for the load and follow local codes and licensed rigging practice.`);
  }
  cautions.push("Printed parts stay hot for hours after printing, and machining chips are sharp: wear gloves and eye protection when handling at pickup.");
  if (o.cureTempC !== undefined && o.cureTempC > material.maxServiceTempC) {
    cautions.push(`A mold used above its material's service temperature (${material.maxServiceTempC} °C for ${material.name}) can deform or fail under autoclave pressure; the customer's own engineering sign-off decides its use.`);
  }
  const fits = choice.fits, fitsAny = choice.fitsAny, split = choice.split, chosenBy = choice.orientationChosenBy;
  const slicedVolume = c.sections.slicedVolumeMm3;
  const walls = bp.shellWalls;

  // A part no cell takes whole: each piece its own estimate, summed, with the joining
  const fineH = Math.min(...cells.flatMap((x) => [...x.layerHeightsMm, x.defaultLayerHeightMm]).filter((v) => v > 0));
  const searchInput = {
    mesh, ms, cells, material, card, rules, plant, allowanceMm: t, quantity, printMode, wallsOverride,
    cellKey: o.cellKey, orientation, ledger, now: input.now,
    priceOptions: { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest, freightZone: o.freightZone }, machiningAsked: { finishBedFace: o.finishBedFace, trimLines: o.trimLines },
  };
  const pieces = split && !o.orientation ? planPieces(searchInput, o.cellKey ? cells.filter((x) => x.key === o.cellKey) : cells, split, fineH, pr) : null;

  onProgress(1, "done");
  const chart = downsampleLayers(z0, h, plan);
  const result: EstimateResult = {
    kind: "estimate",
    fileName: input.fileName,
    format: read.format,
    triangles: m.triangles,
    units: read.units,
    unitsGuessed: read.unitsGuessed,
    unitsReason: read.unitsReason,
    ...(read.cad ? { toleranceMm: read.cad.toleranceMm, cad: read.cad } : {}),
    bboxMm: netSize.map(r4) as [number, number, number],
    bboxMinMm: m.bounds.min.map(r4) as [number, number, number],
    volumeMm3: volume,
    areaMm2: m.areaMm2,
    watertight: m.watertight,
    openEdges: m.openEdges,
    nonManifoldEdges: m.nonManifoldEdges,
    inconsistentEdges: m.inconsistentEdges,
    degenerateTriangles: m.degenerateTriangles,
    shells: m.shells,
    weldToleranceMm: m.weldToleranceMm,
    meanCurvatureIntegralMm: M,
    allowanceMm: t,
    nearNetVolumeMm3: nearNet,
    allowanceVolumeMm3: allowanceVolume,
    slicedVolumeMm3: slicedVolume,
    orientation: c.orientation,
    orientationChosenBy: chosenBy,
    fits: fits.map((f) => ({ ...f, marginMm: r2(f.marginMm), marginChosenMm: r2(f.marginChosenMm), buildHeightMm: r2(f.buildHeightMm) })),
    fitsAny,
    split,
    cell: cell.key,
    beadWidthMm: w,
    layerHeightMm: h,
    shellWalls: walls,
    speedMmS: r2(plan.speedMmS),
    layers: layerCount,
    flaggedLayers: bp.flaggedLayers,
    printHours: r4(printHours),
    dwellHours: r4(dwellHours),
    coolingHours: r4(coolingHours),
    layerChart: chart,
    material: {
      key: material.key, name: material.name, densityGPerCm3: material.densityGPerCm3,
      glassTransitionC: material.glassTransitionC, maxServiceTempC: material.maxServiceTempC,
      cteAlongPpmPerK: material.cteAlongPpmPerK, cteAcrossPpmPerK: material.cteAcrossPpmPerK,
      minLayerTimeS: material.minLayerTimeS, maxLayerTimeS: material.maxLayerTimeS,
    },
    depositedKg: r4(depositedKg),
    purgeKg: card.purgeKg,
    scrapKg: r4(scrapKg),
    massKg: r4(massKg),
    partMassKg: r4(partMassKg),
    liftingCaution,
    machining: {
      bedFaceMm2: r2(mach.bedFaceMm2), bedFaceFinished: mach.bedFaceFinished, setups: mach.setups, trimLengthMm: r2(mach.trimLengthMm), trimHours: r4(mach.trimHours),
      roughingHours: r4(mach.roughingHours), finishingHours: r4(mach.finishingHours), toolChangeHours: r4(mach.toolChangeHours),
      setupHours: mach.setupHours, stepoverMm: r4(mach.stepoverMm), scallopMm: r4(mach.scallopMm),
    },
    machiningHours: r4(mach.totalHours * quantity),
    quantity,
    lines: pr.lines,
    subtotalCents: pr.subtotalCents,
    marginCents: pr.marginCents,
    taxCents: pr.taxCents,
    totalCents: pr.totalCents,
    depositCents: pr.depositCents,
    balanceCents: pr.balanceCents,
    ...(pr.crate ? { crate: pr.crate } : {}),
    validUntil,
    schedule: {
      queueHours,
      printStart: sched.printStart.toISOString(),
      printEnd: sched.printEnd.toISOString(),
      coolingEnd: sched.coolingEnd.toISOString(),
      machiningEnd: sched.machiningEnd.toISOString(),
      shipDate: sched.shipDate,
      setupStart: sched.setupStart.toISOString(),
      dryingStart: sched.dryingStart.toISOString(),
      printContinuous: true,
      timeZone: plant.timeZone,
    },
    shipDate: sched.shipDate,
    leadTimes: c.status === "priced" ? leadTimeOptions(ledger, sched.spec, sched.placement, pr, card) : [{ key: "standard", shipDate: sched.shipDate, totalCents: pr.totalCents, adjustmentCents: 0 }],
    warnings,
    cautions,
    status: c.status,
    reviewReasons: choice.reviewReasons,
    printMode: buildModeOf(c),
    shell: bp.shell,
    meanSpeedMmS: r2(plan.meanSpeedMmS),
    drying: bp.feed.drying ? { hours: bp.feed.drying.hours, tempC: bp.feed.drying.tempC, dryerKg: bp.feed.drying.dryerKg, maxKgPerH: r2(bp.feed.drying.maxKgPerH) } : null,
    feed: { kgPerH: r2(bp.feed.kgPerH), limitedBy: bp.feed.limitedBy, extruderKgPerH: extruderOutputFor(cell, material), screwMm: cell.screwMm ?? null },
    printRateCentsPerH: cellPrintRate(cell, card),
    batch: { partsPerBuild: bp.partsPerBuild, builds: bp.builds },
    alternatives: choice.alternatives,
    remedies: choice.remedies,
    candidatesPlanned: choice.candidatesPlanned,
  };
  if (!pieces) return result;
  // the expansion across the beads follows the pieces' build (each along its own length)
  const p0 = pieces.pieces[0]!, up0 = { x: 0, y: 1, z: 2 }[p0.chosen.orientation.up];
  const pieceSpans = { acrossBeadMm: p0.ms.netSize[up0]!, alongBeadMm: Math.max(...p0.ms.netSize.filter((_, i) => i !== up0)), vertical: p0.chosen.vertical };
  const across = materialWarnings(material, { cureTempC: o.cureTempC, partCtePpmPerK: o.partCtePpmPerK }, pieceSpans).filter((w) => w.code === "material-cte-across");
  const piecewise = { ...result, warnings: [...result.warnings.filter((w) => w.code !== "material-cte-across"), ...across] };
  return asPieces(piecewise, pieces, card, material, quantity, ledger);
}

const dryingOut = (d: BuildPlan["feed"]["drying"]) => (d ? { hours: d.hours, tempC: d.tempC, dryerKg: d.dryerKg, maxKgPerH: r2(d.maxKgPerH) } : null);

/** The estimate of a part priced as pieces: each piece's own figures, the sums at the top, the joining in the lines and the dates. */
function asPieces(r: EstimateResult, pp: PiecesPlan, card: RateCardParams, material: MaterialParams, quantity: number, ledger: Ledger): EstimateResult {
  const out: PieceEstimate[] = pp.pieces.map((p) => {
    const c = p.chosen, bp = c.bp, sc = c.schedule;
    const own = c.pricing.lines.filter((l) => ["material", "print", "dwell", "machining", "engineering", "setup"].includes(l.key));
    return {
      index: p.index, axis: pp.axis, fromMm: r2(p.fromMm), toMm: r2(p.toMm), cell: c.cell.key, cellName: c.cell.name, printMode: buildModeOf(c), orientation: c.orientation,
      beadWidthMm: bp.beadWidthMm, layerHeightMm: bp.layerHeightMm, layers: c.sections.layerCount, flaggedLayers: bp.flaggedLayers,
      printHours: r4(bp.printHours), dwellHours: r4(bp.dwellHours), coolingHours: r4(bp.coolingHours), setupHours: (card.printSetupHours ?? 0) * bp.builds,
      depositedKg: r4(bp.depositedKg), massKg: r4(bp.massKg), partMassKg: r4(bp.partMassKg), machiningHours: r4(bp.machining.totalHours * quantity),
      drying: dryingOut(bp.feed.drying),
      schedule: {
        setupStart: sc.setupStart.toISOString(), dryingStart: sc.dryingStart.toISOString(), printStart: sc.printStart.toISOString(), printEnd: sc.printEnd.toISOString(),
        coolingEnd: sc.coolingEnd.toISOString(), machiningStart: p.machiningStart.toISOString(), machiningEnd: p.machiningEnd.toISOString(),
      },
      lines: own, subtotalCents: own.reduce((a, l) => a + l.amountCents, 0), status: c.status,
    };
  });
  const sum = (f: (p: PiecesPlan["pieces"][number]) => number) => pp.pieces.reduce((a, p) => a + f(p), 0);
  const first = pp.pieces[0]!.chosen;
  const iso = (ds: Date[], pick: "min" | "max") => new Date(pick === "min" ? Math.min(...ds.map((d) => d.getTime())) : Math.max(...ds.map((d) => d.getTime()))).toISOString();
  const scs = pp.pieces.map((p) => p.chosen.schedule);
  const mk = (k: "roughingHours" | "finishingHours" | "toolChangeHours" | "setupHours") => r4(sum((p) => p.chosen.bp.machining[k]));
  const pr = pp.pricing;
  const partMassKg = sum((p) => p.chosen.bp.partMassKg);
  const liftingCaution = partMassKg > card.liftingCautionKg;
  const heavy = r.cautions.findIndex((x) => x.startsWith("Heavy part"));
  const cautions = [...r.cautions];
  const heavyText = `Heavy part: about ${r2(partMassKg)} kg (${r2(partMassKg / 0.45359237)} lb) machined and joined, more as printed. Lift it with equipment rated for the load and follow local codes and licensed rigging practice.`;
  if (heavy >= 0) cautions[heavy] = heavyText; else if (liftingCaution) cautions.unshift(heavyText);
  const n = pp.pieces.length;
  // the whole-part plan's layer and feed warnings give way to the pieces'
  const flagged = out.filter((p) => p.flaggedLayers > 0);
  const warnings = r.warnings.filter((w) => w.code !== "layers-too-long" && w.code !== "extruder-limited").map((w) => (w.code === "fits-no-cell"
    ? { code: "priced-as-pieces", message: `The part fits no printing cell whole; it is priced as ${n} pieces along ${pp.axis} (${out.map((p) => p.cellName).join(", ")}), bonded and machined across ${pp.joint.cuts === 1 ? "the joint" : `${pp.joint.cuts} joints`}. The bureau's engineer confirms where the joints go.` }
    : w));
  if (flagged.length) warnings.push({ code: "layers-too-long", message: `${flagged.map((p) => `piece ${p.index + 1}: ${p.flaggedLayers}`).join(", ")} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}; the bureau's engineer will plan them.` });
  // the whole-part plan's reasons no longer apply: the pieces are what is built
  const reviewReasons: EstimateResult["reviewReasons"] = [];
  for (const p of out) if (p.status !== "priced") reviewReasons.push({ code: "piece-outside-window", message: `Piece ${p.index + 1}: ${p.flaggedLayers} layers take longer than the cooling window.` });
  return {
    ...r,
    cell: first.cell.key, orientation: first.orientation, printMode: buildModeOf(first), beadWidthMm: first.bp.beadWidthMm, layerHeightMm: first.bp.layerHeightMm,
    shellWalls: first.bp.shellWalls, shell: first.bp.shell, speedMmS: r2(first.bp.layers.speedMmS), meanSpeedMmS: r2(first.bp.layers.meanSpeedMmS),
    layers: sum((p) => p.chosen.sections.layerCount), flaggedLayers: sum((p) => p.chosen.bp.flaggedLayers),
    printHours: r4(sum((p) => p.chosen.bp.printHours)), dwellHours: r4(sum((p) => p.chosen.bp.dwellHours)), coolingHours: r4(sum((p) => p.chosen.bp.coolingHours)),
    layerChart: downsampleLayers(first.sections.z0, first.bp.layerHeightMm, first.bp.layers),
    depositedKg: r4(sum((p) => p.chosen.bp.depositedKg)), purgeKg: r4(card.purgeKg * sum((p) => p.chosen.bp.builds)), scrapKg: r4(sum((p) => p.chosen.bp.scrapKg)),
    massKg: r4(sum((p) => p.chosen.bp.massKg)), partMassKg: r4(partMassKg), liftingCaution,
    machining: {
      ...r.machining, bedFaceMm2: r2(sum((p) => p.chosen.bp.machining.bedFaceMm2)), setups: sum((p) => p.chosen.bp.machining.setups),
      trimLengthMm: r2(sum((p) => p.chosen.bp.machining.trimLengthMm)), trimHours: r4(sum((p) => p.chosen.bp.machining.trimHours)), roughingHours: mk("roughingHours"), finishingHours: mk("finishingHours"), toolChangeHours: mk("toolChangeHours"), setupHours: mk("setupHours") },
    machiningHours: r4(sum((p) => p.chosen.bp.machining.totalHours) * quantity),
    lines: pr.lines, subtotalCents: pr.subtotalCents, marginCents: pr.marginCents, taxCents: pr.taxCents, totalCents: pr.totalCents,
    depositCents: pr.depositCents, balanceCents: pr.balanceCents,
    schedule: {
      ...r.schedule, queueHours: r2(pp.placement.waitHours),
      setupStart: iso(scs.map((x) => x.setupStart), "min"), dryingStart: iso(scs.map((x) => x.dryingStart), "min"),
      printStart: iso(scs.map((x) => x.printStart), "min"), printEnd: iso(scs.map((x) => x.printEnd), "max"), coolingEnd: iso(scs.map((x) => x.coolingEnd), "max"),
      machiningEnd: pp.joinEnd.toISOString(), shipDate: pp.shipDate,
    },
    shipDate: pp.shipDate,
    leadTimes: reviewReasons.length ? [{ key: "standard", shipDate: pp.shipDate, totalCents: pr.totalCents, adjustmentCents: 0 }] : leadTimeOptions(ledger, pp.spec, pp.placement, pr, card),
    drying: dryingOut(first.bp.feed.drying),
    feed: { kgPerH: r2(first.bp.feed.kgPerH), limitedBy: first.bp.feed.limitedBy, extruderKgPerH: extruderOutputFor(first.cell, material), screwMm: first.cell.screwMm ?? null },
    printRateCentsPerH: cellPrintRate(first.cell, card),
    batch: { partsPerBuild: 1, builds: sum((p) => p.chosen.bp.builds) },
    status: reviewReasons.length ? "needs-review" : "priced", reviewReasons, warnings, cautions,
    remedies: r.remedies.map((x) => (x.code === "split" ? { ...x, result: `each piece planned and priced on its own (${out.map((p) => p.cellName).join(", ")}), with the joining` } : x)),
    // the whole-part candidates do not fit; the pieces are the plan
    alternatives: [],
    pieces: out, joint: { cuts: pp.joint.cuts, faceAreaMm2: r2(pp.joint.faceAreaMm2), contourMm: r2(pp.joint.contourMm), hours: r4(pp.joint.hours) },
  };
}
