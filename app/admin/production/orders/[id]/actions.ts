"use server";

import { revalidatePath } from "next/cache";
import type { Db } from "@/db/client";
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
import { durationsFromBlocks, endBlockAt, moveJob, workingDaysMoved, type CalendarJob, type Replanned } from "@/lib/scheduling/reschedule";
import { defineAction } from "@/lib/server/define-action";
import { blockEndSchema, instantOf, moveJobSchema } from "@/lib/validation/admin-production";

/** Stages in which a job holds its booked blocks and may still be moved. */
const MOVABLE = new Set<string>(["scheduled", "printing", "cooling", "machining", "on_hold"]);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : 0);

/** The booked job, its cell and card, or a clear error (nothing is written). */
async function bookedJob(db: Db, orderId: string) {
  const order = await getOrderForProduction(db, orderId);
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
  return { order, cellKey, cell, cal, finishingDays, durations, plant: plantOf(card.params) };
}

type Job = Awaited<ReturnType<typeof bookedJob>>;
type Change = { orderId: string; id: string; fromDate: Date; toDate: Date; reason: string; notify: boolean };

/**
 * Replan in one transaction: `replan` gets the job and the other jobs on its cell and answers the
 * new blocks; each changed order's blocks are saved and audited, each planned ship that moved is
 * recorded with its reason; after the commit the clients whose date moved a working day or more
 * are e-mailed.
 */
async function applyReplan(db: Db, userId: string, job: Job, reason: string, replan: (mine: CalendarJob, others: CalendarJob[]) => Replanned[]): Promise<Change[]> {
  const { order, cellKey, cell, cal, finishingDays, durations, plant } = job;
  const now = new Date();
  const changes = await db.transaction(async (tx) => {
    const far = new Date(now.getTime() + 400 * 86_400_000);
    const onCell = (await listCellBlocks(tx, cellKey, now, far)).filter((b) => !(OFF_THE_CALENDAR as readonly string[]).includes(b.stage) && b.orderId !== order.order.id);
    const byOrder = new Map<string, Block[]>();
    for (const b of onCell) byOrder.set(b.orderId, [...(byOrder.get(b.orderId) ?? []), { kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt }]);
    const others = [...byOrder].map(([orderId, blocks]) => ({ orderId, blocks, durations: durationsFromBlocks(blocks, cal, finishingDays) }));
    const mine = { orderId: order.order.id, blocks: order.blocks.map((b) => ({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt })), durations };
    let replanned: Replanned[];
    try {
      replanned = replan(mine, others);
    } catch (e) {
      if (e instanceof RangeError) throw new AppError("invalid_input", `${e.message[0]!.toUpperCase()}${e.message.slice(1)}. Nothing was changed.`);
      throw e;
    }
    const out: Change[] = [];
    for (const r of replanned) {
      await saveSchedule(tx, r.orderId, cellKey, r.blocks, r.toShip);
      const own = r.orderId === order.order.id;
      // another client reads only that the work ahead moved, not staff's words about someone else's job
      const why = own ? reason : `The job ahead of it on the ${cell.params.name} cell moved later.`;
      await writeAudit(tx, {
        actorId: userId, action: "order.move", entityType: "order", entityId: r.orderId, orgId: own ? order.order.orgId : null,
        before: { plannedShip: r.fromShip }, after: { plannedShip: r.toShip, reason: why, blocks: r.blocks.map((b) => ({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt })) },
      });
      if (r.fromShip.getTime() === r.toShip.getTime()) continue;
      const notify = workingDaysMoved(r.fromShip, r.toShip, cal, plant) >= 1;
      const id = await recordShipDateChange(tx, { orderId: r.orderId, fromDate: r.fromShip, toDate: r.toShip, reason: why, isNotified: notify, actorId: userId });
      out.push({ orderId: r.orderId, id, fromDate: r.fromShip, toDate: r.toShip, reason: why, notify });
    }
    return out;
  });
  for (const c of changes.filter((x) => x.notify)) {
    await notifyShipDateChanged(c.orderId, c).catch((e: unknown) => console.error("ship-date e-mail failed", e));
  }
  revalidatePath("/admin/production");
  revalidatePath("/admin/production/capacity");
  for (const c of changes) revalidatePath(`/admin/production/orders/${c.orderId}`);
  return changes;
}

const answer = (changes: Change[]) => ({ moved: changes.map((c) => ({ orderId: c.orderId, fromDate: c.fromDate.toISOString(), toDate: c.toDate.toISOString(), clientTold: c.notify })) });

/**
 * Move a booked job to a new print start (a delay, or earlier when the cell frees up). Jobs on the
 * cell it would now overlap are pushed back behind it, in order; every order whose planned ship
 * moves gets a dated change with the reason on its timeline, and its client an e-mail with the old
 * and new date when it moves by a working day or more. A start in the past is refused and nothing
 * changes.
 */
export const moveBookedJob = defineAction({ access: "production:schedule", input: moveJobSchema }, async (input, { user, db }) => {
  const start = instantOf(input.start);
  if (start.getTime() < Date.now() - 60_000) {
    throw new AppError("invalid_input:start", `${formatDateTime(start)} has passed; a job can be moved to now or later. Nothing was changed.`, { start: ["Pick a start from now on."] });
  }
  const job = await bookedJob(db, input.orderId);
  return answer(await applyReplan(db, user.id, job, input.reason, (mine, others) => moveJob(mine, start, others, job.cal)));
});

/**
 * A block of a booked job ends at another time than planned: the print finished early, the cooling
 * or machining runs late. What follows is planned again from that end, jobs it now overlaps are
 * pushed back, and ship-date changes are recorded and told as for a move. An end before the
 * block's start is refused and nothing changes.
 */
export const recordBlockEnd = defineAction({ access: "production:schedule", input: blockEndSchema }, async (input, { user, db }) => {
  const endsAt = instantOf(input.endsAt);
  const job = await bookedJob(db, input.orderId);
  return answer(await applyReplan(db, user.id, job, input.reason, (mine, others) => endBlockAt(mine, input.kind, endsAt, others, job.cal)));
});

