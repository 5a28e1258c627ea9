import "server-only";
import type { Db } from "../../db/client";
import { deletableModelFileKeys, getBureauSettings, listFinishedRequestsWithFiles, markRequestFilesDeleted, type FinishedRequest } from "../../db/queries/retention";
import { retentionCutoff } from "./policy";

export interface RetentionDeps {
  /** Delete these keys from the upload store; throws when the store refuses. */
  deleteStoredFiles: (keys: string[]) => Promise<void>;
  now: Date;
}

export interface RetentionSummary {
  requests: number;
  files: number;
  failed: { requestId: string; message: string }[];
}

/** Is this finished request's model files due: past the period, or asked for by the client? */
export function isDue(r: FinishedRequest, cutoff: Date): boolean {
  if (r.deletionRequestedAt) return true;
  return r.finishedAt !== null && r.finishedAt.getTime() <= cutoff.getTime();
}

/** Delete one request's model files from storage and record it (the records stay). */
export async function deleteRequestFiles(db: Db, r: Pick<FinishedRequest, "requestId" | "orgId">, deps: RetentionDeps & { actorId: string | null; reason: "retention" | "client_request" }): Promise<number> {
  const keys = await deletableModelFileKeys(db, r.requestId);
  if (keys.length > 0) await deps.deleteStoredFiles(keys);
  await markRequestFilesDeleted(db, { requestId: r.requestId, orgId: r.orgId, count: keys.length, now: deps.now, actorId: deps.actorId, reason: deps.reason });
  return keys.length;
}

/**
 * The daily retention job: every closed or cancelled order whose files have been kept the
 * bureau's period (or whose client admin asked) has its model files deleted from storage. A
 * storage failure leaves that request for the next run; the others go on.
 */
export async function runRetention(db: Db, deps: RetentionDeps): Promise<RetentionSummary> {
  const { modelRetentionDays } = await getBureauSettings(db);
  const cutoff = retentionCutoff(deps.now, modelRetentionDays);
  const summary: RetentionSummary = { requests: 0, files: 0, failed: [] };
  for (const r of await listFinishedRequestsWithFiles(db)) {
    if (!isDue(r, cutoff)) continue;
    try {
      summary.files += await deleteRequestFiles(db, r, { ...deps, actorId: null, reason: r.deletionRequestedAt ? "client_request" : "retention" });
      summary.requests += 1;
    } catch (e) {
      summary.failed.push({ requestId: r.requestId, message: (e as Error).message });
    }
  }
  return summary;
}
