import type { EstimateWarning, MaterialParams } from "./types";

/**
 * Warnings about a material choice. Printed polymer tools are used below about Tg − 20…30 °C
 * (common practice; the catalogue's `maxServiceTempC`). A tool whose expansion is far from the
 * laid-up part's warps the part on cure: carbon laminate ≈ 2–4 ppm/K, printed CF-ABS ≈ 5–15 along
 * the bead and 60–100+ across (memory, checks.md). The 15 ppm/K threshold is bureau practice.
 */
export const CTE_MISMATCH_PPM_PER_K = 15;

/** Room temperature the tool is laid up at, °C, and the cure assumed when none is stated (an oven cure ≈ 120 °C; common practice). */
export const LAYUP_TEMP_C = 20;
export const DEFAULT_CURE_C = 120;
/** Growth of the tool past the part over a span on cure, mm, above which the expansion warning shows (bureau practice, invented). */
export const CTE_GROWTH_LIMIT_MM = 0.5;

/** The chosen build, as the warnings see it: the net span along the build direction (across the beads) and in the layers (along them). */
export interface BuildSpans {
  acrossBeadMm: number;
  alongBeadMm: number;
  vertical: boolean;
}

/**
 * Warnings about a material choice; with `build`, the expansion in the chosen orientation (along
 * the beads in the layers' plane, across them along the build direction) and, with `others`, the
 * catalogue's materials rated for the stated cure.
 */
export function materialWarnings(m: MaterialParams, use: { cureTempC?: number; partCtePpmPerK?: number }, build?: BuildSpans, others: MaterialParams[] = []): EstimateWarning[] {
  const out: EstimateWarning[] = [];
  if (use.cureTempC !== undefined) {
    if (use.cureTempC > m.maxServiceTempC) {
      const rated = others.filter((x) => x.key !== m.key && x.maxServiceTempC >= use.cureTempC!).sort((a, b) => a.pricePerKgCents - b.pricePerKgCents);
      const choose = rated.length ? ` Rated for it: ${rated.map((x) => `${x.name} (to ${x.maxServiceTempC} °C)`).join(", ")}.` : others.length ? " No material in the catalogue is rated for it; the bureau's engineer will advise." : " Choose a higher-temperature material.";
      out.push({ code: "material-temperature", message: `${m.name} is rated to ${m.maxServiceTempC} °C in service (Tg ≈ ${m.glassTransitionC} °C); a ${use.cureTempC} °C cure can soften or distort the tool.${choose}` });
    } else if (use.cureTempC > m.maxServiceTempC - 10) {
      out.push({ code: "material-temperature-near", message: `A ${use.cureTempC} °C cure is within 10 °C of ${m.name}'s ${m.maxServiceTempC} °C service limit.` });
    }
  }
  if (use.partCtePpmPerK !== undefined) {
    const d = m.cteAlongPpmPerK - use.partCtePpmPerK;
    if (Math.abs(d) > CTE_MISMATCH_PPM_PER_K) {
      out.push({ code: "material-cte", message: `${m.name} expands ${m.cteAlongPpmPerK} ppm/K along the bead (${m.cteAcrossPpmPerK} across) against the part's ${use.partCtePpmPerK} ppm/K: the part may warp on cure.` });
    }
    if (build) {
      // growth past the part over the span across the beads: Δα · ΔT · L (linear expansion)
      const dT = (use.cureTempC ?? DEFAULT_CURE_C) - LAYUP_TEMP_C;
      const growth = Math.abs(m.cteAcrossPpmPerK - use.partCtePpmPerK) * 1e-6 * dT * build.acrossBeadMm;
      if (growth > CTE_GROWTH_LIMIT_MM) {
        const mm = Math.round(growth * 10) / 10;
        out.push({
          code: "material-cte-across",
          message: `Built ${build.vertical ? "vertically" : "this way"}, ${Math.round(build.acrossBeadMm)} mm of the tool runs across the beads, where ${m.name} expands ${m.cteAcrossPpmPerK} ppm/K against the part's ${use.partCtePpmPerK}: about ${mm} mm more than the part from ${LAYUP_TEMP_C} °C to a ${use.cureTempC ?? DEFAULT_CURE_C} °C cure${use.cureTempC === undefined ? " (assumed)" : ""}. The bureau's engineer may turn the build or compensate the surface.`,
        });
      }
    }
  }
  return out;
}
