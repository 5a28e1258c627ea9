import type { Db } from "@/db/client";
import { getCurrentRateCard, listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";
import { listPartsWithAnalysis } from "@/db/queries/parts";
import type { Request } from "@/db/schema";
import { defaultRateCard } from "@/lib/estimating/defaults";
import { verticalCellOf } from "@/lib/estimating/orient";
import { cToF } from "@/lib/units";
import type { DraftInput } from "@/lib/validation/request";
import type { CatalogueForForm, PartFileState } from "./types";

/** The catalogue the form needs (plain params only). */
export async function loadFormCatalogue(db: Db, unitsPref: "mm" | "in"): Promise<CatalogueForForm> {
  const [materials, cells, card] = await Promise.all([listCurrentMaterials(db), listCurrentCells(db), getCurrentRateCard(db)]);
  return {
    materials: materials.map((m) => m.params),
    cells: cells.map((c) => ({ key: c.key, name: c.params.name, envelopeMm: c.params.envelopeMm, verticalEnvelopeMm: verticalCellOf(c.params)?.envelopeMm ?? null })),
    defaultAllowanceMm: (card?.params ?? defaultRateCard).defaultAllowanceMm,
    unitsPref,
  };
}

export function blankDraft(unitsPref: "mm" | "in"): DraftInput {
  return {
    project: { projectName: "", neededBy: "", cureProcess: "autoclave", cureTemp: "", cureTempUnit: unitsPref === "in" ? "F" : "C", partCtePpmPerK: "", isControlled: false, leadTime: "standard", notes: "" },
    parts: [],
  };
}

/** A saved draft as form values, in the user's units. */
export async function loadDraft(db: Db, req: Request, unitsPref: "mm" | "in"): Promise<{ values: DraftInput; files: Record<string, PartFileState> }> {
  const rows = await listPartsWithAnalysis(db, req.id);
  const f = unitsPref === "in";
  const values: DraftInput = {
    requestId: req.id,
    project: {
      projectName: req.projectName,
      neededBy: req.neededBy ? req.neededBy.toISOString().slice(0, 10) : "",
      cureProcess: req.cureProcess,
      cureTemp: req.cureTempC === null ? "" : f ? Math.round(cToF(req.cureTempC)) : req.cureTempC,
      cureTempUnit: f ? "F" : "C",
      partCtePpmPerK: req.partCtePpmPerK ?? "",
      isControlled: req.isControlled,
      leadTime: req.leadTime,
      notes: req.notes,
    },
    parts: rows.map(({ part: p }) => ({
      id: p.id,
      name: p.name,
      materialKey: p.materialKey,
      allowance: p.units === "in" ? Math.round((p.allowanceMm / 25.4) * 1000) / 1000 : p.allowanceMm,
      quantity: p.quantity,
      printMode: p.printMode,
      units: p.units,
      unitsConfirmed: p.unitsConfirmed,
      cellKey: p.cellKey ?? "",
      bodies: p.selectedBodies ?? null,
    })),
  };
  const files: Record<string, PartFileState> = {};
  for (const r of rows) {
    files[r.part.id] = {
      revisionId: r.revision?.id ?? null,
      fileName: r.revision?.fileName ?? null,
      revision: r.revision?.revision ?? null,
      analysisId: r.analysis?.id ?? null,
      error: r.part.fileProblem ?? null,
    };
  }
  return { values, files };
}
