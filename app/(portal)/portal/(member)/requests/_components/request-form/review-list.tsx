"use client";

import { useEffect } from "react";
import { useWatch } from "react-hook-form";
import { EmptyState } from "@/components/ui/card";
import { exportHint } from "@/lib/analysis/export-hints";
import { formatCents } from "@/lib/money";
import type { DraftInput } from "@/lib/validation/request";
import { useAnalyses, useAnalysis } from "./analysis-status";
import { LeadTimeChoice } from "./lead-time-choice";
import { PartReview } from "./part-review";
import { emptyFileState, type CatalogueForForm, type PartFileState } from "./types";

export function ReviewList({ catalogue, files, cureTempC, onReadiness }: { catalogue: CatalogueForForm; files: Record<string, PartFileState>; cureTempC: number | null; onReadiness: (why: string | null) => void }) {
  const parts = useWatch<DraftInput, "parts">({ name: "parts" });
  const analyses = useAnalyses(parts.map((p) => files[p.id]?.analysisId ?? null));
  const states = parts.map((p, i) => {
    const f = files[p.id];
    const a = analyses[i]?.data;
    if (!f?.revisionId) return `“${p.name}” has no usable file yet.`;
    if (a?.status === "failed") return `“${p.name}”'s file could not be analysed; upload a corrected file.`;
    if (a?.status !== "done" || !a.result) return `“${p.name}” is still being analysed.`;
    return null;
  });
  const why = parts.length === 0 ? "Add at least one part before submitting." : (states.find((s) => s !== null) ?? null);
  useEffect(() => onReadiness(why), [why, onReadiness]);
  if (parts.length === 0) return <EmptyState title="Add at least one part before submitting" />;
  const results = analyses.map((q) => (q.data?.status === "done" ? q.data.result : null));
  const isComplete = results.every((r) => r !== null);
  // A part sent to the bureau's engineer has no price yet: the request has no total until it does.
  const isWithheld = results.some((r) => r?.status === "needs-review" && (r as { priceWithheld?: boolean }).priceWithheld !== false);
  const totalCents = results.reduce((sum, r) => sum + (r?.totalCents ?? 0), 0);
  return (
    <>
      {parts.map((p) => (
        <ReviewItem key={p.id} part={p} file={files[p.id] ?? emptyFileState} catalogue={catalogue} cureTempC={cureTempC} isPreviewOnDemand={parts.length > 1} />
      ))}
      {parts.length > 1 ? (
        <div className="flex flex-wrap items-baseline justify-between gap-2 rounded bg-ink-800 px-4 py-3 text-white" data-testid="request-total">
          <span className="text-sm">Automatic estimate for the whole request ({parts.length} parts)</span>
          <span className="figures text-lg font-semibold">{isWithheld ? "after the engineer's review" : isComplete ? formatCents(totalCents) : "waiting for every part"}</span>
        </div>
      ) : null}
      {isComplete && !isWithheld ? <LeadTimeChoice results={results.filter((r): r is NonNullable<typeof r> => r !== null)} /> : null}
    </>
  );
}

function ReviewItem({ part, file, catalogue, cureTempC, isPreviewOnDemand }: { part: DraftInput["parts"][number]; file: PartFileState; catalogue: CatalogueForForm; cureTempC: number | null; isPreviewOnDemand: boolean }) {
  const a = useAnalysis(file.analysisId);
  if (!file.revisionId) {
    return file.error ? (
      <EmptyState title={`${part.name}: the file was refused`}>{file.error} Go back to Parts and upload a corrected file.</EmptyState>
    ) : (
      <EmptyState title={`${part.name}: no file yet`}>Go back to Parts and upload its model.</EmptyState>
    );
  }
  if (a.data?.status === "failed") return <EmptyState title={`${part.name}: the file could not be analysed`}>{a.data.error?.message} {exportHint(a.data.error?.code)}</EmptyState>;
  if (!a.data?.result) return <EmptyState title={`${part.name}: analysing…`}>The estimate appears here when the analysis finishes.</EmptyState>;
  return (
    <PartReview
      title={`${part.name} · ${file.fileName ?? ""}`}
      revisionId={file.revisionId}
      result={a.data.result}
      fileUnits={part.units}
      displayUnits={catalogue.unitsPref}
      cells={catalogue.cells}
      cureTempC={cureTempC}
      isPreviewOnDemand={isPreviewOnDemand}
    />
  );
}
