import type { EstimateWarning, MaterialParams } from "./types";

/**
 * Warnings about a material choice. Printed polymer tools are used below about Tg − 20…30 °C
 * (common practice; the catalogue's `maxServiceTempC`). A tool whose expansion is far from the
 * laid-up part's warps the part on cure: carbon laminate ≈ 2–4 ppm/K, printed CF-ABS ≈ 5–15 along
 * the bead and 60–100+ across (memory, checks.md). The 15 ppm/K threshold is bureau practice.
 */
export const CTE_MISMATCH_PPM_PER_K = 15;

export function materialWarnings(m: MaterialParams, use: { cureTempC?: number; partCtePpmPerK?: number }): EstimateWarning[] {
  const out: EstimateWarning[] = [];
  if (use.cureTempC !== undefined) {
    if (use.cureTempC > m.maxServiceTempC) {
      out.push({ code: "material-temperature", message: `${m.name} is rated to ${m.maxServiceTempC} °C in service (Tg ≈ ${m.glassTransitionC} °C); a ${use.cureTempC} °C cure can soften or distort the tool. Choose a higher-temperature material.` });
    } else if (use.cureTempC > m.maxServiceTempC - 10) {
      out.push({ code: "material-temperature-near", message: `A ${use.cureTempC} °C cure is within 10 °C of ${m.name}'s ${m.maxServiceTempC} °C service limit.` });
    }
  }
  if (use.partCtePpmPerK !== undefined) {
    const d = m.cteAlongPpmPerK - use.partCtePpmPerK;
    if (Math.abs(d) > CTE_MISMATCH_PPM_PER_K) {
      out.push({ code: "material-cte", message: `${m.name} expands ${m.cteAlongPpmPerK} ppm/K along the bead (${m.cteAcrossPpmPerK} across) against the part's ${use.partCtePpmPerK} ppm/K: the part may warp on cure.` });
    }
  }
  return out;
}
