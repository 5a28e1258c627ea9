"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useCallback, useState } from "react";
import { FormProvider, useFieldArray, useForm, useWatch } from "react-hook-form";
import { attachPartFile, submitRequest } from "@/app/(portal)/portal/(member)/requests/actions";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/card";
import { FormMessage } from "@/components/ui/input";
import { fToC } from "@/lib/units";
import { draftSchema, type DraftInput } from "@/lib/validation/request";
import { PartCard } from "./part-card";
import { ProjectStep } from "./project-step";
import { ReviewList } from "./review-list";
import { useDraftAutosave } from "./use-draft-autosave";
import { emptyFileState, type CatalogueForForm, type PartFileState } from "./types";
import { formatTime, zoneLabel } from "@/lib/dates";

const STEPS = ["Project", "Parts", "Review & submit"] as const;

/** The first catalogue material rated for the stated cure temperature (else the first one). */
function defaultMaterial(catalogue: CatalogueForForm, project: DraftInput["project"]): string {
  const t = project.cureTemp === undefined || project.cureTemp === "" || project.cureTemp === null ? NaN : Number(project.cureTemp);
  const c = Number.isNaN(t) ? null : project.cureTempUnit === "F" ? fToC(t) : t;
  const ok = c === null ? undefined : catalogue.materials.find((m) => m.maxServiceTempC >= c);
  return (ok ?? catalogue.materials[0])?.key ?? "";
}

export interface RequestFormProps {
  initial: DraftInput;
  initialFiles: Record<string, PartFileState>;
  reference: string | null;
  catalogue: CatalogueForForm;
}

/** The new-request form: three steps, saved to the server as a draft while you type. */
export function RequestForm({ initial, initialFiles, reference: initialRef, catalogue }: RequestFormProps) {
  const router = useRouter();
  const form = useForm<DraftInput>({ resolver: zodResolver(draftSchema), defaultValues: initial, mode: "onBlur" });
  const { control, handleSubmit, getValues, setValue, trigger, setError } = form;
  const parts = useFieldArray({ control, name: "parts", keyName: "_key" });
  const [step, setStep] = useState(0);
  const [files, setFiles] = useState<Record<string, PartFileState>>(initialFiles);
  const [formError, setFormError] = useState<string | null>(null);
  const [partErrors, setPartErrors] = useState<Record<number, string>>({});
  const [submitting, setSubmitting] = useState(false);
  /** Why Submit is off on the review step (a part with no file, a failed or running analysis), or null. */
  const [notReady, setNotReady] = useState<string | null>(null);

  const setFile = useCallback((partId: string, patch: Partial<PartFileState>) => setFiles((f) => ({ ...f, [partId]: { ...(f[partId] ?? emptyFileState), ...patch } })), []);
  const { reference, save, flush, settled } = useDraftAutosave(form, initialRef, setFile);

  function addPart() {
    const id = crypto.randomUUID();
    const u = catalogue.unitsPref;
    parts.append({
      id,
      name: `Part ${parts.fields.length + 1}`,
      materialKey: defaultMaterial(catalogue, getValues("project")),
      allowance: u === "in" ? Math.round((catalogue.defaultAllowanceMm / 25.4) * 1000) / 1000 : catalogue.defaultAllowanceMm,
      quantity: 1,
      printMode: "shell",
      units: u,
      unitsConfirmed: false,
      cellKey: "",
    });
    setFile(id, emptyFileState);
  }

  async function uploaded(index: number, uploadId: string) {
    const partId = getValues(`parts.${index}.id`);
    setFile(partId, { error: null });
    const requestId = await flush();
    if (!requestId) {
      setFile(partId, { error: "The draft could not be saved, so the file was not attached. Fix the highlighted fields and upload again." });
      return;
    }
    const res = await attachPartFile({ requestId, partId, uploadId });
    if (!res.ok) {
      setFile(partId, { error: res.message });
      return;
    }
    setValue(`parts.${index}.unitsConfirmed`, false);
    // A new file's bodies are not the old file's: print all of them until the client picks again.
    setValue(`parts.${index}.bodies`, null);
    setFile(partId, { revisionId: res.data.revisionId, fileName: res.data.fileName, revision: res.data.revision, analysisId: res.data.analysisId, error: null });
  }

  /** Why this step can not be left yet, or null: the step button never does nothing silently. */
  async function blockedBy(): Promise<string | null> {
    const ok = step === 0 ? await trigger("project") : await trigger("parts");
    if (!ok) return "Some fields on this step need attention; they are marked in red.";
    if (step === 1) {
      const ps = getValues("parts");
      if (ps.length === 0) return "Add at least one part, with its model file.";
      let problem: string | null = null;
      ps.forEach((p, i) => {
        if (files[p.id]?.revisionId && !p.unitsConfirmed) {
          setError(`parts.${i}.unitsConfirmed`, { message: "Confirm the file's units: choose millimetres or inches." });
          problem ??= `Confirm the units of “${p.name}” before you continue.`;
        }
      });
      if (problem) return problem;
    }
    return null;
  }

  async function next() {
    const problem = await blockedBy();
    if (problem) {
      setFormError(problem);
      // Bring the first marked field into view, so the reason is where the eye goes.
      requestAnimationFrame(() => document.querySelector<HTMLElement>('[aria-invalid="true"], [data-invalid="true"]')?.focus());
      return;
    }
    setFormError(null);
    await flush();
    setStep((s) => Math.min(s + 1, STEPS.length - 1));
    window.scrollTo({ top: 0 });
  }

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setPartErrors({});
    setSubmitting(true);
    try {
      await settled();
      const res = await submitRequest({ ...values, requestId: values.requestId ?? "" }); // a draft never saved has no id: refused as invalid
      if (!res.ok) {
        setFormError(res.message);
        const pe: Record<number, string> = {};
        for (const [k, msgs] of Object.entries(res.fieldErrors ?? {})) {
          const m = /^parts\.(\d+)\.(\w+)$/.exec(k);
          if (m && m[2] === "file") pe[Number(m[1])] = msgs[0] ?? "";
          else if (m) setError(`parts.${Number(m[1])}.${m[2]}` as "parts.0.name", { message: msgs[0] });
          else if (k.startsWith("project.")) setError(k as "project.projectName", { message: msgs[0] });
        }
        setPartErrors(pe);
        if (Object.keys(res.fieldErrors ?? {}).some((k) => k.startsWith("project."))) setStep(0);
        else if (Object.keys(res.fieldErrors ?? {}).some((k) => k.startsWith("parts"))) setStep(1);
        return;
      }
      router.push(`/portal/requests/${res.data.requestId}?submitted=1`);
    } finally {
      setSubmitting(false);
    }
  });

  const project = useWatch({ control, name: "project" });
  const cureNum = project.cureTemp === undefined || project.cureTemp === "" || project.cureTemp === null ? null : Number(project.cureTemp);
  const cureC = cureNum === null || Number.isNaN(cureNum) ? null : project.cureTempUnit === "F" ? fToC(cureNum) : cureNum;

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="space-y-6">
        <div className="flex flex-col gap-3 sm:flex-row sm:items-center sm:justify-between">
          <ol className="flex flex-wrap gap-2 text-sm" aria-label="Steps">
            {STEPS.map((label, i) => (
              <li key={label}>
                <button
                  type="button"
                  onClick={() => (i < step ? setStep(i) : void next())}
                  aria-current={i === step ? "step" : undefined}
                  className={`rounded-full px-3 py-1 ring-1 ring-inset ${i === step ? "bg-ink-800 text-white ring-ink-800" : i < step ? "bg-tide-50 text-tide-700 ring-tide-100" : "bg-white text-ink-500 ring-paper-300"}`}
                >
                  {i + 1}. {label}
                </button>
              </li>
            ))}
          </ol>
          <p className="text-xs text-ink-500" role="status" aria-live="polite" data-testid="save-state">
            {reference ? <span className="mr-2 font-mono text-ink-700">{reference}</span> : null}
            {save.kind === "saving" ? "Saving draft…" : save.kind === "saved" ? `Draft saved ${formatTime(save.at)} ${zoneLabel(save.at)}` : save.kind === "error" ? save.message : reference ? "Draft" : "Not saved yet"}
          </p>
        </div>

        <div hidden={step !== 0}>
          <ProjectStep />
        </div>

        <div hidden={step !== 1} className="space-y-4">
          {parts.fields.length === 0 ? (
            <EmptyState title="No parts yet">Add a part for each mold, plug or fixture; each gets its own file, material and allowance.</EmptyState>
          ) : null}
          {parts.fields.map((f, i) => (
            <PartCard
              key={f._key}
              index={i}
              catalogue={catalogue}
              file={files[f.id] ?? emptyFileState}
              serverError={partErrors[i]}
              onUploaded={(uploadId) => uploaded(i, uploadId)}
              onFileError={(message) => setFile(f.id, { error: message })}
              onRemove={() => parts.remove(i)}
            />
          ))}
          <Button type="button" variant="secondary" onClick={addPart}>
            + Add a part
          </Button>
        </div>

        <div hidden={step !== 2} className="space-y-4">
          {step === 2 ? (
            <ReviewList catalogue={catalogue} files={files} cureTempC={cureC} onReadiness={setNotReady} />
          ) : null}
        </div>

        <FormMessage>{formError}</FormMessage>
        <div className="flex flex-wrap items-center gap-3 border-t border-paper-200 pt-4">
          {step > 0 ? (
            <Button type="button" variant="secondary" onClick={() => setStep((s) => s - 1)}>
              Back
            </Button>
          ) : null}
          {step < STEPS.length - 1 ? (
            <Button type="button" onClick={() => void next()}>
              Continue
            </Button>
          ) : (
            <Button type="submit" disabled={submitting || notReady !== null} aria-describedby={notReady ? "submit-blocked" : undefined}>
              {submitting ? "Submitting…" : "Submit to the bureau"}
            </Button>
          )}
          {step === STEPS.length - 1 && notReady ? (
            <span id="submit-blocked" className="text-xs font-medium text-signal-warn">{notReady}</span>
          ) : (
            <span className="text-xs text-ink-500">Your draft is kept on our server; you can leave and come back.</span>
          )}
        </div>
      </form>
    </FormProvider>
  );
}
