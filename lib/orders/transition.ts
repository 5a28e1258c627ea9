import type { Db } from "@/db/client";
import type { Tx } from "@/db/queries/audit";
import type { Stage } from "@/db/schema/common";
import { getStageRow, writeStageChange } from "@/db/queries/stages";
import { AppError } from "@/lib/errors";
import { checkTransition } from "./stages";

/**
 * Move a request/order to another stage, checked against the stage machine, recorded as a stage
 * event and in the audit log. Guarded by the current stage, so two racing moves can not both win.
 * Pass a transaction to combine with other writes.
 */
export async function transitionStage(
  db: Db | Tx,
  input: { requestId: string; to: Stage; actorId: string | null; note?: string; plannedAt?: Date | null; expectedFrom?: Stage },
) {
  const current = await getStageRow(db, input.requestId);
  if (!current) throw new AppError("not_found:request", "That request was not found.");
  if (input.expectedFrom && current.stage !== input.expectedFrom) {
    throw new AppError("conflict:stage", `The order is already ${current.stage.replace("_", " ")}.`);
  }
  const check = checkTransition(current.stage, input.to, current.heldFromStage);
  if (!check.ok) throw new AppError("conflict:stage", check.reason ?? "That stage change is not allowed.");
  const { requestId, to, actorId, note, plannedAt } = input;
  const written = await writeStageChange(db, { requestId, orgId: current.orgId, from: current.stage, to, actorId, note, plannedAt, now: new Date() });
  if (!written) throw new AppError("conflict:stage", "The order changed stage meanwhile; reload and try again.");
  return { from: current.stage, to: input.to };
}
