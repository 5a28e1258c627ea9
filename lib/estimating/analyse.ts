import { EstimateInputError } from "./errors";
import { grownSection, steinerVolume } from "./grow";
import { planMachining } from "./machining";
import { measure, bounds } from "./measure";
import { bestOrientation, fitCells, orientPositions, orientedSize, suggestSplit } from "./orient";
import { downsampleLayers, planLayers } from "./plan";
import { price } from "./pricing";
import { readModel } from "./read-model";
import { shipSchedule } from "./schedule";
import { slice } from "./slice";
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
  bytes: Uint8Array;
  fileName: string;
  options: AnalyseOptions;
  catalogue: { materials: MaterialParams[]; cells: CellParams[]; rateCard: RateCardParams };
  now: Date;
  /** Working hours of jobs already queued on each cell, by cell key. */
  queue?: Record<string, number>;
}

export type ProgressFn = (fraction: number, stage: string) => void;

/** Most layers a plan may have (a 9 m build at 1 mm layers is 9 000). */
const MAX_LAYERS = 200_000;

const r2 = (v: number) => Math.round(v * 100) / 100;
const r4 = (v: number) => Math.round(v * 1e4) / 1e4;

function bad(code: string, message: string): never {
  throw new EstimateInputError(code, message);
}

/**
 * The whole estimate of one part: read, measure, orient and fit, grow, slice, plan layers,
 * material, machining, price and ship date. Pure: every input is passed in, `now` included.
 */
export async function analyse(input: AnalyseInput, onProgress: ProgressFn = () => {}): Promise<EstimateResult> {
  const { options: o, catalogue: cat } = input;
  const card = cat.rateCard;
  const warnings: EstimateWarning[] = [];
  const cautions: string[] = [];

  const material = o.materialKey ? cat.materials.find((m) => m.key === o.materialKey) : cat.materials[0];
  if (!material) bad("option:material", `There is no material "${String(o.materialKey).slice(0, 40)}" in the catalogue.`);
  if (o.cellKey && !cat.cells.some((c) => c.key === o.cellKey)) bad("option:cell", `There is no printing cell "${o.cellKey.slice(0, 40)}".`);
  if (cat.cells.length === 0) bad("option:cell", "The catalogue has no printing cells.");
  const t = o.allowanceMm ?? card.defaultAllowanceMm;
  if (!Number.isFinite(t) || t < 0 || t > 200) bad("option:allowance", "The finish allowance must be between 0 and 200 mm.");
  const walls = o.shellWalls ?? null;
  if (walls !== null && (!Number.isInteger(walls) || walls < 1 || walls > 50)) bad("option:shell-walls", "Shell walls must be a whole number from 1 to 50.");
  const quantity = o.quantity ?? 1;
  if (!Number.isInteger(quantity) || quantity < 1 || quantity > 1000) bad("option:quantity", "The quantity must be a whole number from 1 to 1000.");

  onProgress(0.02, "reading");
  const read = await readModel(input.bytes, input.fileName, { units: o.units, toleranceMm: o.toleranceMm, bodies: o.bodies });
  const mesh = read.mesh;
  if (read.unitsGuessed) warnings.push({ code: "units-guessed", message: read.unitsReason });

  onProgress(0.25, "measuring");
  const m = measure(mesh, { weldToleranceMm: o.weldToleranceMm });
  let volume = m.volumeMm3, M = m.meanCurvatureIntegral;
  if (volume < 0) {
    warnings.push({ code: "inside-out", message: "The mesh is wound inside out (its volume came out negative); it was measured as if turned right way out." });
    volume = -volume; M = -M;
  }
  if (!m.watertight) {
    warnings.push({ code: "not-watertight", message: `The mesh is not watertight (${m.openEdges} open, ${m.nonManifoldEdges} non-manifold, ${m.inconsistentEdges} inconsistently oriented edges): volume, mass and price are unreliable until it is repaired.` });
  }
  if (volume <= 0) bad("mesh:no-volume", "The mesh encloses no volume, so there is nothing to print.");

  const netSize: [number, number, number] = [0, 1, 2].map((i) => m.bounds.max[i]! - m.bounds.min[i]!) as [number, number, number];
  const grownSize = netSize.map((v) => v + 2 * t) as [number, number, number];

  onProgress(0.4, "fitting");
  // orientation and cell
  let orientation: Orientation;
  let chosenBy: "user" | "min-height";
  let cell: CellParams;
  const candidates = o.cellKey ? cat.cells.filter((c) => c.key === o.cellKey) : cat.cells;
  if (o.orientation) {
    orientation = typeof o.orientation === "string" ? { up: o.orientation, swapped: false } : o.orientation;
    chosenBy = "user";
    if (o.cellKey) cell = candidates[0]!;
    else {
      const fitting = cat.cells.filter((c) => Math.min(c.envelopeMm.x - orientedSize(grownSize, orientation)[0], c.envelopeMm.y - orientedSize(grownSize, orientation)[1], c.envelopeMm.z - orientedSize(grownSize, orientation)[2]) >= 0);
      cell = fitting[0] ?? cat.cells[0]!;
    }
  } else {
    chosenBy = "min-height";
    const ranked = candidates.map((c) => ({ c, b: bestOrientation(grownSize, c) }));
    const fitting = ranked.filter((r) => r.b.marginMm >= 0);
    const envVol = (c: CellParams) => c.envelopeMm.x * c.envelopeMm.y * c.envelopeMm.z;
    fitting.sort((a, b) => a.b.heightMm - b.b.heightMm || envVol(a.c) - envVol(b.c));
    // Among the lowest builds, the smallest cell whose extruder lays a mean layer inside the
    // material's cooling window (a rough Steiner-volume check before slicing).
    const grownGuess = steinerVolume(Math.abs(m.volumeMm3), m.areaMm2, Math.abs(m.meanCurvatureIntegral), t);
    const meanLayerS = (c: CellParams, heightMm: number) => {
      const mm3PerS = Math.min((c.extruderOutputKgPerH * 1e6) / 3600 / material.densityGPerCm3, c.speedMaxMmS * c.defaultBeadWidthMm * c.defaultLayerHeightMm);
      return (grownGuess * (c.defaultLayerHeightMm / heightMm)) / mm3PerS;
    };
    const lowest = fitting.length ? fitting[0]!.b.heightMm : 0;
    const pick = fitting.find((r) => r.b.heightMm <= lowest + 1e-6 && meanLayerS(r.c, r.b.heightMm) <= material.maxLayerTimeS)
      ?? fitting[0] ?? ranked.sort((a, b) => b.b.marginMm - a.b.marginMm)[0]!;
    cell = pick.c; orientation = pick.b.orientation;
  }
  const fits = fitCells(grownSize, cat.cells, orientation);
  const fitsAny = fits.some((f) => f.fits);
  const split = fitsAny ? null : suggestSplit(netSize, t, cat.cells);
  if (!fitsAny) {
    const over = Math.max(...fits.map((f) => f.marginMm));
    warnings.push({
      code: "fits-no-cell",
      message: split
        ? `The part fits no printing cell (short by ${r2(-over)} mm at best); split it along ${split.axis} into ${split.pieces} pieces of ${r2(split.pieceLengthMm)} mm for the ${split.cell} cell. The estimate prices it as one print on ${cell.name}.`
        : `The part fits no printing cell (short by ${r2(-over)} mm at best) and no split along its longest axis fits either.`,
    });
  } else if (!fits.find((f) => f.cell === cell.key)?.fitsChosen) {
    warnings.push({ code: "fits-not-chosen", message: `The part does not fit the ${cell.name} cell in the chosen orientation.` });
  }

  onProgress(0.5, "slicing");
  const p = orientPositions(mesh.positions, orientation);
  const ob = p === mesh.positions ? m.bounds : bounds(p);
  const zMin = ob.min[2], zMax = ob.max[2];
  const h = cell.defaultLayerHeightMm, w = cell.defaultBeadWidthMm;
  const height = zMax - zMin + 2 * t;
  const layerCount = Math.max(1, Math.ceil(height / h - 1e-9));
  if (layerCount > MAX_LAYERS) bad("mesh:too-tall", `The part would need ${layerCount} layers, more than the ${MAX_LAYERS} the planner accepts; check the units.`);
  const z0 = zMin - t;
  const sec = slice(p, mesh.triangleCount, z0, h, layerCount);
  const grownArea = new Float64Array(layerCount), grownPer = new Float64Array(layerCount);
  let firstIn = -1, lastIn = -1;
  for (let k = 0; k < layerCount; k++) if (sec.area[k]! > 0) { if (firstIn < 0) firstIn = k; lastIn = k; }
  const fallbackA = volume / Math.max(zMax - zMin, 1e-9), fallbackP = 2 * (orientedSize(netSize, orientation)[0] + orientedSize(netSize, orientation)[1]);
  for (let k = 0; k < layerCount; k++) {
    const z = z0 + (k + 0.5) * h;
    let A: number, P: number, r = t;
    if (z > zMin && z < zMax && sec.area[k]! > 0) { A = sec.area[k]!; P = sec.perimeter[k]!; }
    else {
      // beyond the net part's ends: the nearest net section grown by √(t² − d²)
      const idx = z <= zMin || (firstIn >= 0 && k < firstIn) ? firstIn : lastIn;
      A = idx >= 0 ? sec.area[idx]! : fallbackA; P = idx >= 0 ? sec.perimeter[idx]! : fallbackP;
      const d = z <= zMin ? zMin - z : z >= zMax ? z - zMax : 0;
      r = Math.sqrt(Math.max(0, t * t - d * d));
    }
    const g = grownSection(A, P, r);
    grownArea[k] = g.area; grownPer[k] = g.perimeter;
  }
  let slicedVolume = 0;
  for (let k = 0; k < layerCount; k++) slicedVolume += grownArea[k]! * h;

  onProgress(0.75, "planning");
  // The 2D offset of a section misses the extra reach of sloped walls (the 3D offset is wider
  // there), so the sliced sum falls a little short of the Steiner volume. The sections are
  // rescaled to the Steiner total: the slices give the distribution over height, Steiner the
  // amount, and mass and print time then agree.
  const nearNet = steinerVolume(volume, m.areaMm2, M, t);
  const fill = slicedVolume > 0 ? nearNet / slicedVolume : 1;
  const planArea = fill === 1 ? grownArea : grownArea.map((a) => a * fill);
  const plan = planLayers({ areaMm2: planArea, perimeterMm: grownPer, layerHeightMm: h, beadWidthMm: w, shellWalls: walls, cell, material });
  if (plan.extruderLimited) warnings.push({ code: "extruder-limited", message: `The ${cell.name} extruder cannot feed this bead at the cell's minimum speed; deposition is capped at its output.` });
  if (plan.flaggedCount > 0) {
    warnings.push({ code: "layers-too-long", message: `${plan.flaggedCount} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}: the layer below cools too far and may bond poorly. Consider shell walls, a larger bead, a split, or interlayer heating.` });
  }

  const allowanceVolume = nearNet - volume;
  const rho = material.densityGPerCm3 * 1e-6; // kg per mm³
  const depositedKg = (walls === null ? nearNet : plan.depositedMm3) * rho;
  const scrapKg = depositedKg * card.startupScrapFraction;
  const massKg = depositedKg + card.purgeKg + scrapKg;
  const partMassKg = Math.max(0, depositedKg - allowanceVolume * rho);

  const mach = planMachining(allowanceVolume, m.areaMm2, card);
  const printHours = plan.printS / 3600, dwellHours = plan.dwellTotalS / 3600;
  const coolingHours = Math.min(card.coolingHoursMax, card.coolingHoursBase + card.coolingHoursPerKg * depositedKg);

  onProgress(0.9, "pricing");
  const crateSize = grownSize.map((v) => v + 2 * card.cratePaddingMm) as [number, number, number];
  const pr = price({
    quantity, massKg, materialPricePerKgCents: material.pricePerKgCents, printHours, dwellHours,
    machiningHours: mach.totalHours, netAreaMm2: m.areaMm2, crateSizeMm: crateSize, partMassKg,
    options: { sealingCoat: o.sealingCoat, vacuumTest: o.vacuumTest },
  }, card);
  const queueHours = input.queue?.[cell.key] ?? 0;
  const sched = shipSchedule(input.now, cell.calendar, {
    queueHours, printHours: (printHours + dwellHours) * quantity, coolingHours, machiningHours: mach.totalHours * quantity,
    finishingDays: card.finishingDays, inspectionDays: card.inspectionDays, packingDays: card.packingDays,
  });
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
