import { NextResponse } from "next/server";
import { emailBacklog } from "@/db/queries/email-jobs";
import { analysisBacklog, pingDatabase } from "@/db/queries/health";
import { getEstimatePool } from "@/lib/estimating/pool";
import { errorFields, rootLogger } from "@/lib/observability/log";
import { healthStatus } from "@/lib/observability/health";
import { defineRoute } from "@/lib/server/define-route";

export const dynamic = "force-dynamic";

/**
 * GET /api/health — for the load balancer and whoever is on call: is the database answering,
 * how busy is this process's estimator pool, how long is the job backlog. Counts and timings
 * only: no secrets, no records, no names. 200 when the database answers (status "ok" or
 * "degraded"), 503 when it does not.
 */
export const GET = defineRoute({ access: "public" }, async ({ db }) => {
  const now = new Date();
  let database: { ok: boolean; latencyMs: number | null };
  let jobs: Awaited<ReturnType<typeof analysisBacklog>> | null = null;
  let emails: Awaited<ReturnType<typeof emailBacklog>> | null = null;
  try {
    database = { ok: true, latencyMs: await pingDatabase(db) };
    [jobs, emails] = await Promise.all([analysisBacklog(db, now), emailBacklog(db)]);
  } catch (e) {
    rootLogger().error({ ...errorFields(e), event: "health.database" }, "health check: database did not answer");
    database = { ok: false, latencyMs: null };
  }
  const pool = getEstimatePool();
  const estimator = { workers: Number(process.env.ESTIMATE_WORKERS ?? 1) || 1, workersStarted: pool.workersStarted, ...pool.load };
  const status = healthStatus({ databaseOk: database.ok, oldestQueuedAgeS: jobs?.oldestQueuedAgeS ?? null });
  return NextResponse.json(
    { status, time: now.toISOString(), uptimeS: Math.round(process.uptime()), database, estimator, jobs: { analyses: jobs, emails } },
    { status: status === "down" ? 503 : 200, headers: { "cache-control": "no-store" } },
  );
});
