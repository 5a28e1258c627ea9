import { canMelt } from "../extruder";
import { r2 } from "../round";
import type { AnalyseOptions } from "../analyse-input";
import type { CellParams, EstimateWarning, MaterialParams, RateCardParams } from "../types";
import { materialWarnings } from "../warnings";
import type { Choice } from "./choose";

/**
 * The chosen build's warnings (feed capped, layers outside the cooling window, the material's
 * expansion and rating) and the cautions printed with it (a heavy part, hot parts and sharp chips,
 * a mold run above its material's rating). Returns whether the part needs a lifting caution.
 */
export function noticesFor(
  x: { choice: Choice; material: MaterialParams; materials: MaterialParams[]; cells: CellParams[]; options: AnalyseOptions; quantity: number; card: RateCardParams; netSize: number[] },
  warnings: EstimateWarning[],
  cautions: string[],
): boolean {
  const { choice, material, materials, cells, options, quantity, card, netSize } = x;
  const c = choice.chosen, bp = c.bp, cell = c.cell, plan = bp.layers;

  if (plan.extruderLimited) {
    warnings.push({ code: "extruder-limited", message: bp.feed.limitedBy === "dryer"
      ? `The ${cell.name} dryer keeps only ${r2(bp.feed.kgPerH)} kg/h of ${material.name} dry, too little for this bead at the cell's minimum speed; deposition is capped there.`
      : `The ${cell.name} extruder cannot feed this bead at the cell's minimum speed; deposition is capped at its output.` });
  }
  if (bp.flaggedLayers > 0) {
    warnings.push({ code: "layers-too-long", message: `${bp.flaggedLayers} layers take longer than the ${material.maxLayerTimeS} s cooling window of ${material.name}: the layer below cools too far and may bond poorly. The search tried shell walls, every bead/layer preset and cell; the bureau's engineer will plan a split or interlayer heating.` });
  }
  const { depositedKg, partMassKg } = bp;

  // expansion in the chosen build: across the beads along the build direction, along them in the layers
  const upIndex = { x: 0, y: 1, z: 2 }[c.orientation.up];
  const spans = { acrossBeadMm: netSize[upIndex]!, alongBeadMm: Math.max(...netSize.filter((_, i) => i !== upIndex)), vertical: c.vertical };
  warnings.push(...materialWarnings(material, { cureTempC: options.cureTempC, partCtePpmPerK: options.partCtePpmPerK }, spans, materials.filter((x) => cells.some((cl) => canMelt(cl, x)))));
  const liftingCaution = partMassKg > card.liftingCautionKg;
  if (liftingCaution) {
    // what is lifted at delivery is the machined part; the print weighs more until machined
    cautions.push(`Heavy part: about ${r2(partMassKg)} kg (${r2(partMassKg / 0.45359237)} lb) machined, about ${r2(depositedKg / quantity)} kg as printed. Lift it with equipment rated for the load and follow local codes and licensed rigging practice.`);
  }
  cautions.push("Printed parts stay hot for hours after printing, and machining chips are sharp: wear gloves and eye protection when handling at pickup.");
  if (options.cureTempC !== undefined && options.cureTempC > material.maxServiceTempC) {
    cautions.push(`A mold used above its material's service temperature (${material.maxServiceTempC} °C for ${material.name}) can deform or fail under autoclave pressure; the customer's own engineering sign-off decides its use.`);
  }
  return liftingCaution;
}
