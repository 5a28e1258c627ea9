import "server-only";
import { and, count, eq, min, sql } from "drizzle-orm";
import type { Db } from "../client";
import { analyses } from "../schema";

/** Round trip to the database, ms; throws when it cannot answer. */
export async function pingDatabase(db: Db): Promise<number> {
  const t0 = performance.now();
  await db.run(sql`select 1`);
  return Math.round((performance.now() - t0) * 10) / 10;
}

/** Analyses waiting and running, and how long the oldest waiting one has waited (s). Counts only. */
export async function analysisBacklog(db: Db, now: Date): Promise<{ queued: number; running: number; oldestQueuedAgeS: number | null }> {
  const [queued] = await db.select({ n: count(), oldest: min(analyses.createdAt) }).from(analyses).where(eq(analyses.status, "queued"));
  const [running] = await db.select({ n: count() }).from(analyses).where(and(eq(analyses.status, "running")));
  const oldest = queued?.oldest ? new Date(queued.oldest).getTime() : null;
  return {
    queued: queued?.n ?? 0,
    running: running?.n ?? 0,
    oldestQueuedAgeS: oldest === null ? null : Math.max(0, Math.round((now.getTime() - oldest) / 1000)),
  };
}
