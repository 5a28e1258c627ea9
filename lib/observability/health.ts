/** A backlog whose oldest job has waited longer than this is reported as degraded, s (common practice: a few minutes). */
export const BACKLOG_DEGRADED_AFTER_S = 300;

/** "down" when the database does not answer; "degraded" when jobs wait too long; else "ok". */
export function healthStatus(input: { databaseOk: boolean; oldestQueuedAgeS: number | null }): "ok" | "degraded" | "down" {
  if (!input.databaseOk) return "down";
  if (input.oldestQueuedAgeS !== null && input.oldestQueuedAgeS > BACKLOG_DEGRADED_AFTER_S) return "degraded";
  return "ok";
}
