"use server";

import { revalidatePath } from "next/cache";
import { writeAudit } from "@/db/queries/audit";
import { getCurrentCell } from "@/db/queries/admin-catalogue";
import { OFF_THE_CALENDAR } from "@/db/queries/capacity";
import { getCurrentRateCard } from "@/db/queries/catalogue";
import { getOrderForProduction, listCellBlocks, saveSchedule } from "@/db/queries/orders";
import { recordShipDateChange } from "@/db/queries/ship-dates";
import { notifyShipDateChanged } from "@/lib/email/notify";
import { plantOf } from "@/lib/estimating/stages/schedule";
import { formatDateTime } from "@/lib/dates";
import { AppError } from "@/lib/errors";
import { jobDurations, type Block } from "@/lib/scheduling/blocks";
import { durationsFromBlocks, moveJob, workingDaysMoved } from "@/lib/scheduling/reschedule";
import { defineAction } from "@/lib/server/define-action";
import { instantOf, moveJobSchema } from "@/lib/validation/admin-production";

/** Stages in which a job holds its booked blocks and may still be moved. */
const MOVABLE = new Set<string>(["scheduled", "printing", "cooling", "machining", "on_hold"]);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : 0);

/**
 * Move a booked job to a new print start (a delay, or earlier when the job ahead finished early).
 * Jobs on the cell it would now overlap are pushed back behind it, in order; every order whose
 * planned ship moves gets a dated change with the reason on its timeline, and its client an
 * e-mail with the old and new date when it moves by a working day or more. A start in the past
 * is refused and nothing changes.
 */
export const moveBookedJob = defineAction({ access: "production:schedule", input: moveJobSchema }, async (input, { user, db }) => {
  const now = new Date();
  const start = instantOf(input.start);
  if (start.getTime() < now.getTime() - 60_000) {
    throw new AppError("invalid_input:start", `${formatDateTime(start)} has passed; a job can be moved to now or later. Nothing was changed.`, { start: ["Pick a start from now on."] });
  }
  const order = await getOrderForProduction(db, input.orderId);
  if (!order) throw new AppError("not_found:order", "That order was not found.");
  const cellKey = order.order.cellKey;
  if (!MOVABLE.has(order.request.stage) || !cellKey || order.blocks.length === 0) {
    throw new AppError("conflict:stage", "Only a job booked on a cell and not yet past machining can be moved; schedule it first.");
  }
  const cell = await getCurrentCell(db, cellKey);
  const card = await getCurrentRateCard(db);
  if (!cell || !card) throw new AppError("unavailable", "The cell or the rate card is missing from the catalogue.");
  const cal = cell.params.calendar;
  const finishingDays = card.params.finishingDays + card.params.inspectionDays + card.params.packingDays;
  const missing = order.parts.filter((p) => !p.estimate);
  const durations = missing.length
    ? durationsFromBlocks(order.blocks, cal, finishingDays)
    : jobDurations(order.parts.map((p) => ({ printHours: num(p.estimate!.printHours), dwellHours: num(p.estimate!.dwellHours), coolingHours: num(p.estimate!.coolingHours), machiningHours: num(p.estimate!.machiningHours), quantity: p.quantity })), finishingDays);
  const plant = plantOf(card.params);

  const changes = await db.transaction(async (tx) => {
    const far = new Date(now.getTime() + 400 * 86_400_000);
    const onCell = (await listCellBlocks(tx, cellKey, now, far)).filter((b) => !(OFF_THE_CALENDAR as readonly string[]).includes(b.stage) && b.orderId !== order.order.id);
    const byOrder = new Map<string, { reference: string; blocks: Block[] }>();
    for (const b of onCell) {
      const e = byOrder.get(b.orderId) ?? { reference: b.reference, blocks: [] };
      e.blocks.push({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt });
      byOrder.set(b.orderId, e);
    }
    const others = [...byOrder].map(([orderId, e]) => ({ orderId, blocks: e.blocks, durations: durationsFromBlocks(e.blocks, cal, finishingDays) }));
    const mine = order.blocks.map((b) => ({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt }));
    const replanned = moveJob({ orderId: order.order.id, blocks: mine, durations }, start, others, cal);
    const out: { orderId: string; id: string; fromDate: Date; toDate: Date; reason: string; notify: boolean }[] = [];
    for (const r of replanned) {
      await saveSchedule(tx, r.orderId, cellKey, r.blocks, r.toShip);
      const own = r.orderId === order.order.id;
      // another client reads only that the work ahead moved, not staff's words about someone else's job
      const reason = own ? input.reason : `The job ahead of it on the ${cell.params.name} cell moved later.`;
      await writeAudit(tx, {
        actorId: user.id, action: "order.move", entityType: "order", entityId: r.orderId, orgId: own ? order.order.orgId : null,
        before: { plannedShip: r.fromShip }, after: { plannedShip: r.toShip, reason, blocks: r.blocks.map((b) => ({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt })) },
      });
      if (r.fromShip.getTime() === r.toShip.getTime()) continue;
      const notify = workingDaysMoved(r.fromShip, r.toShip, cal, plant) >= 1;
      const id = await recordShipDateChange(tx, { orderId: r.orderId, fromDate: r.fromShip, toDate: r.toShip, reason, isNotified: notify, actorId: user.id });
      out.push({ orderId: r.orderId, id, fromDate: r.fromShip, toDate: r.toShip, reason, notify });
    }
    return out;
  });
  for (const c of changes.filter((x) => x.notify)) {
    await notifyShipDateChanged(c.orderId, c).catch((e: unknown) => console.error("ship-date e-mail failed", e));
  }
  revalidatePath("/admin/production");
  revalidatePath("/admin/production/capacity");
  for (const c of changes) revalidatePath(`/admin/production/orders/${c.orderId}`);
  return { moved: changes.map((c) => ({ orderId: c.orderId, fromDate: c.fromDate.toISOString(), toDate: c.toDate.toISOString(), clientTold: c.notify })) };
});
