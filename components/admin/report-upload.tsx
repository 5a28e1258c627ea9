"use client";

import { generateUploadButton } from "@uploadthing/react";
import { useState } from "react";
import type { UploadRouter } from "@/app/api/uploadthing/core";

const UploadButton = generateUploadButton<UploadRouter>();

/** Inspection report upload through the `inspectionReport` route; hands back our upload id. */
export function ReportUpload({ onUploaded, uploaded }: { onUploaded: (uploadId: string) => void; uploaded: boolean }) {
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-1">
      <p className="text-sm font-medium text-ink-700">Inspection report</p>
      <UploadButton
        endpoint="inspectionReport"
        appearance={{ button: "rounded bg-white px-3 text-sm text-ink-700 ring-1 ring-paper-300 h-8", allowedContent: "text-xs text-ink-400" }}
        onClientUploadComplete={(files) => {
          const id = (files[0]?.serverData as { uploadId?: string } | undefined)?.uploadId;
          if (id) onUploaded(id);
          setError(null);
        }}
        onUploadError={(e) => setError(e.message)}
      />
      {uploaded ? <p className="text-xs text-tide-700">Report uploaded; it is filed with the order when you save.</p> : null}
      {error ? <p className="text-xs text-signal-danger" role="alert">{error}</p> : null}
    </div>
  );
}
