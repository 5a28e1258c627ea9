import type { listPartsWithAnalysis } from "@/db/queries/parts";
import type { loadFormCatalogue } from "@/app/(portal)/portal/(member)/requests/_components/request-form/load";
import { clientEstimateOf } from "@/lib/estimating/client-view";
import { PartReview } from "@/app/(portal)/portal/(member)/requests/_components/request-form/part-review";
import { RevisionUpload } from "./revision-upload";
import { Card, CardTitle, EmptyState } from "@/components/ui/card";
import type { EstimateResult } from "@/lib/estimating/types";

type PartRow = Awaited<ReturnType<typeof listPartsWithAnalysis>>[number];

/** Each part's estimate as the client sees it (or why there is none yet), with a new revision's upload while it may change. */
export function PartEstimates({ requestId, parts, units, cells, cureTempC, canRevise }: { requestId: string; parts: PartRow[]; units: "mm" | "in"; cells: Awaited<ReturnType<typeof loadFormCatalogue>>["cells"]; cureTempC: number | null; canRevise: boolean }) {
  return (
    <>
      {parts.length === 0 ? <EmptyState title="This request has no parts" /> : null}
      {parts.map(({ part, revision, analysis }) => (
        <div key={part.id} className="space-y-2">
          {revision && analysis?.status === "done" && analysis.result ? (
            <PartReview
              key={part.id}
              title={`${part.name} · ${revision.fileName}${revision.revision > 1 ? ` (revision ${revision.revision})` : ""} · qty ${part.quantity}`}
              revisionId={revision.id}
              result={clientEstimateOf(analysis.result) as EstimateResult}
              fileUnits={part.units}
              displayUnits={units}
              cells={cells}
              cureTempC={cureTempC}
              isPreviewOnDemand={parts.length > 1}
            />
          ) : (
            <Card key={part.id}>
              <CardTitle>{part.name}</CardTitle>
              <p className="mt-2 text-sm text-ink-500">
                {!revision ? "No file." : analysis?.status === "failed" ? `The file could not be analysed: ${analysis.errorMessage}` : "The analysis is still running."}
              </p>
            </Card>
          )}
          {canRevise ? <RevisionUpload requestId={requestId} partId={part.id} fileName={revision?.fileName ?? null} /> : null}
        </div>
      ))}
    </>
  );
}
