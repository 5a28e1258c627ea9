/** Quote outcomes for the sales view: win rate and turnaround, from plain rows. */

export interface QuoteOutcomeRow {
  requestId: string;
  status: "draft" | "issued" | "accepted" | "superseded" | "expired" | "declined";
  validUntil: Date | null;
}

export interface WinRate {
  won: number;
  lost: number;
  open: number;
  /** won / (won + lost), null while nothing is decided. */
  rate: number | null;
}

/**
 * Win rate per request: a request counts once, by its latest live quote. Accepted = won;
 * declined, or issued past its validity = lost; issued and still valid = open. Drafts and
 * superseded versions do not count.
 */
export function winRate(rows: QuoteOutcomeRow[], now: Date): WinRate {
  const byRequest = new Map<string, "won" | "lost" | "open">();
  const rank = { open: 0, lost: 1, won: 2 } as const;
  for (const r of rows) {
    let outcome: "won" | "lost" | "open" | null = null;
    if (r.status === "accepted") outcome = "won";
    else if (r.status === "declined" || r.status === "expired") outcome = "lost";
    else if (r.status === "issued") outcome = r.validUntil && r.validUntil < now ? "lost" : "open";
    if (!outcome) continue;
    const prev = byRequest.get(r.requestId);
    if (!prev || rank[outcome] > rank[prev]) byRequest.set(r.requestId, outcome);
  }
  let won = 0, lost = 0, open = 0;
  for (const o of byRequest.values()) {
    if (o === "won") won++;
    else if (o === "lost") lost++;
    else open++;
  }
  return { won, lost, open, rate: won + lost > 0 ? won / (won + lost) : null };
}

export interface Turnaround {
  count: number;
  meanHours: number | null;
  medianHours: number | null;
  maxHours: number | null;
}

/** Hours from submission to the first issued quote, over the requests that have both. */
export function turnaround(rows: { submittedAt: Date | null; firstIssuedAt: Date | null }[]): Turnaround {
  const hours = rows
    .filter((r): r is { submittedAt: Date; firstIssuedAt: Date } => Boolean(r.submittedAt && r.firstIssuedAt))
    .map((r) => (r.firstIssuedAt.getTime() - r.submittedAt.getTime()) / 3_600_000)
    .filter((h) => h >= 0)
    .sort((a, b) => a - b);
  if (hours.length === 0) return { count: 0, meanHours: null, medianHours: null, maxHours: null };
  const mid = Math.floor(hours.length / 2);
  const median = hours.length % 2 ? hours[mid]! : (hours[mid - 1]! + hours[mid]!) / 2;
  return { count: hours.length, meanHours: hours.reduce((s, h) => s + h, 0) / hours.length, medianHours: median, maxHours: hours.at(-1)! };
}

/** Inbox order: nearest due date first (requests with none go after), then oldest submission. */
export function inboxOrder<T extends { neededBy: Date | null; submittedAt: Date | null }>(rows: T[]): T[] {
  const t = (d: Date | null) => (d ? d.getTime() : Number.POSITIVE_INFINITY);
  return [...rows].sort((a, b) => t(a.neededBy) - t(b.neededBy) || t(a.submittedAt) - t(b.submittedAt));
}

/** Mean and spread (sample standard deviation) of relative errors, for estimate calibration. */
export function errorStats(pairs: { estimate: number; actual: number }[]): { count: number; meanPct: number | null; spreadPct: number | null } {
  const errs = pairs.filter((p) => p.estimate > 0 && Number.isFinite(p.actual)).map((p) => ((p.actual - p.estimate) / p.estimate) * 100);
  if (errs.length === 0) return { count: 0, meanPct: null, spreadPct: null };
  const mean = errs.reduce((s, e) => s + e, 0) / errs.length;
  const spread = errs.length > 1 ? Math.sqrt(errs.reduce((s, e) => s + (e - mean) ** 2, 0) / (errs.length - 1)) : 0;
  return { count: errs.length, meanPct: mean, spreadPct: spread };
}
