"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { createMaintenanceBlock, deleteMaintenanceBlock, getMaintenanceBlock, listBookedBlocks, listMaintenanceBlocks } from "@/db/queries/capacity";
import { listCurrentCells } from "@/db/queries/catalogue";
import { formatDateTime } from "@/lib/dates";
import { ROUTER_KEY } from "@/lib/estimating/ledger";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";
import { instantOf, maintenanceBlockSchema, removeBlockSchema } from "@/lib/validation/admin-production";

/**
 * Take a printing cell or the router out of service for maintenance. Estimates place new work
 * around the block at once. Refused, with nothing written, when it has already ended, or when a
 * booked job holds the cell (print, cooling) or the router (machining) in that time: move the
 * job first.
 */
export const blockResource = defineAction({ access: "production:capacity", input: maintenanceBlockSchema }, async (input, { user, db }) => {
  const startsAt = instantOf(input.start), endsAt = instantOf(input.end);
  if (endsAt.getTime() <= Date.now()) throw new AppError("invalid_input:end", "That time has already passed; a block must end in the future. Nothing was changed.", { end: ["Pick an end from now on."] });
  const cells = await listCurrentCells(db);
  const name = input.resourceKey === ROUTER_KEY ? "the router" : cells.find((c) => c.key === input.resourceKey && c.isActive)?.params.name;
  if (!name) throw new AppError("not_found:cell", "That cell was not found or is out of service.", { resourceKey: ["Pick a cell or the router."] });
  const id = await db.transaction(async (tx) => {
    const clash = (await listBookedBlocks(tx, startsAt, endsAt)).find((b) => (input.resourceKey === ROUTER_KEY ? b.kind === "machining" : b.cellKey === input.resourceKey && (b.kind === "print" || b.kind === "cooling")));
    if (clash) throw new AppError("conflict:schedule", `${clash.reference}'s ${clash.kind} is booked on ${name} then (${formatDateTime(clash.startsAt)} – ${formatDateTime(clash.endsAt)}). Move the job first, or pick another time. Nothing was changed.`);
    const overlap = (await listMaintenanceBlocks(tx, startsAt, endsAt)).find((m) => m.resourceKey === input.resourceKey);
    if (overlap) throw new AppError("conflict:schedule", `${name} is already blocked then (${overlap.reason}, ${formatDateTime(overlap.startsAt)} – ${formatDateTime(overlap.endsAt)}). Nothing was changed.`);
    const created = await createMaintenanceBlock(tx, { resourceKey: input.resourceKey, startsAt, endsAt, reason: input.reason, createdById: user.id });
    await writeAudit(tx, { actorId: user.id, action: "capacity.block", entityType: "maintenance_block", entityId: created, after: { resourceKey: input.resourceKey, startsAt, endsAt, reason: input.reason } });
    return created;
  });
  revalidatePath("/admin/production/capacity");
  return { id };
});

/** Put a blocked cell or the router back in service. */
export const removeBlock = defineAction({ access: "production:capacity", input: removeBlockSchema }, async (input, { user, db }) => {
  const block = await getMaintenanceBlock(db, input.id);
  if (!block) throw new AppError("not_found:block", "That maintenance block was not found; it may have been removed already.");
  await db.transaction(async (tx) => {
    await deleteMaintenanceBlock(tx, input.id);
    await writeAudit(tx, { actorId: user.id, action: "capacity.unblock", entityType: "maintenance_block", entityId: input.id, before: { resourceKey: block.resourceKey, startsAt: block.startsAt, endsAt: block.endsAt, reason: block.reason } });
  });
  revalidatePath("/admin/production/capacity");
  return { removed: input.id };
});
