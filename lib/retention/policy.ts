export { FINISHED_STAGES } from "../../db/schema/common";

const DAY_MS = 24 * 60 * 60 * 1000;

/** When a finished order's model files are due for deletion. */
export function filesDeleteAfter(finishedAt: Date, retentionDays: number): Date {
  return new Date(finishedAt.getTime() + retentionDays * DAY_MS);
}

/** The latest finish time whose files are due now (finished at or before this → delete). */
export function retentionCutoff(now: Date, retentionDays: number): Date {
  return new Date(now.getTime() - retentionDays * DAY_MS);
}

/** UTC calendar date, YYYY-MM-DD: the daily job's once-a-day key. */
export function utcDay(now: Date): string {
  return now.toISOString().slice(0, 10);
}

/** Retention periods the catalogue accepts, days: at least a week (disputes, re-orders), at most ten years. */
export const RETENTION_DAYS_MIN = 7;
export const RETENTION_DAYS_MAX = 3650;

/** "180 days" / "1 year" style wording for clients. */
export function retentionText(days: number): string {
  if (days % 365 === 0) return days === 365 ? "1 year" : `${days / 365} years`;
  return days === 1 ? "1 day" : `${days} days`;
}
