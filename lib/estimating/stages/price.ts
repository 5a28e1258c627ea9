import { price, type Pricing } from "../pricing";
import type { CellParams, MaterialParams, RateCardParams } from "../types";
import type { Measured } from "./measure";
import type { BuildPlan } from "./plan";

/** Stage 6: cost lines (print time at the cell's own hourly rate), margin, tax and deposit for the order. */
export function priceStage(ms: Measured, bp: BuildPlan, cell: CellParams, material: MaterialParams, card: RateCardParams, quantity: number, options: { sealingCoat?: boolean; vacuumTest?: boolean; freightZone?: string | null }): Pricing {
  const crateSize = ms.grownSize.map((v) => v + 2 * card.cratePaddingMm) as [number, number, number];
  // price() takes per-part figures and multiplies by the quantity; the plan's are whole-order sums
  return price({
    quantity, massKg: bp.massKg / quantity, materialPricePerKgCents: material.pricePerKgCents,
    printHours: bp.printHours / quantity, dwellHours: bp.dwellHours / quantity, printRateCentsPerH: cellPrintRate(cell, card),
    machiningHours: bp.machining.totalHours, netAreaMm2: ms.m.areaMm2, crateSizeMm: crateSize, partMassKg: bp.partMassKg,
    options: { sealingCoat: options.sealingCoat, vacuumTest: options.vacuumTest }, freightZone: options.freightZone,
  }, card);
}

/** The cell's hourly print rate, or the rate card's for a cell saved before cells had their own. */
export function cellPrintRate(cell: CellParams, card: RateCardParams): number {
  return cell.printRateCentsPerH ?? card.printRateCentsPerH;
}
