"use client";

import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { ATTACHMENT_LIMIT, useUploadThing } from "./uploadthing";

type State = { kind: "idle" } | { kind: "uploading"; pct: number } | { kind: "done"; fileName: string } | { kind: "error"; text: string };

/**
 * One PDF sent through the `attachment` upload route (a purchase order, a certificate); the
 * server action it is given to checks again that it is the user's own upload and a PDF.
 */
export function PdfUpload({ id, label, hint, onUploaded }: { id: string; label: string; hint: string; onUploaded: (uploadId: string | null) => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<State>({ kind: "idle" });
  const { startUpload } = useUploadThing("attachment", {
    onUploadProgress: (pct) => setState({ kind: "uploading", pct }),
    onUploadError: (e) => setState({ kind: "error", text: e.message || "The upload failed; try again." }),
  });
  async function pick(file: File | undefined) {
    if (!file) return;
    if (!/\.pdf$/i.test(file.name) && file.type !== "application/pdf") return setState({ kind: "error", text: `“${file.name}” is not a PDF.` });
    if (file.size === 0) return setState({ kind: "error", text: `“${file.name}” is empty.` });
    if (file.size > ATTACHMENT_LIMIT.bytes) return setState({ kind: "error", text: `“${file.name}” is over ${ATTACHMENT_LIMIT.label}.` });
    setState({ kind: "uploading", pct: 0 });
    onUploaded(null);
    try {
      const res = await startUpload([file]);
      const uploadId = (res?.[0]?.serverData as { uploadId?: string } | undefined)?.uploadId;
      if (!uploadId) return setState((s) => (s.kind === "error" ? s : { kind: "error", text: "The upload did not finish; try again." }));
      setState({ kind: "done", fileName: file.name });
      onUploaded(uploadId);
    } catch {
      setState({ kind: "error", text: "The upload failed; try again." });
    } finally {
      if (input.current) input.current.value = "";
    }
  }
  return (
    <div className="space-y-1">
      <p className="text-sm font-medium text-ink-700" id={`${id}-label`}>
        {label}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <input ref={input} id={id} type="file" accept="application/pdf,.pdf" className="sr-only" aria-labelledby={`${id}-label`} disabled={state.kind === "uploading"} onChange={(e) => void pick(e.target.files?.[0])} />
        <Button type="button" variant="secondary" size="sm" disabled={state.kind === "uploading"} onClick={() => input.current?.click()}>
          {state.kind === "uploading" ? `Uploading… ${Math.round(state.pct)} %` : state.kind === "done" ? "Replace the PDF" : "Choose a PDF"}
        </Button>
        <span className="text-xs text-ink-500">{state.kind === "done" ? `“${state.fileName}” attached.` : hint}</span>
      </div>
      {state.kind === "error" ? (
        <p className="text-xs text-signal-danger" role="alert">
          {state.text}
        </p>
      ) : null}
    </div>
  );
}
