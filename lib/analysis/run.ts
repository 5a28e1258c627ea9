import type { Db } from "../../db/client";
import { loadCatalogue } from "../../db/queries/catalogue";
import { createAnalysis, getAnalysis, updateAnalysis } from "../../db/queries/parts";
import type { AnalyseOptions } from "../estimating/analyse";
import { isEstimateInputError } from "../estimating/errors";
import { EstimateJobError, getEstimatePool, QueueFullError, type EstimatePool } from "../estimating/pool";
import { signedFileUrl } from "../uploads/uploadthing";

export interface RunDeps {
  pool?: Pick<EstimatePool, "run">;
  /** A URL the worker can fetch the file by (default: a signed storage URL valid 10 minutes). */
  fileUrl?: (fileKey: string) => Promise<string>;
  now?: () => Date;
  /** Waits between retries when the pool's queue is full, ms (tests pass 0). */
  retryDelayMs?: (retryAfterS: number) => number;
}

/** Largest model the analysis reads, bytes (the upload form states 256 MB). */
export const MAX_MODEL_BYTES = 256 * 1024 * 1024;

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
  const { analysisId } = await (async () => {
    const cat = await loadCatalogue(db);
    const row = await createAnalysis(db, { revisionId: input.revisionId, options: { ...input.options }, rateCardId: cat?.rateCardId ?? null });
    return { analysisId: row.id };
  })();
  const done = runAnalysis(db, analysisId, input, deps).catch((e: unknown) => {
    console.error("analysis crashed", analysisId, e);
  });
  return { analysisId, done };
}

async function runAnalysis(db: Db, analysisId: string, input: { fileKey: string; fileName: string; options: AnalyseOptions }, deps: RunDeps) {
  const pool = deps.pool ?? getEstimatePool();
  const fileUrl = deps.fileUrl ?? ((k: string) => signedFileUrl(k, { expiresInS: 600 }));
  const now = deps.now ?? (() => new Date());
  const fail = (code: string, message: string) =>
    updateAnalysis(db, analysisId, { status: "failed", errorCode: code, errorMessage: message, finishedAt: now() });

  try {
    await updateAnalysis(db, analysisId, { status: "running", progress: 0.02, stageLabel: "Fetching the file" });
    const cat = await loadCatalogue(db);
    if (!cat) return await fail("catalogue:missing", "The bureau's catalogue is not set up yet; our staff have been told.");
    // The worker fetches the file itself, off the request thread.
    const remote = { url: await fileUrl(input.fileKey), maxBytes: MAX_MODEL_BYTES };

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

    let result;
    for (let attempt = 0; ; attempt++) {
      try {
        result = await pool.run({ remote, fileName: input.fileName, options: input.options, catalogue: cat, now: now() }, onProgress);
        break;
      } catch (e) {
        if (e instanceof QueueFullError && attempt < 5) {
          await updateAnalysis(db, analysisId, { status: "queued", stageLabel: "Waiting for the estimator" });
          await new Promise((r) => setTimeout(r, deps.retryDelayMs ? deps.retryDelayMs(e.retryAfterS) : e.retryAfterS * 1000));
          continue;
        }
        throw e;
      }
    }
    await pending;
    await updateAnalysis(db, analysisId, {
      status: "done",
      progress: 1,
      stageLabel: "Done",
      result: result as unknown as Record<string, unknown>,
      finishedAt: now(),
    });
  } catch (e) {
    if (isEstimateInputError(e)) return await fail(e.code, e.message);
    if (e instanceof EstimateJobError) return await fail(`job:${e.code}`, e.message);
    if (e instanceof QueueFullError) return await fail("busy", "The estimator is busy; save the draft again in a minute to retry.");
    console.error("analysis failed", analysisId, e);
    await fail("internal", "The analysis could not run; please try again, or ask us to look at the file.");
  }
}

/** For polling: the analysis row's status and progress, without the large result. */
export async function analysisProgress(db: Db, analysisId: string) {
  const a = await getAnalysis(db, analysisId);
  if (!a) return null;
  return { id: a.id, status: a.status, progress: a.progress, stageLabel: a.stageLabel, errorCode: a.errorCode, errorMessage: a.errorMessage, revisionId: a.revisionId };
}
