import { downsampleLayers } from "./plan";
import { chooseStage } from "./stages/choose";
import { measureStage } from "./stages/measure";
import { planStage } from "./stages/plan";
import { priceStage } from "./stages/price";
import { readStage, resolveOptions } from "./stages/read";
import { scheduleStage } from "./stages/schedule";
import { sliceStage } from "./stages/slice";
import type { ReadModelResult } from "./read-model";
import { materialWarnings } from "./warnings";
import type { Axis, CellParams, EstimateResult, EstimateWarning, LengthUnit, MaterialParams, Orientation, RateCardParams } from "./types";

export interface AnalyseOptions {
  units?: LengthUnit;
  materialKey?: string;
  allowanceMm?: number;
  cellKey?: string;
  /** null/undefined = solid print; N = N walls along the contour. */
  shellWalls?: number | null;
  /** File axis that points up, or a full orientation; default: the lowest build that fits. */
  orientation?: Axis | Orientation;
  quantity?: number;
  sealingCoat?: boolean;
  vacuumTest?: boolean;
  /** The client's stated cure temperature, °C (oven ≈ 120, autoclave ≈ 177). */
  cureTempC?: number;
  /** Expansion of the part laid up on the tool, ppm/K (carbon laminate ≈ 2–4). */
  partCtePpmPerK?: number;
  weldToleranceMm?: number;
  /** STEP/IGES tessellation tolerance, mm. */
  toleranceMm?: number;
  /** STEP/IGES: indices of the bodies to print; all when absent. */
  bodies?: number[];
}

export interface AnalyseInput {
  /** The file's bytes; or, instead, `read`: the model already read (the CLI streams it from disk). */
  bytes?: Uint8Array;
  /** A model read by `readModel`/`readModelFile`; analyse turns its positions in place. */
  read?: ReadModelResult;
  fileName: string;
  options: AnalyseOptions;
  catalogue: { materials: MaterialParams[]; cells: CellParams[]; rateCard: RateCardParams };
  now: Date;
  /** Working hours of jobs already queued on each cell, by cell key. */
  queue?: Record<string, number>;
}

export type ProgressFn = (fraction: number, stage: string) => void;

const r2 = (v: number) => Math.round(v * 100) / 100;
const r4 = (v: number) => Math.round(v * 1e4) / 1e4;

/**
 * The whole estimate of one part, stage by stage (`stages/`): read, measure, choose (cell and
 * orientation), slice, plan (layers, material, machining), price, schedule. Pure: every input
 * is passed in, `now` included.
 */
export async function analyse(input: AnalyseInput, onProgress: ProgressFn = () => {}): Promise<EstimateResult> {
  const { options: o, catalogue: cat } = input;
  const card = cat.rateCard;
  const warnings: EstimateWarning[] = [];
  const cautions: string[] = [];
  const { material, allowanceMm: t, shellWalls: walls, quantity } = resolveOptions(input);

  onProgress(0.02, "reading");
  const read = await readStage(input, warnings);
  const mesh = read.mesh;

  onProgress(0.25, "measuring");
  const ms = measureStage(mesh, t, o.weldToleranceMm, warnings);
  const { m, netSize } = ms;
  const volume = ms.volumeMm3, M = ms.meanCurvatureMm;

  onProgress(0.4, "fitting");
  const choice = chooseStage(ms, cat.cells, material, t, { cellKey: o.cellKey, orientation: o.orientation }, warnings);
  const { cell, orientation, chosenBy, fits, fitsAny, split } = choice;

  onProgress(0.5, "slicing");
  // the mesh is not needed in file space after this: turned in place, not copied
  const sec = sliceStage(mesh, ms, orientation, cell.defaultLayerHeightMm, t, { turnInPlace: true });
  const { z0, layerCount } = sec;
  const h = sec.layerHeightMm, w = cell.defaultBeadWidthMm;
  const slicedVolume = sec.slicedVolumeMm3;

  onProgress(0.75, "planning");
  const bp = planStage(ms, sec, cell, material, card, t, walls, warnings);
  const plan = bp.layers, mach = bp.machining;
  const nearNet = bp.nearNetMm3, allowanceVolume = bp.allowanceVolumeMm3;
  const { depositedKg, scrapKg, massKg, partMassKg, printHours, dwellHours, coolingHours } = bp;

  onProgress(0.9, "pricing");
  const pr = priceStage(ms, bp, material, card, quantity, { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest });
  const queueHours = input.queue?.[cell.key] ?? 0;
  const sched = scheduleStage(input.now, cell, card, bp, quantity, queueHours);
  const validUntil = new Date(input.now.getTime() + card.quoteValidityDays * 86_400_000).toISOString().slice(0, 10);

  warnings.push(...materialWarnings(material, { cureTempC: o.cureTempC, partCtePpmPerK: o.partCtePpmPerK }));
  const liftingCaution = partMassKg > card.liftingCautionKg;
  if (liftingCaution) {
    cautions.push(`Heavy part: about ${r2(partMassKg)} kg (${r2(partMassKg / 0.45359237)} lb) machined, more as printed. Lift it with equipment rated for the load and follow local codes and licensed rigging practice.`);
  }
  cautions.push("Printed parts stay hot for hours after printing, and machining chips are sharp: wear gloves and eye protection when handling at pickup.");
  if (o.cureTempC !== undefined && o.cureTempC > material.maxServiceTempC) {
    cautions.push(`A mold used above its material's service temperature (${material.maxServiceTempC} °C for ${material.name}) can deform or fail under autoclave pressure; the customer's own engineering sign-off decides its use.`);
  }

  onProgress(1, "done");
  const chart = downsampleLayers(z0, h, plan);
  return {
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
    orientation,
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
    flaggedLayers: plan.flaggedCount,
    printHours: r4(printHours * quantity),
    dwellHours: r4(dwellHours * quantity),
    coolingHours: r4(coolingHours),
    layerChart: chart,
    material: {
      key: material.key, name: material.name, densityGPerCm3: material.densityGPerCm3,
      glassTransitionC: material.glassTransitionC, maxServiceTempC: material.maxServiceTempC,
      cteAlongPpmPerK: material.cteAlongPpmPerK, cteAcrossPpmPerK: material.cteAcrossPpmPerK,
      minLayerTimeS: material.minLayerTimeS, maxLayerTimeS: material.maxLayerTimeS,
    },
    depositedKg: r4(depositedKg * quantity),
    purgeKg: card.purgeKg,
    scrapKg: r4(scrapKg * quantity),
    massKg: r4(massKg * quantity),
    partMassKg: r4(partMassKg),
    liftingCaution,
    machining: {
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
    validUntil,
    schedule: {
      queueHours,
      printStart: sched.printStart.toISOString(),
      printEnd: sched.printEnd.toISOString(),
      coolingEnd: sched.coolingEnd.toISOString(),
      machiningEnd: sched.machiningEnd.toISOString(),
      shipDate: sched.shipDate,
    },
    shipDate: sched.shipDate,
    warnings,
    cautions,
  };
}
