"use server";

import { revalidatePath } from "next/cache";
import type { z } from "zod";
import { writeAudit } from "@/db/queries/audit";
import { getCurrentCell } from "@/db/queries/admin-catalogue";
import { getCurrentRateCard } from "@/db/queries/catalogue";
import { attachInspectionReport, ensureBalancePayment, getOrderForProduction, listCellBlocks, saveSchedule, updateActuals } from "@/db/queries/orders";
import { releaseCellBlocks, trimCellBlocksAfter } from "@/db/queries/schedule-blocks";
import { transitionStage } from "@/lib/orders/transition";
import { formatDateTime, fromPlantInput } from "@/lib/dates";
import { issueDocument, issueDocumentInTx } from "@/lib/documents/issue";
import { openBankTransfer } from "@/lib/payments/bank-transfer";
import { notifyBalanceDue, notifyScheduled, notifyShipped } from "@/lib/email/notify";
import { AppError } from "@/lib/errors";
import { isBackwardMove, label, roleMayMove } from "@/lib/orders/stages";
import { findConflicts, jobDurations, planBlocks } from "@/lib/scheduling/blocks";
import { anyRecord, defineAction, fieldErrorsByPath } from "@/lib/server/define-action";
import { actualsSchema, fileReportSchema, isConfirmedMove, moveStageSchema, scheduleSchema } from "@/lib/validation/admin-production";
import { eq } from "drizzle-orm";
import { orders } from "@/db/schema";
import { dueDateFor, isOnAccount } from "@/lib/payments/terms";

const fmt = (d: Date) => formatDateTime(d);
const OFF_THE_CELL = new Set<string>(["shipped", "delivered", "closed", "cancelled"]);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : 0);

/** A hold or a cancel without its "are you sure" step says so plainly, and nothing changes. */
function unconfirmed(error: z.ZodError, raw: unknown): AppError {
  const issue = error.issues.find((i) => i.path[0] === "confirm");
  if (issue && isConfirmedMove(String((raw as { to?: unknown } | null)?.to))) return new AppError("invalid_input:confirmation", `${issue.message} Nothing was changed.`, fieldErrorsByPath(error));
  return new AppError("invalid_input", "Check the highlighted fields.", fieldErrorsByPath(error));
}

/**
 * Lay a paid order on a printing cell: blocks from its estimate and the cell's calendar, refused
 * when its print or cooling overlaps another job on the cell; the client is e-mailed the dates.
 */
export const scheduleOrder = defineAction({ access: "production:schedule", input: scheduleSchema }, async (input, { user, db }) => {
  const order = await getOrderForProduction(db, input.orderId);
  if (!order) throw new AppError("not_found:order", "That order was not found.");
  const stage = order.request.stage;
  if (stage !== "deposit_paid" && stage !== "scheduled") {
    throw new AppError("conflict:stage", stage === "accepted" ? "The deposit is not paid yet; only paid orders are scheduled." : `The order is at ${label(stage)}; only paid orders waiting to print can be (re)scheduled.`);
  }
  const cell = await getCurrentCell(db, input.cellKey);
  if (!cell || !cell.isActive) throw new AppError("not_found:cell", "That printing cell was not found or is out of service.");
  const card = await getCurrentRateCard(db);
  if (!card) throw new AppError("unavailable", "No rate card is set; an admin must add one.");
  const missing = order.parts.filter((p) => !p.estimate);
  if (missing.length) throw new AppError("conflict:analysis", `“${missing[0]!.name}” has no finished analysis to plan from.`);

  const durations = jobDurations(
    order.parts.map((p) => ({ printHours: num(p.estimate!.printHours), dwellHours: num(p.estimate!.dwellHours), coolingHours: num(p.estimate!.coolingHours), machiningHours: num(p.estimate!.machiningHours), quantity: p.quantity })),
    card.params.finishingDays + card.params.inspectionDays + card.params.packingDays,
  );
  const start = input.start.endsWith("Z") ? new Date(input.start) : fromPlantInput(input.start)!;
  const blocks = planBlocks(start, durations, cell.params.calendar);
  const last = blocks.at(-1)!;

  const result = await db.transaction(async (tx) => {
    // A job that has shipped (or was cancelled) no longer holds the cell, whatever was planned.
    const existing = (await listCellBlocks(tx, input.cellKey, blocks[0]!.startsAt, last.endsAt)).filter((e) => !OFF_THE_CELL.has(e.stage));
    const conflicts = findConflicts(input.orderId, blocks, existing);
    if (conflicts.length) {
      const c = conflicts[0]!;
      const other = existing.find((e) => e.orderId === c.with.orderId);
      throw new AppError("conflict:schedule", `The ${c.block.kind} block overlaps ${other?.reference ?? "another job"}'s ${c.with.kind} on ${cell.params.name} (${fmt(c.with.startsAt)} – ${fmt(c.with.endsAt)}). Pick a start after ${fmt(c.with.endsAt)}.`);
    }
    await saveSchedule(tx, input.orderId, input.cellKey, blocks, last.endsAt);
    if (stage === "deposit_paid") {
      await transitionStage(tx, { requestId: order.request.id, to: "scheduled", actorId: user.id, note: `On ${cell.params.name} from ${fmt(blocks[0]!.startsAt)}`, plannedAt: blocks[0]!.startsAt, expectedFrom: "deposit_paid" });
    }
    await writeAudit(tx, {
      actorId: user.id,
      action: stage === "scheduled" ? "order.reschedule" : "order.schedule",
      entityType: "order",
      entityId: input.orderId,
      orgId: order.order.orgId,
      before: { cellKey: order.order.cellKey, plannedStart: order.order.plannedStart, plannedShip: order.order.plannedShip },
      after: { cellKey: input.cellKey, plannedStart: blocks[0]!.startsAt, plannedShip: last.endsAt, blocks: blocks.map((b) => ({ kind: b.kind, startsAt: b.startsAt, endsAt: b.endsAt })) },
    });
    return { plannedStart: blocks[0]!.startsAt.toISOString(), plannedShip: last.endsAt.toISOString() };
  });
  await notifyScheduled(input.orderId).catch((e: unknown) => console.error("scheduled e-mail failed", e));
  revalidatePath("/admin/production");
  revalidatePath(`/admin/production/orders/${input.orderId}`);
  return result;
});

/**
 * Move an order along the stage machine. Scheduling has its own form (it needs the blocks);
 * shipping needs the carrier and tracking number and makes the balance invoice. A hold or a
 * cancel needs `confirm` (the form's "are you sure" step), a cancel also a reason; a cancel
 * frees the order's time on its cell. Payments are left to accounts (refunds are theirs).
 */
export const moveStage = defineAction({ access: "production:record", input: moveStageSchema, invalid: unconfirmed }, async (input, { user, db }) => {
  const order = await getOrderForProduction(db, input.orderId);
  if (!order) throw new AppError("not_found:order", "That order was not found.");
  const from = order.request.stage;
  if (!roleMayMove(user.role, from, input.to)) throw new AppError("forbidden:stage", `Your role does not move orders from ${label(from)} to ${label(input.to)}.`);
  if (isBackwardMove(from, input.to)) {
    if (input.confirm !== input.to) throw new AppError("invalid_input:confirmation", `Moving back from ${label(from)} to ${label(input.to)} needs confirming first. Nothing was changed.`);
    if ((input.note ?? "").length < 3) throw new AppError("invalid_input", "Say why the order goes back; the client sees it on their timeline.", { note: ["Say why the order goes back; the client sees it on their timeline."] });
  }
  if (input.to === "scheduled" && from !== "on_hold") throw new AppError("conflict:stage", "Schedule the order on a cell's calendar; that moves it to scheduled.");
  if (input.to === "shipped" && (!order.order.carrier || !order.order.trackingNumber)) {
    throw new AppError("conflict:shipping", "Record the carrier and tracking number before marking the order shipped.");
  }
  const moved = await db.transaction(async (tx) => {
    const r = await transitionStage(tx, { requestId: order.request.id, to: input.to, actorId: user.id, note: input.note, expectedFrom: from });
    if (input.to === "cancelled") {
      const released = await releaseCellBlocks(tx, order.order.id);
      if (released) await writeAudit(tx, { actorId: user.id, action: "order.release_cell", entityType: "order", entityId: order.order.id, orgId: order.order.orgId, before: { cellKey: order.order.cellKey, blocks: released }, after: { blocks: 0 } });
    }
    if (input.to === "shipped") {
      // The job has left the cell: its remaining planned time is free for the next booking.
      const trimmed = await trimCellBlocksAfter(tx, order.order.id, new Date());
      if (trimmed) await writeAudit(tx, { actorId: user.id, action: "order.release_cell", entityType: "order", entityId: order.order.id, orgId: order.order.orgId, after: { trimmedBlocks: trimmed, reason: "shipped" } });
      const balanceId = await ensureBalancePayment(tx, order.order, user.id);
      // On net terms the invoice is dated with the shipment and falls due on the terms' date.
      const terms = order.order.paymentTerms;
      if (isOnAccount(terms)) {
        const invoicedAt = new Date();
        await tx.update(orders).set({ invoicedAt, dueAt: dueDateFor(terms, invoicedAt) }).where(eq(orders.id, order.order.id));
      }
      // The packing list and the balance invoice are numbered with the shipment itself.
      await issueDocumentInTx(tx, { kind: "packing_list", sourceId: order.order.id, actorId: user.id });
      // On terms the invoice waits for its bank-transfer details (after commit, below), so it carries the reference.
      if (order.order.balanceCents > 0 && !isOnAccount(terms)) await issueDocumentInTx(tx, { kind: "invoice", sourceId: order.order.id, actorId: user.id });
      await writeAudit(tx, { actorId: user.id, action: "order.ship", entityType: "order", entityId: order.order.id, orgId: order.order.orgId, after: { carrier: order.order.carrier, trackingNumber: order.order.trackingNumber, balancePaymentId: balanceId } });
    }
    return r;
  });
  if (input.to === "shipped" && isOnAccount(order.order.paymentTerms) && order.order.balanceCents > 0) {
    await openBankTransfer(db, { orderId: order.order.id, kind: "balance", userId: user.id }).catch((e: unknown) => console.error("bank transfer for the invoice could not be opened; the invoice goes without it", e));
    await issueDocument(db, { kind: "invoice", sourceId: order.order.id, actorId: user.id });
  }
  if (input.to === "shipped") {
    await notifyShipped(order.order.id).catch((e: unknown) => console.error("shipped e-mail failed", e));
    if (order.order.balanceCents > 0) await notifyBalanceDue(order.order.id).catch((e: unknown) => console.error("balance-due e-mail failed", e));
  }
  revalidatePath("/admin/production");
  revalidatePath(`/admin/production/orders/${input.orderId}`);
  return { from: moved.from, to: moved.to };
});

/** Record what the job really took, the inspection result (with its report) and the shipping details. */
export const recordActuals = defineAction({ access: "production:record", input: anyRecord(actualsSchema) }, async (input, { user, db }) => {
  const { orderId, reportUploadId: uploadId, ...fields } = input;
  const order = await getOrderForProduction(db, orderId);
  if (!order) throw new AppError("not_found:order", "That order was not found.");
  if (order.request.stage === "shipped" || order.request.stage === "delivered" || order.request.stage === "closed") {
    if (fields.carrier !== undefined && fields.carrier !== order.order.carrier) throw new AppError("conflict:shipping", "The order has shipped; its carrier can not change.");
  }
  const set = { ...fields, carrier: fields.carrier || (fields.carrier === "" ? null : undefined), trackingNumber: fields.trackingNumber || (fields.trackingNumber === "" ? null : undefined) };
  await db.transaction(async (tx) => {
    await updateActuals(tx, orderId, set);
    if (uploadId) {
      const filed = await attachInspectionReport(tx, { uploadId, requestId: order.request.id, orgId: order.order.orgId, userId: user.id });
      if (!filed) throw new AppError("not_found:upload", "That report upload was not found; upload it again.");
    }
    await writeAudit(tx, {
      actorId: user.id,
      action: "order.actuals",
      entityType: "order",
      entityId: orderId,
      orgId: order.order.orgId,
      before: { actualPrintHours: order.order.actualPrintHours, actualMaterialKg: order.order.actualMaterialKg, actualMachiningHours: order.order.actualMachiningHours, inspectionResult: order.order.inspectionResult, carrier: order.order.carrier, trackingNumber: order.order.trackingNumber },
      after: { ...set, reportUploadId: uploadId ?? null },
    });
  });
  revalidatePath(`/admin/production/orders/${orderId}`);
  return { saved: Object.keys(fields).filter((k) => (fields as Record<string, unknown>)[k] !== undefined) };
});

/**
 * File an inspection report as soon as it is uploaded: it joins the order's documents (the client's
 * order page lists it with the order's files) without waiting for the actuals to be saved.
 */
export const fileInspectionReport = defineAction({ access: "production:record", input: fileReportSchema }, async (input, { user, db }) => {
  const order = await getOrderForProduction(db, input.orderId);
  if (!order) throw new AppError("not_found:order", "That order was not found.");
  const filed = await db.transaction(async (tx) => {
    const f = await attachInspectionReport(tx, { uploadId: input.uploadId, requestId: order.request.id, orgId: order.order.orgId, userId: user.id });
    if (!f) throw new AppError("not_found:upload", "That report upload was not found; upload it again.");
    if (f.isNew) {
      await writeAudit(tx, { actorId: user.id, action: "order.inspection_report", entityType: "order", entityId: order.order.id, orgId: order.order.orgId, after: { fileName: f.fileName } });
    }
    return f;
  });
  revalidatePath(`/admin/production/orders/${input.orderId}`);
  revalidatePath(`/portal/requests/${order.request.id}`);
  return { documentId: filed.documentId, fileName: filed.fileName };
});
