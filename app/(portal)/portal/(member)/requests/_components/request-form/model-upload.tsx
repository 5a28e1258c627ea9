"use client";

import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { MODEL_ACCEPT, MODEL_LIMIT, useUploadThing } from "@/components/portal/uploadthing";

/**
 * Upload one model file through UploadThing with a progress bar. The server checks the content
 * after upload; `onUploaded` gets our upload id. Errors stay on this part.
 */
export function ModelUpload({
  id,
  currentFileName,
  onUploaded,
  onError,
  disabled,
  label = "Model file",
}: {
  id: string;
  /** The file chooser's accessible name (its button reads "Choose a file"). */
  label?: string;
  currentFileName: string | null;
  onUploaded: (uploadId: string, fileName: string) => Promise<void>;
  onError: (message: string) => void;
  disabled?: boolean;
}) {
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [phase, setPhase] = useState<"idle" | "uploading" | "checking">("idle");
  const { startUpload } = useUploadThing("model", {
    uploadProgressGranularity: "fine",
    onUploadProgress: (p) => setProgress(p),
    onUploadError: (e) => {
      setPhase("idle");
      setProgress(null);
      onError(e.message || "The upload failed; try again.");
    },
  });

  async function pick(file: File | undefined) {
    if (!file) return;
    const ext = file.name.includes(".") ? file.name.slice(file.name.lastIndexOf(".")).toLowerCase() : "";
    if (!MODEL_ACCEPT.split(",").includes(ext)) {
      onError(`“${file.name}” is not a file type we read. Send STL, OBJ, 3MF, STEP or IGES.`);
      return;
    }
    if (file.size > MODEL_LIMIT.bytes) {
      onError(`“${file.name}” is ${(file.size / 1048576).toFixed(0)} MB; the limit is ${MODEL_LIMIT.label}. Decimate the mesh or send a STEP export.`);
      return;
    }
    if (file.size === 0) {
      onError(`“${file.name}” is empty.`);
      return;
    }
    setPhase("uploading");
    setProgress(0);
    try {
      const res = await startUpload([file]);
      const uploadId = (res?.[0]?.serverData as { uploadId?: string } | undefined)?.uploadId;
      if (!uploadId) throw new Error("The upload did not finish; try again.");
      setPhase("checking");
      await onUploaded(uploadId, file.name);
    } catch (e) {
      onError((e as Error).message);
    } finally {
      setPhase("idle");
      setProgress(null);
      if (input.current) input.current.value = "";
    }
  }

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-3">
        <input
          ref={input}
          id={id}
          type="file"
          aria-label={label}
          accept={MODEL_ACCEPT}
          className="sr-only"
          disabled={disabled || phase !== "idle"}
          onChange={(e) => void pick(e.target.files?.[0])}
        />
        <Button type="button" variant="secondary" disabled={disabled || phase !== "idle"} onClick={() => input.current?.click()}>
          {currentFileName ? "Upload a new revision" : "Choose a file"}
        </Button>
        <span className="text-xs text-ink-500">STL, OBJ, 3MF, STEP or IGES · up to {MODEL_LIMIT.label}</span>
      </div>
      {phase !== "idle" ? (
        <div className="space-y-1" role="status" aria-live="polite">
          <div className="h-2 w-full overflow-hidden rounded bg-paper-200">
            <div className="h-full bg-kiln-500 transition-[width]" style={{ width: `${phase === "checking" ? 100 : Math.round(progress ?? 0)}%` }} />
          </div>
          <p className="text-xs text-ink-500">{phase === "checking" ? "Checking the file…" : `Uploading… ${Math.round(progress ?? 0)} %`}</p>
        </div>
      ) : null}
    </div>
  );
}
