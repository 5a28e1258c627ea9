"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { attachPartFile } from "@/app/(portal)/portal/(member)/requests/actions";
import { AnalysisStatus } from "@/app/(portal)/portal/(member)/requests/_components/request-form/analysis-status";
import { ModelUpload } from "@/app/(portal)/portal/(member)/requests/_components/request-form/model-upload";

/** A new revision of a submitted part's file: analysed again, and any quote marked stale. */
export function RevisionUpload({ requestId, partId, fileName }: { requestId: string; partId: string; fileName: string | null }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [analysisId, setAnalysisId] = useState<string | null>(null);
  return (
    <div className="space-y-2 rounded bg-paper-50 p-3 ring-1 ring-paper-200">
      <p className="text-xs text-ink-500">Changed the design? A new revision is analysed again and our sales engineers re-quote it.</p>
      <ModelUpload
        id={`revision-${partId}`}
        label={fileName ? `New revision of ${fileName}` : "Model file"}
        currentFileName={fileName}
        onError={setError}
        onUploaded={async (uploadId) => {
          setError(null);
          const res = await attachPartFile({ requestId, partId, uploadId });
          if (!res.ok) return setError(res.message);
          setAnalysisId(res.data.analysisId);
        }}
      />
      {error ? <p role="alert" className="text-sm text-signal-danger">{error}</p> : null}
      {analysisId ? <AnalysisStatus analysisId={analysisId} onDone={() => router.refresh()} /> : null}
    </div>
  );
}
