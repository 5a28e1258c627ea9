import "server-only";
import type { Db } from "../../db/client";
import { firmFreightZone } from "./freight-zone";
import { claimAnalysis, getAnalysisJob, listStrandedAnalyses, renewAnalysisLease, requeueAnalysis, resetFailedAnalysis, setRevisionSha256 } from "../../db/queries/analysis-jobs";
import { loadCapacityQueue } from "./capacity-queue";
import { loadCatalogue } from "../../db/queries/catalogue";
import { createAnalysis, getAnalysis, updateAnalysis } from "../../db/queries/parts";
import type { AnalyseOptions } from "../estimating/analyse";
import { getEstimatePool, OwnerBusyError, QueueFullError, type EstimatePool, type QueuePlace } from "../estimating/pool";
import { isAppError } from "../errors";
import { estimatorError } from "./estimator";
import { errorFields, logFor } from "../observability/log";
import { signedFileUrl } from "../uploads/uploadthing";

export interface RunDeps {
  pool?: Pick<EstimatePool, "run">;
  /** A URL the worker can fetch the file by (default: a signed storage URL valid 10 minutes). */
  fileUrl?: (fileKey: string) => Promise<string>;
  now?: () => Date;
  /** Waits between retries when the pool's queue is full, ms (tests pass 0). */
  retryDelayMs?: (retryAfterS: number) => number;
  /** The request that started the job, for the logs. */
  requestId?: string | null;
}

/** Largest model the analysis reads, bytes (the upload form states 256 MB). */
export const MAX_MODEL_BYTES = 256 * 1024 * 1024;

/**
 * Analyses are durable jobs: a row in `analyses` with a lease. The process running one renews
 * its lease while it works; if the process dies, the lease runs out and a sweeper (every server
 * process runs one, on start and on a timer) takes the job over. Each run counts as an attempt;
 * after MAX_ATTEMPTS the row ends `failed` with a plain message, and staff can retry it.
 */
export const MAX_ATTEMPTS = 3;
export const LEASE_MS = 45_000;
const HEARTBEAT_MS = 15_000;
/** A queued job nobody claimed for this long is taken by the sweeper (its request normally starts it at once). */
export const QUEUED_GRACE_MS = 30_000;

/** Back-off before an interrupted job runs again: 5 s, then 30 s. */
const retryBackoffMs = (attempt: number) => (attempt <= 1 ? 5_000 : 30_000);

/**
 * Queue an analysis of one file revision and return its id at once; the work runs in the
 * engine's worker pool and writes progress and the result to the `analyses` row, which the
 * browser polls. Never throws for a bad file: the row ends `failed` with the engine's message.
 */
export async function startAnalysis(
  db: Db,
  input: { revisionId: string; fileKey: string; fileName: string; options: AnalyseOptions },
  deps: RunDeps = {},
): Promise<{ analysisId: string; done: Promise<void> }> {
  const cat = await loadCatalogue(db);
  const row = await createAnalysis(db, { revisionId: input.revisionId, options: { ...input.options }, rateCardId: cat?.rateCardId ?? null });
  const done = runAnalysisJob(db, row.id, deps);
  return { analysisId: row.id, done };
}

/** Staff's retry of a failed analysis: attempts start again from zero. False if it was not failed. */
export async function retryAnalysis(db: Db, analysisId: string, deps: RunDeps = {}): Promise<{ retried: boolean; done: Promise<void> }> {
  if (!(await resetFailedAnalysis(db, analysisId))) return { retried: false, done: Promise.resolve() };
  return { retried: true, done: runAnalysisJob(db, analysisId, deps) };
}

/**
 * Take over analyses whose process died (lease expired) or that were never started; those out of
 * attempts end failed. Returns what it did; the runs it started go on in the background.
 */
export async function sweepAnalyses(db: Db, deps: RunDeps = {}): Promise<{ resumed: string[]; failed: string[]; done: Promise<void> }> {
  const now = (deps.now ?? (() => new Date()))();
  const stranded = await listStrandedAnalyses(db, now, QUEUED_GRACE_MS);
  const resumed: string[] = [];
  const failed: string[] = [];
  const runs: Promise<void>[] = [];
  for (const job of stranded) {
    if (job.attempts >= MAX_ATTEMPTS) {
      await updateAnalysis(db, job.id, {
        status: "failed",
        errorCode: "job:abandoned",
        errorMessage: `The analysis was interrupted ${job.attempts} times and was stopped. Our staff can run it again, or save the draft to retry.`,
        finishedAt: now,
        leaseUntil: null,
      });
      failed.push(job.id);
      continue;
    }
    resumed.push(job.id);
    runs.push(runAnalysisJob(db, job.id, deps));
  }
  if (resumed.length || failed.length) logFor({ component: "sweeper" }).info({ event: "analysis.sweep", resumed: resumed.length, failed: failed.length }, "analyses taken over");
  return { resumed, failed, done: Promise.all(runs).then(() => undefined) };
}

/** Claim one job and run it to an end (done, failed, or back in the queue for another attempt). */
export async function runAnalysisJob(db: Db, analysisId: string, deps: RunDeps = {}): Promise<void> {
  const now = deps.now ?? (() => new Date());
  const log = logFor({ requestId: deps.requestId ?? null, analysisId });
  const attempt = await claimAnalysis(db, analysisId, now(), LEASE_MS);
  if (attempt === null) return;
  const heartbeat = setInterval(() => void renewAnalysisLease(db, analysisId, now(), LEASE_MS).catch(() => undefined), HEARTBEAT_MS);
  heartbeat.unref();
  const t0 = performance.now();
  log.info({ event: "analysis.start", attempt }, "analysis started");
  try {
    const outcome = await runOnce(db, analysisId, deps);
    const ms = Math.round(performance.now() - t0);
    if (outcome.kind === "retry" && attempt < MAX_ATTEMPTS) {
      await requeueAnalysis(db, analysisId, new Date(now().getTime() + retryBackoffMs(attempt)), "Interrupted; starting again shortly");
      log.warn({ event: "analysis.requeued", attempt, ms, code: outcome.code }, "analysis interrupted; queued again");
    } else if (outcome.kind === "retry" || outcome.kind === "failed") {
      await updateAnalysis(db, analysisId, { status: "failed", errorCode: outcome.code, errorMessage: outcome.message, finishedAt: now(), leaseUntil: null });
      log.info({ event: "analysis.failed", attempt, ms, code: outcome.code }, "analysis failed");
    } else {
      log.info({ event: "analysis.done", attempt, ms }, "analysis done");
    }
  } catch (e) {
    log.error({ ...errorFields(e), event: "analysis.crash" }, "analysis crashed");
  } finally {
    clearInterval(heartbeat);
  }
}

type Outcome = { kind: "done" } | { kind: "failed" | "retry"; code: string; message: string };

async function runOnce(db: Db, analysisId: string, deps: RunDeps): Promise<Outcome> {
  const pool = deps.pool ?? getEstimatePool();
  const fileUrl = deps.fileUrl ?? ((k: string) => signedFileUrl(k, { expiresInS: 600 }));
  const now = deps.now ?? (() => new Date());
  try {
    const job = await getAnalysisJob(db, analysisId);
    if (!job) return { kind: "failed", code: "internal", message: "The analysis's file revision is gone." };
    await updateAnalysis(db, analysisId, { progress: 0.02, stageLabel: "Fetching the file" });
    const cat = await loadCatalogue(db);
    if (!cat) return { kind: "failed", code: "catalogue:missing", message: "The bureau's catalogue is not set up yet; our staff have been told." };
    // The worker fetches the file itself, off the request thread, and hashes it.
    const remote = { url: await fileUrl(job.fileKey), maxBytes: MAX_MODEL_BYTES };
    // Freight is priced to the firm's default ship-to (the rate card's default zone without one).
    const options: AnalyseOptions = { ...(job.options as unknown as AnalyseOptions), freightZone: await firmFreightZone(db, job.orgId, cat.rateCard) };

    // Progress writes are throttled: at most one every 400 ms, and never backwards.
    let lastWrite = 0;
    let lastFraction = 0;
    let pending: Promise<void> = Promise.resolve();
    const onProgress = (fraction: number, stage: string) => {
      const t = Date.now();
      if (t - lastWrite < 400 || fraction <= lastFraction) return;
      lastWrite = t;
      lastFraction = fraction;
      pending = pending.then(() => updateAnalysis(db, analysisId, { progress: Math.min(0.99, 0.05 + 0.94 * fraction), stageLabel: stage })).catch(() => {});
    };

    // The estimate's dates are placed around the work already on the calendar.
    const at = now();
    const queue = await loadCapacityQueue(db, at, cat.cells.map((c) => c.key));

    // While it waits its firm's turn, the row says where it stands (the browser polls it).
    const onPlace = ({ ahead, waitS }: QueuePlace) => {
      const label = ahead === 0 ? "Next in line for the estimator" : `In line for the estimator: ${ahead} ahead, about ${waitS < 60 ? `${Math.max(5, waitS)} s` : `${Math.round(waitS / 60)} min`}`;
      pending = pending.then(() => updateAnalysis(db, analysisId, { stageLabel: label })).catch(() => {});
    };

    // Counted against the uploader's share of the estimator with their estimates and previews:
    // while their other jobs run, this one waits its turn (each job has a time limit, so it comes).
    let result;
    for (let full = 0, yours = 0; ; ) {
      try {
        result = await pool.run({ remote, fileName: job.fileName, options, catalogue: cat, now: at, queue: queue.hours, booked: queue.booked }, onProgress, { lane: job.orgId, owner: job.ownerId ?? undefined, onPlace });
        break;
      } catch (e) {
        // The user's own jobs end within the pool's time limit each: look again every second.
        const busy = e instanceof QueueFullError ? full++ < 5 : e instanceof OwnerBusyError ? yours++ < 600 : false;
        if (busy) {
          const wait = e instanceof OwnerBusyError ? 1 : (e as QueueFullError).retryAfterS;
          await updateAnalysis(db, analysisId, { stageLabel: e instanceof OwnerBusyError ? "Waiting for your other estimates to finish" : "Waiting for the estimator" });
          await new Promise((r) => setTimeout(r, deps.retryDelayMs ? deps.retryDelayMs(wait) : wait * 1000));
          continue;
        }
        throw e;
      }
    }
    await pending;
    const { fileSha256, ...estimate } = result as typeof result & { fileSha256?: string };
    if (fileSha256) await setRevisionSha256(db, job.revisionId, fileSha256);
    await updateAnalysis(db, analysisId, {
      status: "done",
      progress: 1,
      stageLabel: "Done",
      result: estimate,
      finishedAt: now(),
      leaseUntil: null,
    });
    return { kind: "done" };
  } catch (e) {
    return outcomeOfError(e, analysisId);
  }
}

/**
 * A failed run, through the estimator's one error table (lib/analysis/estimator.ts): a file the
 * engine cannot read fails with the engine's code (its export advice keys on it); a time-out fails;
 * storage, a dead worker or a busy estimator are tried again later.
 */
function outcomeOfError(e: unknown, analysisId: string): Outcome {
  const mapped = estimatorError(e);
  // anything the table does not name (estimatorError hands it back as it came) is ours to look at
  if (mapped === e || !isAppError(mapped)) {
    logFor({ analysisId }).error({ ...errorFields(e), event: "analysis.error" }, "analysis failed");
    return { kind: "retry", code: "internal", message: "The analysis could not run; please try again, or ask us to look at the file." };
  }
  if (mapped.code.startsWith("unprocessable:")) return { kind: "failed", code: mapped.code.slice("unprocessable:".length), message: mapped.message };
  if (mapped.code.startsWith("busy")) return { kind: "retry", code: "busy", message: "The estimator is busy; save the draft again in a minute to retry." };
  return { kind: mapped.code === "timeout:estimate" ? "failed" : "retry", code: mapped.code, message: mapped.message };
}

/** For polling: the analysis row's status and progress, without the large result. */
export async function analysisProgress(db: Db, analysisId: string) {
  const a = await getAnalysis(db, analysisId);
  if (!a) return null;
  return { id: a.id, status: a.status, progress: a.progress, stageLabel: a.stageLabel, errorCode: a.errorCode, errorMessage: a.errorMessage, revisionId: a.revisionId };
}
