"use server";

import { revalidatePath } from "next/cache";
import { getDb } from "@/db/client";
import { saveCellVersion, saveMaterialVersion, saveRateCardVersion } from "@/db/queries/admin-catalogue";
import { writeAudit } from "@/db/queries/audit";
import { requirePermission } from "@/lib/auth/guard";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { cellSchema, materialSchema, rateCardSchema, toCellParams, toMaterialParams, toRateCardParams } from "@/lib/validation/admin-catalogue";

type Saved = ActionResult<{ version: number }>;

function fieldErrors(error: { issues: { path: PropertyKey[]; message: string }[] }) {
  const out: Record<string, string[]> = {};
  for (const i of error.issues) (out[String(i.path[0] ?? "form")] ??= []).push(i.message);
  return out;
}

function refuse(error: { issues: { path: PropertyKey[]; message: string }[] }): never {
  throw new AppError("invalid_input", error.issues[0]?.message ?? "Check the highlighted fields.", fieldErrors(error));
}

/** A material edit: version n+1 becomes current; quotes keep the version they were made with. */
export async function saveMaterial(raw: Record<string, unknown>): Promise<Saved> {
  try {
    const parsed = materialSchema.safeParse(raw);
    if (!parsed.success) refuse(parsed.error);
    const user = await requirePermission("admin:catalogue");
    const params = toMaterialParams(parsed.data);
    const isActive = Boolean((parsed.data as Record<string, unknown>).isActive);
    const r = await getDb().transaction(async (tx) => {
      const saved = await saveMaterialVersion(tx, params, isActive, user.id);
      await writeAudit(tx, { actorId: user.id, action: "material.version", entityType: "material", entityId: params.key, before: saved.before?.params ?? null, after: { version: saved.after.version, isActive, ...params } });
      return saved.after;
    });
    revalidatePath("/admin/catalogue");
    return { ok: true, data: { version: r.version } };
  } catch (e) {
    return toActionError(e);
  }
}

export async function saveCell(raw: Record<string, unknown>): Promise<Saved> {
  try {
    const parsed = cellSchema.safeParse(raw);
    if (!parsed.success) refuse(parsed.error);
    const user = await requirePermission("admin:catalogue");
    const params = toCellParams(parsed.data);
    if (!params.beadWidthsMm.includes(params.defaultBeadWidthMm)) throw new AppError("invalid_input", "The default bead width must be one of the bead widths.", { defaultBeadWidthMm: ["Pick one of the bead widths."] });
    if (!params.layerHeightsMm.includes(params.defaultLayerHeightMm)) throw new AppError("invalid_input", "The default layer height must be one of the layer heights.", { defaultLayerHeightMm: ["Pick one of the layer heights."] });
    const isActive = Boolean((parsed.data as Record<string, unknown>).isActive);
    const r = await getDb().transaction(async (tx) => {
      const saved = await saveCellVersion(tx, params, isActive, user.id);
      await writeAudit(tx, { actorId: user.id, action: "cell.version", entityType: "cell", entityId: params.key, before: saved.before?.params ?? null, after: { version: saved.after.version, isActive, ...params } });
      return saved.after;
    });
    revalidatePath("/admin/catalogue");
    return { ok: true, data: { version: r.version } };
  } catch (e) {
    return toActionError(e);
  }
}

/** A new rate card version; every constant the estimator uses, none negative. */
export async function saveRateCard(raw: Record<string, unknown>): Promise<Saved> {
  try {
    const parsed = rateCardSchema.safeParse(raw);
    if (!parsed.success) refuse(parsed.error);
    const user = await requirePermission("admin:catalogue");
    const params = toRateCardParams(parsed.data);
    if (params.coolingHoursMax < params.coolingHoursBase) throw new AppError("invalid_input", "The cooling cap is below the cooling base.", { coolingHoursMax: ["At least the cooling base."] });
    const r = await getDb().transaction(async (tx) => {
      const saved = await saveRateCardVersion(tx, params, user.id);
      await writeAudit(tx, { actorId: user.id, action: "rate_card.version", entityType: "rate_card", entityId: saved.after.id, before: saved.before?.params ?? null, after: { version: saved.after.version, ...params } });
      return saved.after;
    });
    revalidatePath("/admin/catalogue");
    return { ok: true, data: { version: r.version } };
  } catch (e) {
    return toActionError(e);
  }
}
