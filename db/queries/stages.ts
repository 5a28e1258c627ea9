import "server-only";
import { and, eq } from "drizzle-orm";
import type { Stage } from "../schema/common";
import { requests, stageEvents } from "../schema";
import { AppError } from "../../lib/errors";
import { checkTransition } from "../../lib/orders/stages";
import type { Db } from "../client";
import { writeAudit, type Tx } from "./audit";

/**
 * Move a request/order to another stage, checked against the stage machine, recorded as a stage
 * event and in the audit log. Guarded by the current stage in the WHERE, so two racing moves can
 * not both win. Pass a transaction to combine with other writes.
 */
export async function transitionStage(
  db: Db | Tx,
  input: { requestId: string; to: Stage; actorId: string | null; note?: string; plannedAt?: Date | null; expectedFrom?: Stage },
) {
  const [current] = await db
    .select({ stage: requests.stage, heldFromStage: requests.heldFromStage, orgId: requests.orgId })
    .from(requests)
    .where(eq(requests.id, input.requestId));
  if (!current) throw new AppError("not_found:request", "That request was not found.");
  if (input.expectedFrom && current.stage !== input.expectedFrom) {
    throw new AppError("conflict:stage", `The order is already ${current.stage.replace("_", " ")}.`);
  }
  const check = checkTransition(current.stage, input.to, current.heldFromStage);
  if (!check.ok) throw new AppError("conflict:stage", check.reason ?? "That stage change is not allowed.");

  const heldFromStage = input.to === "on_hold" ? current.stage : null;
  const now = new Date();
  const updated = await db
    .update(requests)
    .set({ stage: input.to, heldFromStage, updatedAt: now, ...(input.to === "submitted" ? { submittedAt: now } : {}) })
    .where(and(eq(requests.id, input.requestId), eq(requests.stage, current.stage)))
    .returning({ id: requests.id });
  if (updated.length === 0) throw new AppError("conflict:stage", "The order changed stage meanwhile; reload and try again.");

  await db.insert(stageEvents).values({
    requestId: input.requestId,
    fromStage: current.stage,
    toStage: input.to,
    actorId: input.actorId,
    note: input.note ?? null,
    plannedAt: input.plannedAt ?? null,
    at: now,
  });
  await writeAudit(db, {
    actorId: input.actorId,
    action: "stage.change",
    entityType: "request",
    entityId: input.requestId,
    orgId: current.orgId,
    before: { stage: current.stage },
    after: { stage: input.to, note: input.note ?? null },
  });
  return { from: current.stage, to: input.to };
}
