import "server-only";
import { and, eq, gt, gte, lt } from "drizzle-orm";
import { scheduleBlocks } from "../schema";
import type { Tx } from "./audit";

/** Free a cancelled order's time on its cell: its blocks go, the planned dates stay on the order as history. */
export async function releaseCellBlocks(tx: Tx, orderId: string): Promise<number> {
  const gone = await tx.delete(scheduleBlocks).where(eq(scheduleBlocks.orderId, orderId)).returning({ id: scheduleBlocks.id });
  return gone.length;
}

/**
 * A job that has left the cell (shipped) keeps its past blocks as history; what was still
 * planned after `now` is freed: blocks that had not started go, a running one ends at `now`.
 * Answers how many blocks were removed or cut.
 */
export async function trimCellBlocksAfter(tx: Tx, orderId: string, now: Date): Promise<number> {
  const gone = await tx.delete(scheduleBlocks).where(and(eq(scheduleBlocks.orderId, orderId), gte(scheduleBlocks.startsAt, now))).returning({ id: scheduleBlocks.id });
  const cut = await tx
    .update(scheduleBlocks)
    .set({ endsAt: now })
    .where(and(eq(scheduleBlocks.orderId, orderId), lt(scheduleBlocks.startsAt, now), gt(scheduleBlocks.endsAt, now)))
    .returning({ id: scheduleBlocks.id });
  return gone.length + cut.length;
}
