import { steinerVolume } from "../grow";
import { planMachining, type MachiningPlan } from "../machining";
import { planLayers, type LayerPlan } from "../plan";
import type { CellParams, EstimateWarning, MaterialParams, RateCardParams } from "../types";
import type { Measured } from "./measure";
import type { GrownSections } from "./slice";

export interface BuildPlan {
  nearNetMm3: number;
  allowanceVolumeMm3: number;
  layers: LayerPlan;
  beadWidthMm: number;
  /** Per part, kg. */
  depositedKg: number;
  scrapKg: number;
  massKg: number;
  partMassKg: number;
  machining: MachiningPlan;
  /** Per part, h. */
  printHours: number;
  dwellHours: number;
  coolingHours: number;
}

/**
 * Stage 5: layer times inside the cooling window, material and machining. The 2D offset of a
 * section misses the extra reach of sloped walls (the 3D offset is wider there), so the sliced
 * sum falls a little short of the Steiner volume. The sections are rescaled to the Steiner
 * total: the slices give the distribution over height, Steiner the amount, and mass and print
 * time then agree.
 */
export function planStage(
  ms: Measured, sec: GrownSections, cell: CellParams, material: MaterialParams, card: RateCardParams,
  allowanceMm: number, shellWalls: number | null, warnings: EstimateWarning[],
): BuildPlan {
  const w = cell.defaultBeadWidthMm, h = sec.layerHeightMm;
  const nearNet = steinerVolume(ms.volumeMm3, ms.m.areaMm2, ms.meanCurvatureMm, allowanceMm);
  const fill = sec.slicedVolumeMm3 > 0 ? nearNet / sec.slicedVolumeMm3 : 1;
  const planArea = fill === 1 ? sec.areaMm2 : sec.areaMm2.map((a) => a * fill);
  const plan = planLayers({ areaMm2: planArea, perimeterMm: sec.perimeterMm, layerHeightMm: h, beadWidthMm: w, shellWalls, cell, material });
  if (plan.extruderLimited) warnings.push({ code: "extruder-limited", message: `The ${cell.name} extruder cannot feed this bead at the cell's minimum speed; deposition is capped at its output.` });
  if (plan.flaggedCount > 0) {
    warnings.push({ code: "layers-too-long", message: `${plan.flaggedCount} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}: the layer below cools too far and may bond poorly. Consider shell walls, a larger bead, a split, or interlayer heating.` });
  }
  const allowanceVolume = nearNet - ms.volumeMm3;
  const rho = material.densityGPerCm3 * 1e-6; // kg per mm³
  const depositedKg = (shellWalls === null ? nearNet : plan.depositedMm3) * rho;
  const scrapKg = depositedKg * card.startupScrapFraction;
  const massKg = depositedKg + card.purgeKg + scrapKg;
  const partMassKg = Math.max(0, depositedKg - allowanceVolume * rho);
  const machining = planMachining(allowanceVolume, ms.m.areaMm2, card);
  const coolingHours = Math.min(card.coolingHoursMax, card.coolingHoursBase + card.coolingHoursPerKg * depositedKg);
  return {
    nearNetMm3: nearNet, allowanceVolumeMm3: allowanceVolume, layers: plan, beadWidthMm: w,
    depositedKg, scrapKg, massKg, partMassKg, machining,
    printHours: plan.printS / 3600, dwellHours: plan.dwellTotalS / 3600, coolingHours,
  };
}
