import { canMelt } from "../extruder";
import { Ledger, ROUTER_KEY } from "../ledger";
import type { AnalyseInput } from "../analyse-input";
import type { MaterialParams, Orientation } from "../types";
import { bad } from "./read";
import { plantOf } from "./schedule";

/** Shell figures for a rate card saved before shells were planned (same values as the seed's). */
export const SHELL_FALLBACKS = { shellNetWallMm: 12.7, ribSpacingMm: 400, ribBeads: 1, skinLayers: 3, maxBridgeMm: 60 };

/**
 * What the search may use: the rate card's shell rules, the plant's calendar, the cells that can
 * melt the material, the booked calendar as a ledger, and an orientation asked for. A cell asked
 * for that cannot melt the material, no cell at all, or a queue naming an unknown resource or
 * negative hours: an input error.
 */
export function fitStage(input: AnalyseInput, material: MaterialParams) {
  const { options: o, catalogue: cat } = input;
  const card = cat.rateCard;
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
  return { rules, plant, cells, ledger, orientation };
}
