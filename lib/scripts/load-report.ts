import { readFileSync } from "node:fs";
import type { Result } from "autocannon";
import { childPids } from "./hard-stack";

/** The load run's figures: CPU per answer from /proc, percentiles, and one summary row per target. */

/** autocannon's result with latencies per status code. */
export type Measured = Result & { byStatus: Map<number, number[]>; serverCpuMs?: number; clientCpuMs?: number };

/** CPU time (user + system) the app's processes have used so far, ms: the cluster's primary and its workers (/proc, Linux). */
export function serverCpuMs(appPid: number): number {
  let ticks = 0;
  for (const pid of [appPid, ...childPids(appPid)]) {
    try {
      const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
      const f = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      ticks += Number(f[11]) + Number(f[12]); // utime, stime (fields 14 and 15)
    } catch {
      // gone
    }
  }
  return ticks * 10; // USER_HZ is 100 on Linux
}

export interface Line {
  target: string;
  result: Measured;
  /** Status codes that are the designed answer under overload, not errors. */
  expected?: number[];
}

export function summarise({ target, result, expected = [] }: Line) {
  const codes = Object.fromEntries(Object.entries(result.statusCodeStats).map(([k, v]) => [k, v.count]));
  const expectedCount = expected.reduce((n, c) => n + (codes[String(c)] ?? 0), 0);
  const errors = result.errors + result.timeouts + (result.non2xx - expectedCount);
  const answered = Object.values(codes).reduce((n, c) => n + c, 0);
  return {
    target,
    "req/s": Math.round(result.requests.average),
    "p50 ms": result.latency.p50,
    "p99 ms": result.latency.p99,
    // server CPU per answer: steadier than latency when other work shares the cores
    "CPU ms/req": result.serverCpuMs !== undefined && answered > 0 ? Number((result.serverCpuMs / answered).toFixed(2)) : "",
    // the load generator's own CPU per answer: it shares the two cores with the servers
    "client CPU ms/req": result.clientCpuMs !== undefined && answered > 0 ? Number((result.clientCpuMs / answered).toFixed(2)) : "",
    requests: result.requests.total,
    errors,
    codes: Object.entries(codes).map(([k, v]) => `${k}×${v}`).join(" "),
  };
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return 0;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!;
}

/** "200: 61 × p50 4,210 / p99 9,870 ms" per status code. */
export function statusLatencies(byStatus: Map<number, number[]>): string {
  return [...byStatus]
    .sort(([a], [b]) => a - b)
    .map(([status, list]) => {
      const sorted = [...list].sort((x, y) => x - y);
      return `${status}: ${sorted.length} × p50 ${Math.round(percentile(sorted, 50))} / p99 ${Math.round(percentile(sorted, 99))} ms`;
    })
    .join("; ");
}
