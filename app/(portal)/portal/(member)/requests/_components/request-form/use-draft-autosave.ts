"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { useWatch, type UseFormReturn } from "react-hook-form";
import { saveDraft } from "@/app/(portal)/portal/(member)/requests/actions";
import { draftSchema, type DraftInput } from "@/lib/validation/request";
import type { PartFileState } from "./types";

export type SaveState = { kind: "idle" } | { kind: "saving" } | { kind: "saved"; at: Date } | { kind: "error"; message: string };

/**
 * The draft kept on the server: saved a moment after the last change and on demand (`flush`),
 * one save at a time; the first save gives the request its id, reference and address.
 */
export function useDraftAutosave(form: UseFormReturn<DraftInput>, initialReference: string | null, setFile: (partId: string, patch: Partial<PartFileState>) => void) {
  const { control, getValues, setValue } = form;
  const [reference, setReference] = useState(initialReference);
  const [save, setSave] = useState<SaveState>({ kind: "idle" });
  const inflight = useRef<Promise<string | null> | null>(null);

  /** Save the draft now (after any save in flight); resolves to the request id. */
  const flush = useCallback(async (): Promise<string | null> => {
    const run = (inflight.current ?? Promise.resolve(getValues("requestId") ?? null)).then(async () => {
      const values = getValues();
      const parsed = draftSchema.safeParse(values);
      if (!parsed.success) {
        setSave({ kind: "error", message: "Not saved yet: some fields need attention." });
        return values.requestId ?? null;
      }
      setSave({ kind: "saving" });
      const res = await saveDraft(values);
      if (!res.ok) {
        setSave({ kind: "error", message: res.message });
        return values.requestId ?? null;
      }
      if (!values.requestId) {
        setValue("requestId", res.data.requestId);
        setReference(res.data.reference);
        // Keep the address of the saved draft so a reload finds it.
        window.history.replaceState(null, "", `/portal/requests/${res.data.requestId}`);
      }
      for (const [partId, analysisId] of Object.entries(res.data.analyses)) setFile(partId, { analysisId });
      setSave({ kind: "saved", at: new Date() });
      return res.data.requestId;
    });
    inflight.current = run.catch(() => null);
    return run;
  }, [getValues, setValue, setFile]);

  // Autosave a moment after the last change.
  const watched = useWatch({ control });
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    const t = setTimeout(() => void flush(), 1200);
    return () => clearTimeout(t);
  }, [watched, flush]);

  /** Resolves once the save in flight, if any, is done. */
  const settled = useCallback(() => inflight.current ?? Promise.resolve(null), []);
  return { reference, save, flush, settled };
}
