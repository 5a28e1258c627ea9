"use client";

import { generateReactHelpers } from "@uploadthing/react";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { fileInspectionReport } from "@/app/admin/production/actions";
import type { UploadRouter } from "@/lib/uploads/file-router";
import { Button } from "@/components/ui/button";

const { useUploadThing } = generateReactHelpers<UploadRouter>();

/** The file router's limit for reports (lib/uploads/file-router.ts), said in our words. */
const REPORT_LIMIT = { bytes: 64 * 1024 * 1024, label: "64 MB" };

/** A report already filed on the order (the dates come formatted from the server, in plant time). */
export interface FiledReport {
  id: string;
  fileName: string;
  filedAt: string;
}

type State = { kind: "idle" } | { kind: "uploading"; pct: number } | { kind: "filing" } | { kind: "filed"; fileName: string } | { kind: "error"; text: string };

/**
 * Inspection report upload through the `inspectionReport` route. The report is filed with the
 * order as soon as it arrives (fileInspectionReport), so the client's order page lists it at once;
 * nothing waits for another button.
 */
export function ReportUpload({ orderId, reports }: { orderId: string; reports: FiledReport[] }) {
  const filedCount = reports.length;
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<State>({ kind: "idle" });
  const { startUpload } = useUploadThing("inspectionReport", {
    onUploadProgress: (pct) => setState({ kind: "uploading", pct }),
    onUploadError: (e) => setState({ kind: "error", text: e.message || "The upload failed; try again." }),
  });
  const busy = state.kind === "uploading" || state.kind === "filing";

  async function pick(file: File | undefined) {
    if (!file) return;
    if (file.size === 0) return setState({ kind: "error", text: `“${file.name}” is empty.` });
    if (file.size > REPORT_LIMIT.bytes) return setState({ kind: "error", text: `“${file.name}” is ${(file.size / 1048576).toFixed(0)} MB; a report can be up to ${REPORT_LIMIT.label}.` });
    setState({ kind: "uploading", pct: 0 });
    try {
      const res = await startUpload([file]);
      const uploadId = (res?.[0]?.serverData as { uploadId?: string } | undefined)?.uploadId;
      if (!uploadId) return setState((s) => (s.kind === "error" ? s : { kind: "error", text: "The upload did not finish; try again." }));
      setState({ kind: "filing" });
      const filed = await fileInspectionReport({ orderId, uploadId });
      if (!filed.ok) return setState({ kind: "error", text: filed.message });
      setState({ kind: "filed", fileName: filed.data.fileName });
      router.refresh();
    } catch {
      setState({ kind: "error", text: "The upload failed; try again." });
    } finally {
      if (input.current) input.current.value = "";
    }
  }

  return (
    <div className="space-y-1">
      <p className="text-sm font-medium text-ink-700" id="inspection-report-label">Inspection report</p>
      <div className="flex flex-wrap items-center gap-3">
        <input ref={input} id="inspection-report" type="file" className="sr-only" aria-labelledby="inspection-report-label" disabled={busy} onChange={(e) => void pick(e.target.files?.[0])} />
        <Button type="button" variant="secondary" disabled={busy} onClick={() => input.current?.click()}>
          {state.kind === "uploading" ? `Uploading… ${Math.round(state.pct)} %` : state.kind === "filing" ? "Filing…" : filedCount > 0 ? "Upload another report" : "Upload the report"}
        </Button>
        <span className="text-xs text-ink-500">One file (PDF, spreadsheet or photo), up to {REPORT_LIMIT.label}. The client sees it on their order page.</span>
      </div>
      <p className="text-xs" role="status" aria-live="polite">
        {state.kind === "filed" ? <span className="text-tide-700">“{state.fileName}” is filed with the order; the client can download it now.</span> : null}
      </p>
      {state.kind === "error" ? <p className="text-xs text-signal-danger" role="alert">{state.text}</p> : null}
      {reports.length ? (
        <ul className="space-y-1 text-sm" aria-label="Inspection reports on file">
          {reports.map((r) => (
            <li key={r.id} className="flex flex-wrap items-baseline gap-x-2">
              <a href={`/api/files/${r.id}`} className="break-all text-kiln-700 underline">{r.fileName}</a>
              <span className="text-xs text-ink-500">filed {r.filedAt}</span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
