import { price, type Pricing } from "../pricing";
import type { MaterialParams, RateCardParams } from "../types";
import type { Measured } from "./measure";
import type { BuildPlan } from "./plan";

/** Stage 6: cost lines, margin, tax and deposit for the order's quantity. */
export function priceStage(ms: Measured, bp: BuildPlan, material: MaterialParams, card: RateCardParams, quantity: number, options: { sealingCoat?: boolean; vacuumTest?: boolean }): Pricing {
  const crateSize = ms.grownSize.map((v) => v + 2 * card.cratePaddingMm) as [number, number, number];
  return price({
    quantity, massKg: bp.massKg, materialPricePerKgCents: material.pricePerKgCents, printHours: bp.printHours, dwellHours: bp.dwellHours,
    machiningHours: bp.machining.totalHours, netAreaMm2: ms.m.areaMm2, crateSizeMm: crateSize, partMassKg: bp.partMassKg,
    options,
  }, card);
}
