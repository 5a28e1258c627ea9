import { eq } from "drizzle-orm";
import { scheduleBlocks } from "../schema";
import type { Tx } from "./audit";

/** Free a cancelled order's time on its cell: its blocks go, the planned dates stay on the order as history. */
export async function releaseCellBlocks(tx: Tx, orderId: string): Promise<number> {
  const gone = await tx.delete(scheduleBlocks).where(eq(scheduleBlocks.orderId, orderId)).returning({ id: scheduleBlocks.id });
  return gone.length;
}
