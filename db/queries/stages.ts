import "server-only";
import { and, eq } from "drizzle-orm";
import type { Stage } from "../schema/common";
import { requests, stageEvents } from "../schema";
import type { Db } from "../client";
import { writeAudit, type Tx } from "./audit";

/** A request's stage, the stage it was held from, and its firm; null when there is no such request. */
export async function getStageRow(db: Db | Tx, requestId: string) {
  const [row] = await db
    .select({ stage: requests.stage, heldFromStage: requests.heldFromStage, orgId: requests.orgId })
    .from(requests)
    .where(eq(requests.id, requestId));
  return row ?? null;
}

/**
 * Write a stage change: guarded by the current stage in the WHERE (two racing moves cannot both
 * win), then the stage event and the audit row. Returns false, writing nothing, when the stage
 * moved meanwhile. The rules of which moves are allowed are lib/orders/stages.ts's.
 */
export async function writeStageChange(
  db: Db | Tx,
  input: { requestId: string; orgId: string; from: Stage; to: Stage; actorId: string | null; note?: string; plannedAt?: Date | null; now: Date },
): Promise<boolean> {
  const heldFromStage = input.to === "on_hold" ? input.from : null;
  const updated = await db
    .update(requests)
    .set({ stage: input.to, heldFromStage, updatedAt: input.now, ...(input.to === "submitted" ? { submittedAt: input.now } : {}) })
    .where(and(eq(requests.id, input.requestId), eq(requests.stage, input.from)))
    .returning({ id: requests.id });
  if (updated.length === 0) return false;
  await db.insert(stageEvents).values({
    requestId: input.requestId,
    fromStage: input.from,
    toStage: input.to,
    actorId: input.actorId,
    note: input.note ?? null,
    plannedAt: input.plannedAt ?? null,
    at: input.now,
  });
  await writeAudit(db, {
    actorId: input.actorId,
    action: "stage.change",
    entityType: "request",
    entityId: input.requestId,
    orgId: input.orgId,
    before: { stage: input.from },
    after: { stage: input.to, note: input.note ?? null },
  });
  return true;
}
