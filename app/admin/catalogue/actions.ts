"use server";

import { revalidatePath } from "next/cache";
import { saveCellVersion, saveMaterialVersion, saveRateCardVersion } from "@/db/queries/admin-catalogue";
import { writeAudit } from "@/db/queries/audit";
import { AppError } from "@/lib/errors";
import { anyRecord, defineAction } from "@/lib/server/define-action";
import { fieldErrorsOf } from "@/lib/validation/form";
import { setModelRetentionDays } from "@/db/queries/retention";
import { RETENTION_DAYS_MAX, RETENTION_DAYS_MIN } from "@/lib/retention/policy";
import { z } from "zod";
import { getCurrentRateCard, listCurrentCells, listCurrentMaterials } from "@/db/queries/catalogue";
import { freightRulesSchema } from "@/lib/validation/freight-zones";
import { cellSchema, materialSchema, rateCardSchema, toCellParams, toMaterialParams, toRateCardParams } from "@/lib/validation/admin-catalogue";

/** A refused edit leads with its first problem; every field's problems show beside it. */
const refuse = (error: { issues: { path: PropertyKey[]; message: string }[] }) => new AppError("invalid_input", error.issues[0]?.message ?? "Check the highlighted fields.", fieldErrorsOf(error));

/** A material edit: version n+1 becomes current; quotes keep the version they were made with. */
export const saveMaterial = defineAction({ access: "admin:catalogue", input: anyRecord(materialSchema), invalid: refuse }, async (input, { user, db }) => {
  // The form does not edit the extruder family; a new version keeps the current one's.
  const current = (await listCurrentMaterials(db, { activeOnly: false })).find((m) => m.key === input.key);
  const params = { ...toMaterialParams(input), ...(current?.params.family ? { family: current.params.family } : {}) };
  const isActive = Boolean((input as Record<string, unknown>).isActive);
  const r = await db.transaction(async (tx) => {
    const saved = await saveMaterialVersion(tx, params, isActive, user.id);
    await writeAudit(tx, { actorId: user.id, action: "material.version", entityType: "material", entityId: params.key, before: saved.before?.params ?? null, after: { version: saved.after.version, isActive, ...params } });
    return saved.after;
  });
  revalidatePath("/admin/catalogue");
  return { version: r.version };
});

export const saveCell = defineAction({ access: "admin:catalogue", input: anyRecord(cellSchema), invalid: refuse }, async (input, { user, db }) => {
  // The form edits the envelope, speeds and calendar; the screw, outputs by family, melt limit,
  // dryers and vertical printing stay as the current version has them.
  const current = (await listCurrentCells(db, { activeOnly: false })).find((c) => c.key === input.key)?.params;
  const kept = current ? Object.fromEntries((["screwMm", "outputKgPerHByFamily", "maxMeltTempC", "dryer", "verticalPrint"] as const).filter((k) => current[k] !== undefined).map((k) => [k, current[k]])) : {};
  const params = { ...toCellParams(input), ...kept };
  if (!params.beadWidthsMm.includes(params.defaultBeadWidthMm)) throw new AppError("invalid_input", "The default bead width must be one of the bead widths.", { defaultBeadWidthMm: ["Pick one of the bead widths."] });
  if (!params.layerHeightsMm.includes(params.defaultLayerHeightMm)) throw new AppError("invalid_input", "The default layer height must be one of the layer heights.", { defaultLayerHeightMm: ["Pick one of the layer heights."] });
  const isActive = Boolean((input as Record<string, unknown>).isActive);
  const r = await db.transaction(async (tx) => {
    const saved = await saveCellVersion(tx, params, isActive, user.id);
    await writeAudit(tx, { actorId: user.id, action: "cell.version", entityType: "cell", entityId: params.key, before: saved.before?.params ?? null, after: { version: saved.after.version, isActive, ...params } });
    return saved.after;
  });
  revalidatePath("/admin/catalogue");
  return { version: r.version };
});

/** A new rate card version; every constant the estimator uses, none negative. */
export const saveRateCard = defineAction({ access: "admin:catalogue", input: anyRecord(rateCardSchema), invalid: refuse }, async (input, { user, db }) => {
  // The generic form carries the card's flat fields; the freight table has its own form and stays as it was.
  const current = await getCurrentRateCard(db);
  const params = { ...toRateCardParams(input), ...(current?.params.freight ? { freight: current.params.freight } : {}) };
  if (params.coolingHoursMax < params.coolingHoursBase) throw new AppError("invalid_input", "The cooling cap is below the cooling base.", { coolingHoursMax: ["At least the cooling base."] });
  const r = await db.transaction(async (tx) => {
    const saved = await saveRateCardVersion(tx, params, user.id);
    await writeAudit(tx, { actorId: user.id, action: "rate_card.version", entityType: "rate_card", entityId: saved.after.id, before: saved.before?.params ?? null, after: { version: saved.after.version, ...params } });
    return saved.after;
  });
  revalidatePath("/admin/catalogue");
  return { version: r.version };
});

const retentionSchema = z.object({ days: z.coerce.number().int("Whole days.").min(RETENTION_DAYS_MIN, `At least ${RETENTION_DAYS_MIN} days.`).max(RETENTION_DAYS_MAX, `At most ${RETENTION_DAYS_MAX} days.`) });

/** How long clients' model files are kept after an order finishes; shown to clients; audited. */
export const saveModelRetention = defineAction({ access: "admin:catalogue", input: anyRecord(retentionSchema), invalid: refuse }, async (input, { user, db }) => {
  await setModelRetentionDays(db, { days: input.days, actorId: user.id, now: new Date() });
  revalidatePath("/admin/catalogue");
  return { days: input.days };
});

/** The destination zone table: a new rate card version with the table replaced, the rest kept. */
export const saveFreightZones = defineAction({ access: "admin:catalogue", input: freightRulesSchema, invalid: refuse }, async (input, { user, db }) => {
  const current = await getCurrentRateCard(db);
  if (!current) throw new AppError("conflict", "There is no rate card to add the freight table to.");
  const params = { ...current.params, freight: input };
  const r = await db.transaction(async (tx) => {
    const saved = await saveRateCardVersion(tx, params, user.id);
    await writeAudit(tx, { actorId: user.id, action: "rate_card.version", entityType: "rate_card", entityId: saved.after.id, before: current.params.freight ?? null, after: { version: saved.after.version, freight: input } });
    return saved.after;
  });
  revalidatePath("/admin/catalogue");
  return { version: r.version };
});
