"use client";

import { useQueries, useQuery } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { exportHint } from "@/lib/analysis/export-hints";
import type { EstimateResult } from "@/lib/estimating/types";
import { fetchJson } from "@/components/portal/query-provider";
import type { AnalysisPoll } from "@/lib/contracts/portal";

export type { AnalysisPoll };


/** Poll one analysis row until it is done or failed. */
export function useAnalysis(analysisId: string | null) {
  return useQuery({
    queryKey: ["analysis", analysisId],
    queryFn: () => fetchJson<AnalysisPoll>(`/api/portal/analyses/${analysisId}`),
    enabled: Boolean(analysisId),
    refetchInterval: (q) => (q.state.data && (q.state.data.status === "done" || q.state.data.status === "failed") ? false : 800),
    staleTime: Infinity,
  });
}

/** Several analyses at once (the same cache as useAnalysis): for the review step's totals and its Submit. */
export function useAnalyses(analysisIds: (string | null)[]) {
  return useQueries({
    queries: analysisIds.map((analysisId) => ({
      queryKey: ["analysis", analysisId],
      queryFn: () => fetchJson<AnalysisPoll>(`/api/portal/analyses/${analysisId}`),
      enabled: Boolean(analysisId),
      refetchInterval: (q: { state: { data?: AnalysisPoll } }) => (q.state.data && (q.state.data.status === "done" || q.state.data.status === "failed") ? false : 800),
      staleTime: Infinity,
    })),
  });
}

/** Seconds since the component first saw this analysis running; a long read then says so. */
function useElapsedS(isRunning: boolean) {
  const [startedAt] = useState(() => Date.now());
  const [now, setNow] = useState(startedAt);
  useEffect(() => {
    if (!isRunning) return;
    const t = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(t);
  }, [isRunning]);
  return Math.round((now - startedAt) / 1000);
}

/** The progress bar of a running analysis, or its failure message. */
export function AnalysisStatus({ analysisId, onDone }: { analysisId: string; onDone?: (r: EstimateResult) => void }) {
  const q = useAnalysis(analysisId);
  const data = q.data;
  const isRunning = !data || data.status === "queued" || data.status === "running";
  const elapsedS = useElapsedS(isRunning);
  useEffect(() => {
    if (data?.status === "done" && data.result) onDone?.(data.result);
    // onDone is a fresh closure each render; run once per finished analysis.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [data?.status, data?.id]);
  if (q.isError) return <p className="text-sm text-signal-danger" role="alert">Could not follow the analysis: {q.error.message}</p>;
  if (!data || data.status === "queued" || data.status === "running") {
    const pct = Math.round((data?.progress ?? 0) * 100);
    return (
      <div className="space-y-1" role="status" aria-live="polite" data-testid="analysis-progress">
        <div className="h-2 w-full overflow-hidden rounded bg-paper-200">
          <div className="h-full bg-tide-500 transition-[width]" style={{ width: `${Math.max(3, pct)}%` }} />
        </div>
        <p className="text-xs text-ink-500">
          {data?.status === "queued" ? "Waiting for the estimator…" : `Analysing: ${data?.stageLabel ?? "starting"} (${pct} %)`}
          {elapsedS >= 5 ? ` · ${elapsedS} s` : ""}
        </p>
        {elapsedS >= 15 ? <p className="text-xs text-ink-500">Large models take a minute or two to read and measure; it is still working. You can carry on with the form meanwhile.</p> : null}
      </div>
    );
  }
  if (data.status === "failed") {
    return (
      <p className="rounded bg-red-50 px-3 py-2 text-sm text-signal-danger" role="alert" data-testid="analysis-error">
        {data.error?.message ?? "The file could not be analysed."} {exportHint(data.error?.code)} The rest of your request is saved; upload a corrected file for this part.
      </p>
    );
  }
  return null;
}
