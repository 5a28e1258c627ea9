import { extruderOutputFor } from "../extruder";
import { leadTimeOptions } from "../lead-times";
import type { Ledger } from "../ledger";
import { downsampleLayers } from "../plan";
import type { ReadModelResult } from "../read-model";
import { r2, r4 } from "../round";
import type { IndexedMesh } from "../indexed";
import type { EstimateResult, EstimateWarning, MaterialParams, Mesh, RateCardParams } from "../types";
import type { AnalyseInput } from "../analyse-input";
import { buildModeOf } from "./candidates";
import type { Choice } from "./choose";
import type { Measured } from "./measure";
import { cellPrintRate } from "./price";
import type { plantOf } from "./schedule";

/** The estimate as reported: the read and measured model, the chosen build's plan, price and dates, and what the search tried. */
export function estimateResult(x: {
  input: AnalyseInput; read: ReadModelResult<Mesh | IndexedMesh>; ms: Measured; nearNet: number; choice: Choice; material: MaterialParams; card: RateCardParams;
  quantity: number; plant: ReturnType<typeof plantOf>; ledger: Ledger; warnings: EstimateWarning[]; cautions: string[]; allowanceMm: number; liftingCaution: boolean;
}): EstimateResult {
  const { input, read, ms, nearNet, choice, material, card, quantity, plant, ledger, warnings, cautions, allowanceMm: t, liftingCaution } = x;
  const { m, netSize } = ms;
  const volume = ms.volumeMm3, M = ms.meanCurvatureMm;
  const c = choice.chosen, bp = c.bp, mach = c.bp.machining, cell = c.cell, plan = bp.layers, pr = c.pricing, sched = c.schedule;
  const h = bp.layerHeightMm, w = bp.beadWidthMm, z0 = c.sections.z0, layerCount = c.sections.layerCount;
  const { depositedKg, scrapKg, massKg, partMassKg, printHours, dwellHours, coolingHours } = bp;
  const allowanceVolume = bp.allowanceVolumeMm3;
  const queueHours = r2(sched.waitHours);
  const validUntil = new Date(input.now.getTime() + card.quoteValidityDays * 86_400_000).toISOString().slice(0, 10);
  const fits = choice.fits, fitsAny = choice.fitsAny, split = choice.split, chosenBy = choice.orientationChosenBy;
  const slicedVolume = c.sections.slicedVolumeMm3;
  const walls = bp.shellWalls;
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
}
