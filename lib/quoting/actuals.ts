import "server-only";
import { errorStats } from "./stats";
import type { EstimateResult } from "@/lib/estimating/types";
import type { Db } from "@/db/client";
import { listOrdersWithActuals, partsWithEstimates } from "@/db/queries/orders";

const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : 0);

/** The estimate's figures for a set of parts: print (deposition + dwell), kg and machining hours, × quantity. */
export function estimateTotals(parts: { quantity: number; estimate: Partial<Pick<EstimateResult, "printHours" | "dwellHours" | "massKg" | "machiningHours">> | null }[]) {
  let printHours = 0, massKg = 0, machiningHours = 0, complete = true;
  for (const p of parts) {
    if (!p.estimate) {
      complete = false;
      continue;
    }
    const q = Math.max(1, p.quantity);
    printHours += (num(p.estimate.printHours) + num(p.estimate.dwellHours)) * q;
    massKg += num(p.estimate.massKg) * q;
    machiningHours += num(p.estimate.machiningHours) * q;
  }
  return { printHours, massKg, machiningHours, complete };
}

/** Actual against estimate per order, and the error's mean and spread per material. */
export async function actualVsEstimate(db: Db) {
  const rows = await listOrdersWithActuals(db);
  const perOrder = [];
  const byMaterial = new Map<string, { print: { estimate: number; actual: number }[]; kg: { estimate: number; actual: number }[]; machining: { estimate: number; actual: number }[] }>();
  for (const r of rows) {
    const parts = await partsWithEstimates(db, r.requestId);
    const est = estimateTotals(parts);
    // By the material's name as the estimate recorded it (the catalogue key when there is none).
    const material = [...new Set(parts.map((p) => p.estimate?.material?.name ?? p.materialKey))].join(" + ");
    perOrder.push({ ...r, material, estimate: est });
    const bucket = byMaterial.get(material) ?? { print: [], kg: [], machining: [] };
    if (r.actualPrintHours != null) bucket.print.push({ estimate: est.printHours, actual: r.actualPrintHours });
    if (r.actualMaterialKg != null) bucket.kg.push({ estimate: est.massKg, actual: r.actualMaterialKg });
    if (r.actualMachiningHours != null) bucket.machining.push({ estimate: est.machiningHours, actual: r.actualMachiningHours });
    byMaterial.set(material, bucket);
  }
  const perMaterial = [...byMaterial.entries()].map(([material, b]) => ({
    material,
    print: errorStats(b.print),
    kg: errorStats(b.kg),
    machining: errorStats(b.machining),
  }));
  return { perOrder, perMaterial };
}
