import type { RateCardParams } from "./types";

/**
 * Scallop (cusp) height of a ball cutter of radius R at stepover s on a flat:
 * h = R − √(R² − (s/2)²) (Machinery's Handbook, second-hand citation).
 */
export function scallopHeight(radiusMm: number, stepoverMm: number): number {
  return radiusMm - Math.sqrt(radiusMm * radiusMm - (stepoverMm / 2) ** 2);
}

/** Stepover for a target scallop height: s = 2√(2Rh − h²). */
export function stepoverForScallop(radiusMm: number, scallopMm: number): number {
  const h = Math.min(scallopMm, radiusMm);
  return 2 * Math.sqrt(2 * radiusMm * h - h * h);
}

export interface MachiningPlan {
  roughingHours: number;
  finishingHours: number;
  toolChangeHours: number;
  setupHours: number;
  stepoverMm: number;
  scallopMm: number;
  totalHours: number;
}

/**
 * Machining the near-net print to net shape: roughing removes the allowance volume at the
 * card's removal rate; finishing covers the net surface at t = A / (s · f); plus tool changes
 * and setup from the rate card.
 */
export function planMachining(allowanceVolumeMm3: number, netAreaMm2: number, card: RateCardParams): MachiningPlan {
  const roughingHours = Math.max(0, allowanceVolumeMm3) / card.roughingRemovalMm3PerMin / 60;
  const s = stepoverForScallop(card.cutterRadiusMm, card.targetScallopMm);
  const finishingHours = netAreaMm2 / (s * card.finishingFeedMmPerMin) / 60;
  const toolChangeHours = (card.toolChangeCount * card.toolChangeMinutes) / 60;
  const setupHours = card.machiningSetupHours;
  return {
    roughingHours, finishingHours, toolChangeHours, setupHours,
    stepoverMm: s, scallopMm: scallopHeight(card.cutterRadiusMm, s),
    totalHours: roughingHours + finishingHours + toolChangeHours + setupHours,
  };
}
