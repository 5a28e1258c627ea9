"use client";

import { generateReactHelpers } from "@uploadthing/react";
import { useRef, useState } from "react";
import type { UploadRouter } from "@/app/api/uploadthing/core";
import { Button } from "@/components/ui/button";

const { useUploadThing } = generateReactHelpers<UploadRouter>();

/** The file router's limit for reports (app/api/uploadthing/core.ts), said in our words. */
const REPORT_LIMIT = { bytes: 64 * 1024 * 1024, label: "64 MB" };

/** Inspection report upload through the `inspectionReport` route; hands back our upload id. */
export function ReportUpload({ onUploaded, uploaded }: { onUploaded: (uploadId: string) => void; uploaded: boolean }) {
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const { startUpload } = useUploadThing("inspectionReport", {
    onUploadProgress: setProgress,
    onUploadError: (e) => setError(e.message || "The upload failed; try again."),
  });

  async function pick(file: File | undefined) {
    if (!file) return;
    setError(null);
    if (file.size === 0) return setError(`“${file.name}” is empty.`);
    if (file.size > REPORT_LIMIT.bytes) return setError(`“${file.name}” is ${(file.size / 1048576).toFixed(0)} MB; a report can be up to ${REPORT_LIMIT.label}.`);
    setProgress(0);
    try {
      const res = await startUpload([file]);
      const id = (res?.[0]?.serverData as { uploadId?: string } | undefined)?.uploadId;
      if (id) onUploaded(id);
      else setError("The upload did not finish; try again.");
    } finally {
      setProgress(null);
      if (input.current) input.current.value = "";
    }
  }

  return (
    <div className="space-y-1">
      <p className="text-sm font-medium text-ink-700">Inspection report</p>
      <div className="flex flex-wrap items-center gap-3">
        <input ref={input} id="inspection-report" type="file" className="sr-only" aria-label="Inspection report file" disabled={progress !== null} onChange={(e) => void pick(e.target.files?.[0])} />
        <Button type="button" variant="secondary" disabled={progress !== null} onClick={() => input.current?.click()}>
          {progress !== null ? `Uploading… ${Math.round(progress)} %` : uploaded ? "Replace the report" : "Choose the report"}
        </Button>
        <span className="text-xs text-ink-500">One file (PDF, spreadsheet or photo) · up to {REPORT_LIMIT.label}</span>
      </div>
      {uploaded ? <p className="text-xs text-tide-700">Report uploaded; it is filed with the order when you save.</p> : null}
      {error ? <p className="text-xs text-signal-danger" role="alert">{error}</p> : null}
    </div>
  );
}
