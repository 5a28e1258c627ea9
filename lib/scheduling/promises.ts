import { placeJob, type JobSpec } from "../estimating/placement";
import type { Ledger } from "../estimating/ledger";
import { jobTail, REMOVAL_FALLBACK_H } from "../estimating/stages/schedule";
import type { CellParams, EstimateResult, RateCardParams } from "../estimating/types";

/**
 * A quoted job as the calendar would take it today, from its parts' stored estimates: each part
 * (or each piece of a split part) one print on its cell, with its set-up, drying, printing,
 * cooling, removal and machining; the parts placed in turn. Null when a part's cell has left the
 * catalogue.
 */
export function specFromEstimates(results: Pick<EstimateResult, "cell" | "printHours" | "dwellHours" | "coolingHours" | "machiningHours" | "drying" | "pieces" | "joint">[], cells: CellParams[], card: RateCardParams): JobSpec | null {
  const prints: JobSpec["prints"] = [];
  let joinHours = 0;
  for (const r of results) {
    const parts = r.pieces?.length ? r.pieces.map((p) => ({ cell: p.cell, hours: p.printHours + p.dwellHours, cooling: p.coolingHours, machining: p.machiningHours, drying: p.drying?.hours ?? 0 }))
      : [{ cell: r.cell, hours: r.printHours + r.dwellHours, cooling: r.coolingHours, machining: r.machiningHours, drying: r.drying?.hours ?? 0 }];
    for (const p of parts) {
      const cell = cells.find((c) => c.key === p.cell);
      if (!cell) return null;
      prints.push({ cellKey: cell.key, calendar: cell.calendar, setupHours: card.printSetupHours ?? 0, dryingHours: p.drying, printHours: p.hours, coolingHours: p.cooling, removalHours: card.removalHours ?? REMOVAL_FALLBACK_H, machiningHours: p.machining });
    }
    joinHours += r.joint?.hours ?? 0;
  }
  const first = cells.find((c) => c.key === prints[0]?.cellKey);
  return first ? { prints, joinHours, ...jobTail(first, card) } : null;
}

/** The ship date the calendar gives such a job now (the ledger is not changed). */
export function shipDateNow(ledger: Ledger, spec: JobSpec): string {
  return placeJob(ledger.fork(), spec).shipDate;
}
