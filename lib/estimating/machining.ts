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
  /** The face lying on the bed (or start plate) in the chosen build, mm², and whether it is finished (only when asked). */
  bedFaceMm2: number;
  bedFaceFinished: boolean;
  /** Set-ups on the router: a second (the part flipped) when the bed face is finished too. */
  setups: number;
  /** Trim line cut along an open mold's edge, mm, and its hours. */
  trimLengthMm: number;
  trimHours: number;
  roughingHours: number;
  finishingHours: number;
  toolChangeHours: number;
  setupHours: number;
  stepoverMm: number;
  scallopMm: number;
  totalHours: number;
}

/** Trim feed along an open mold's edge when the card states none, mm/min (memory: a small end mill scribing a line on a router; common practice). */
export const TRIM_FEED_FALLBACK_MM_PER_MIN = 1500;

/** How the part is machined in one build: the face on the bed, and what the client asked for. */
export interface MachiningBuild {
  bedFaceMm2: number;
  allowanceMm: number;
  /** Finish the bed face too (the part is then flipped for a second set-up). */
  finishBedFace?: boolean;
  /** Trim line length for an open mold, mm (0 or absent: none). */
  trimLengthMm?: number;
}

/**
 * Machining the near-net print to net shape as it is done: roughing removes the allowance volume
 * at the card's removal rate; finishing covers the net surface at t = A / (s · f); plus tool
 * changes and a set-up from the rate card. The face printed on the bed is left as printed unless
 * the client asks for it finished (its allowance then stays on, bureau practice); asked, the part
 * is flipped for a second set-up and that face is roughed and finished too. An open mold gets its
 * trim line cut along its edge at the trim feed, with one more tool change.
 */
export function planMachining(allowanceVolumeMm3: number, netAreaMm2: number, card: RateCardParams, build?: MachiningBuild): MachiningPlan {
  const bed = build ? Math.max(0, Math.min(build.bedFaceMm2, netAreaMm2)) : 0;
  const finishBed = build ? Boolean(build.finishBedFace) : true;
  const leftOn = finishBed ? 0 : bed;
  const roughingHours = Math.max(0, allowanceVolumeMm3 - (build ? leftOn * build.allowanceMm : 0)) / card.roughingRemovalMm3PerMin / 60;
  const s = stepoverForScallop(card.cutterRadiusMm, card.targetScallopMm);
  const finishingHours = (netAreaMm2 - leftOn) / (s * card.finishingFeedMmPerMin) / 60;
  const trimLengthMm = Math.max(0, build?.trimLengthMm ?? 0);
  const trimHours = trimLengthMm > 0 ? trimLengthMm / (card.trimFeedMmPerMin ?? TRIM_FEED_FALLBACK_MM_PER_MIN) / 60 : 0;
  const toolChangeHours = ((card.toolChangeCount + (trimLengthMm > 0 ? 1 : 0)) * card.toolChangeMinutes) / 60;
  const setups = build && finishBed ? 2 : 1;
  const setupHours = card.machiningSetupHours * setups;
  return {
    bedFaceMm2: bed, bedFaceFinished: finishBed, setups, trimLengthMm, trimHours,
    roughingHours, finishingHours, toolChangeHours, setupHours,
    stepoverMm: s, scallopMm: scallopHeight(card.cutterRadiusMm, s),
    totalHours: roughingHours + finishingHours + trimHours + toolChangeHours + setupHours,
  };
}
