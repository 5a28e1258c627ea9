import { feedFor, type Feed } from "../extruder";
import { steinerVolume } from "../grow";
import type { MachiningPlan } from "../machining";
import { planLayers, type LayerPlan, type ShellSpec } from "../plan";
import type { CellParams, MaterialParams, PrintMode, RateCardParams, ShellPlanSummary } from "../types";
import type { Measured } from "./measure";
import type { GrownSections } from "./slice";

export interface BuildPlan {
  nearNetMm3: number;
  allowanceVolumeMm3: number;
  layers: LayerPlan;
  beadWidthMm: number;
  layerHeightMm: number;
  printMode: PrintMode;
  shellWalls: number | null;
  shell: ShellPlanSummary | null;
  /** Parts laid side by side per build, and builds for the order. */
  partsPerBuild: number;
  builds: number;
  /** Whole order, kg. */
  depositedKg: number;
  scrapKg: number;
  massKg: number;
  /** One machined part, kg. */
  partMassKg: number;
  machining: MachiningPlan;
  /** Whole order, h (deposition, and dwell between layers). */
  printHours: number;
  dwellHours: number;
  coolingHours: number;
  /** Whole order: layers outside the cooling window over all builds. */
  flaggedLayers: number;
  /** Sustained deposition of the cell for this material (extruder or dryer) and the drying it needs. */
  feed: Feed;
}

/** The shell figures the catalogue gives (rate card, with fallbacks for older rows). */
export interface ShellRules {
  shellNetWallMm: number;
  ribSpacingMm: number;
  ribBeads: number;
  skinLayers: number;
  maxBridgeMm: number;
}

/** Walls that hold the finish allowance plus the net wall left after machining: ⌈(t + net) ÷ bead⌉, at least 2. */
export function wallsForAllowance(allowanceMm: number, beadWidthMm: number, netWallMm: number): number {
  return Math.max(2, Math.ceil((allowanceMm + netWallMm) / beadWidthMm - 1e-9));
}

/**
 * Skin and support areas per layer. A layer's skin is the part of it that has no section above
 * (a top) or below (a bottom) within `skinLayers` layers: max(0, A_k − min A_j) over those
 * neighbours, outside the part counting as empty. Under a flat top wider than the bead bridges,
 * support ribs are corbelled out from the grid over half a rib spacing below the skin (45°
 * overhang, common practice), at the bridging span.
 */
export function shellExposure(area: Float64Array, skinLayers: number, layerHeightMm: number, rules: ShellRules): { skin: Float64Array; support: Float64Array; bridging: "direct" | "support-ribs" } {
  const n = area.length, s = Math.max(1, Math.round(skinLayers));
  const skin = new Float64Array(n), support = new Float64Array(n), topEdge = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let minUp = Infinity, minDown = Infinity;
    for (let j = 1; j <= s; j++) {
      minUp = Math.min(minUp, k + j < n ? area[k + j]! : 0);
      minDown = Math.min(minDown, k - j >= 0 ? area[k - j]! : 0);
    }
    const a = area[k]!;
    skin[k] = Math.min(a, Math.max(0, a - minUp, a - minDown));
    topEdge[k] = Math.max(0, a - (k + 1 < n ? area[k + 1]! : 0));
  }
  const bridging = rules.ribSpacingMm > rules.maxBridgeMm ? "support-ribs" : "direct";
  if (bridging === "support-ribs") {
    const reach = Math.max(1, Math.ceil(rules.ribSpacingMm / 2 / layerHeightMm));
    // sliding sum of the top exposures of the `reach` layers above k
    let sum = 0;
    for (let k = n - 1; k >= 0; k--) {
      support[k] = sum;
      sum += topEdge[k]!;
      if (k + reach < n) sum -= topEdge[k + reach]!;
    }
  }
  return { skin, support, bridging };
}

export interface PlanChoice {
  cell: CellParams;
  beadWidthMm: number;
  sections: GrownSections;
  printMode: PrintMode;
  /** Set by hand; null = from the allowance and the bead. */
  wallsOverride: number | null;
  partsPerBuild: number;
}

/**
 * Stage 5: layer times inside the cooling window, material and machining. The 2D offset of a
 * section misses the extra reach of sloped walls (the 3D offset is wider there), so the sliced
 * sum falls a little short of the Steiner volume. The sections are rescaled to the Steiner
 * total: the slices give the distribution over height, Steiner the amount, and mass and print
 * time then agree. Machining removes the allowance only, never a shell's inside.
 */
export function planStage(
  ms: Measured, pc: PlanChoice, material: MaterialParams, card: RateCardParams, rules: ShellRules,
  allowanceMm: number, quantity: number, machining: MachiningPlan,
): BuildPlan {
  const { cell, sections: sec } = pc;
  const w = pc.beadWidthMm, h = sec.layerHeightMm;
  const nearNet = steinerVolume(ms.volumeMm3, ms.m.areaMm2, ms.meanCurvatureMm, allowanceMm);
  const fill = sec.slicedVolumeMm3 > 0 ? nearNet / sec.slicedVolumeMm3 : 1;
  const planArea = fill === 1 ? sec.areaMm2 : sec.areaMm2.map((a) => a * fill);
  let shellSpec: ShellSpec | undefined;
  let shell: ShellPlanSummary | null = null;
  let walls: number | null = null;
  if (pc.printMode === "shell") {
    walls = pc.wallsOverride ?? wallsForAllowance(allowanceMm, w, rules.shellNetWallMm);
    const ex = shellExposure(planArea, rules.skinLayers, h, rules);
    shellSpec = { ribSpacingMm: rules.ribSpacingMm, ribBeads: rules.ribBeads, skinMm2: ex.skin, supportMm2: ex.support, supportSpacingMm: Math.max(w, rules.maxBridgeMm) };
    shell = {
      walls, wallThicknessMm: walls * w, ribSpacingMm: rules.ribSpacingMm, ribWidthMm: rules.ribBeads * w, skinLayers: rules.skinLayers,
      bridging: ex.bridging, wallsFromAllowance: pc.wallsOverride === null,
    };
  }
  const feed = feedFor(cell, material);
  // the planner caps the laying speed at this feed (the screw's output or what the dryer keeps dry)
  const fed = feed.kgPerH === cell.extruderOutputKgPerH ? cell : { ...cell, extruderOutputKgPerH: feed.kgPerH };
  const copies = Math.max(1, Math.min(pc.partsPerBuild, quantity));
  const builds = Math.ceil(quantity / copies);
  const lastCopies = quantity - (builds - 1) * copies;
  const plan = planLayers({ areaMm2: planArea, perimeterMm: sec.perimeterMm, segments: sec.segments, layerHeightMm: h, beadWidthMm: w, shellWalls: walls, cell: fed, material, shell: shellSpec, copies });
  // A last, smaller build (quantity not a multiple of the batch) is planned on its own.
  const last = lastCopies === copies ? plan : planLayers({ areaMm2: planArea, perimeterMm: sec.perimeterMm, segments: sec.segments, layerHeightMm: h, beadWidthMm: w, shellWalls: walls, cell: fed, material, shell: shellSpec, copies: lastCopies });
  const allowanceVolume = nearNet - ms.volumeMm3;
  const rho = material.densityGPerCm3 * 1e-6; // kg per mm³
  const perPartMm3 = walls === null ? nearNet : plan.depositedMm3 / copies;
  const depositedKg = perPartMm3 * rho * quantity;
  const scrapKg = depositedKg * card.startupScrapFraction;
  const massKg = depositedKg + card.purgeKg * builds + scrapKg;
  const partMassKg = Math.max(0, perPartMm3 * rho - allowanceVolume * rho);
  const coolingHours = Math.min(card.coolingHoursMax, card.coolingHoursBase + card.coolingHoursPerKg * (perPartMm3 * rho * copies));
  const printS = plan.printS * (builds - 1) + last.printS, dwellS = plan.dwellTotalS * (builds - 1) + last.dwellTotalS;
  return {
    nearNetMm3: nearNet, allowanceVolumeMm3: allowanceVolume, layers: plan, beadWidthMm: w, layerHeightMm: h,
    printMode: pc.printMode, shellWalls: walls, shell, partsPerBuild: copies, builds,
    depositedKg, scrapKg, massKg, partMassKg, machining,
    printHours: printS / 3600, dwellHours: dwellS / 3600, coolingHours,
    flaggedLayers: plan.flaggedCount * (builds - 1) + last.flaggedCount,
    feed,
  };
}
