"use client";

import { useFormContext, useWatch } from "react-hook-form";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/input";
import type { EstimateResult } from "@/lib/estimating/types";
import { materialWarnings } from "@/lib/estimating/warnings";
import { formatCents } from "@/lib/money";
import { formatLength, formatSize, fToC } from "@/lib/units";
import type { DraftInput } from "@/lib/validation/request";
import { AnalysisStatus, useAnalysis } from "./analysis-status";
import { BodyPicker } from "./body-picker";
import { ModelUpload } from "./model-upload";
import type { CatalogueForForm, PartFileState } from "./types";

type PartErrors = Record<string, { message?: string } | undefined>;

/** One part: its file, units, material, allowance, quantity and print mode. */
export function PartCard({
  index,
  catalogue,
  file,
  serverError,
  onUploaded,
  onFileError,
  onRemove,
}: {
  index: number;
  catalogue: CatalogueForForm;
  file: PartFileState;
  serverError?: string;
  onUploaded: (uploadId: string, fileName: string) => Promise<void>;
  onFileError: (message: string) => void;
  onRemove: () => void;
}) {
  const { register, control, setValue, getValues, formState } = useFormContext<DraftInput>();
  const base = `parts.${index}` as const;
  const e = ((formState.errors.parts as unknown as PartErrors[] | undefined)?.[index] ?? {});
  const units = useWatch({ control, name: `${base}.units` });
  const unitsConfirmed = useWatch({ control, name: `${base}.unitsConfirmed` });
  const materialKey = useWatch({ control, name: `${base}.materialKey` });
  const project = useWatch({ control, name: "project" });
  const analysis = useAnalysis(file.analysisId);
  const result = analysis.data?.status === "done" ? analysis.data.result : null;

  const material = catalogue.materials.find((m) => m.key === materialKey);
  const cureT = project.cureTemp === undefined || project.cureTemp === "" || project.cureTemp === null ? undefined : Number(project.cureTemp);
  const cureC = cureT === undefined || Number.isNaN(cureT) ? undefined : project.cureTempUnit === "F" ? fToC(cureT) : cureT;
  const cte = project.partCtePpmPerK === undefined || project.partCtePpmPerK === "" || project.partCtePpmPerK === null ? undefined : Number(project.partCtePpmPerK);
  const warnings = material ? materialWarnings(material, { cureTempC: cureC, partCtePpmPerK: cte === undefined || Number.isNaN(cte) ? undefined : cte }) : [];

  function switchUnits(next: "mm" | "in") {
    const cur = getValues(`${base}.units`);
    if (cur !== next) {
      const a = Number(getValues(`${base}.allowance`)) || 0;
      const converted = next === "in" ? a / 25.4 : a * 25.4;
      setValue(`${base}.allowance`, Math.round(converted * 1000) / 1000, { shouldDirty: true });
      setValue(`${base}.units`, next, { shouldDirty: true });
    }
    setValue(`${base}.unitsConfirmed`, true, { shouldDirty: true });
  }

  /**
   * A finished analysis of an unconfirmed file sets the units to the engine's guess. A file that
   * declares its units (STEP, IGES, 3MF) needs no confirmation: its declaration confirms them.
   */
  function adoptGuess(r: EstimateResult) {
    if (getValues(`${base}.unitsConfirmed`)) return;
    if (getValues(`${base}.units`) !== r.units) {
      const a = Number(getValues(`${base}.allowance`)) || 0;
      setValue(`${base}.allowance`, Math.round((r.units === "in" ? a / 25.4 : a * 25.4) * 1000) / 1000);
      setValue(`${base}.units`, r.units);
    }
    if (!r.unitsGuessed) setValue(`${base}.unitsConfirmed`, true, { shouldDirty: true });
  }

  return (
    <Card className="space-y-5" aria-labelledby={`part-${index}-title`} data-testid={`part-card-${index}`}>
      <div className="flex items-start justify-between gap-3">
        <h3 id={`part-${index}-title`} className="text-base font-semibold text-ink-800">
          Part {index + 1}
          {file.fileName ? <span className="ml-2 font-normal text-ink-500">· {file.fileName}{file.revision && file.revision > 1 ? ` (revision ${file.revision})` : ""}</span> : null}
        </h3>
        <Button type="button" variant="ghost" size="sm" onClick={onRemove}>
          Remove
        </Button>
      </div>

      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Part name" htmlFor={`${base}.name`} error={e.name?.message}>
          <Input id={`${base}.name`} {...register(`${base}.name`)} aria-invalid={Boolean(e.name)} />
        </Field>
        <div className="space-y-1">
          <span className="block text-sm font-medium text-ink-700">Model file</span>
          <ModelUpload id={`${base}.file`} currentFileName={file.fileName} onUploaded={onUploaded} onError={onFileError} />
        </div>
      </div>
      {file.error || serverError ? (
        <p role="alert" className="rounded bg-red-50 px-3 py-2 text-sm text-signal-danger" data-testid="part-file-error">
          {file.error ?? serverError}
        </p>
      ) : null}
      {file.analysisId ? <AnalysisStatus analysisId={file.analysisId} onDone={adoptGuess} /> : null}

      {result && (result as { status?: string }).status === "needs-review" ? (
        <div className="rounded border-l-4 border-amber-400 bg-amber-50 px-3 py-2 text-sm text-amber-900" data-testid="part-summary">
          <Badge tone="warn" className="mr-2">Engineer&rsquo;s review</Badge>
          {formatSize(result.bboxMm, units)} · {result.fitsAny ? `fits ${result.fits.filter((f) => f.fits).map((f) => f.cellName).join(", ")}` : "fits no cell in one piece"} · our engineer prices this part by hand; no automatic price is given.
        </div>
      ) : result ? (
        <div className="rounded bg-tide-50 px-3 py-2 text-sm text-tide-700" data-testid="part-summary">
          <Badge tone="info" className="mr-2">Automatic estimate</Badge>
          {formatSize(result.bboxMm, units)} · {result.fitsAny ? `fits ${result.fits.filter((f) => f.fits).map((f) => f.cellName).join(", ")}` : "fits no cell in one piece"} ·{" "}
          <strong>{result.status === "needs-review" ? "our engineer will quote it" : formatCents(result.totalCents)}</strong>
        </div>
      ) : null}

      {result?.cad && result.cad.bodies.length > 1 ? <BodyPicker index={index} bodies={result.cad.bodies} units={units} /> : null}

      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-700">Units of the file</legend>
        {unitsConfirmed && result && !result.unitsGuessed && result.units === units ? (
          <p className="text-xs text-tide-700">Units confirmed by the file: {units === "in" ? "inches" : "millimetres"}. {result.unitsReason}</p>
        ) : unitsConfirmed ? (
          <p className="text-xs text-tide-700">Units confirmed: {units === "in" ? "inches" : "millimetres"}.</p>
        ) : result?.unitsGuessed ? (
          <p className="text-xs text-ink-500">Our guess: {result.units === "in" ? "inches" : "millimetres"}. {result.unitsReason}</p>
        ) : null}
        <div className="flex flex-wrap items-center gap-2">
          {(["mm", "in"] as const).map((u) => (
            <button
              key={u}
              type="button"
              onClick={() => switchUnits(u)}
              aria-pressed={units === u}
              className={`rounded px-3 py-1.5 text-sm ring-1 ring-inset ${units === u ? "bg-ink-800 text-white ring-ink-800" : "bg-white text-ink-700 ring-paper-300 hover:bg-paper-100"}`}
            >
              {u === "mm" ? "Millimetres" : "Inches"}
            </button>
          ))}
          <label className="ml-1 inline-flex items-center gap-2 text-sm">
            <input type="checkbox" className="accent-kiln-600" {...register(`${base}.unitsConfirmed`)} />
            {unitsConfirmed ? "Units confirmed" : `Confirm ${units === "in" ? "inches" : "millimetres"}`}
          </label>
        </div>
        {e.unitsConfirmed?.message ? <p className="text-xs text-signal-danger" role="alert">{e.unitsConfirmed.message}</p> : null}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Material" htmlFor={`${base}.materialKey`} error={e.materialKey?.message}>
          <Select id={`${base}.materialKey`} {...register(`${base}.materialKey`)}>
            {catalogue.materials.map((m) => (
              <option key={m.key} value={m.key}>
                {m.name} — to {m.maxServiceTempC} °C
              </option>
            ))}
          </Select>
        </Field>
        <Field
          label={`Finish allowance (${units})`}
          htmlFor={`${base}.allowance`}
          error={e.allowance?.message}
          hint={`Machining stock on every surface; our default is ${formatLength(catalogue.defaultAllowanceMm, units, 2)}.`}
        >
          <Input id={`${base}.allowance`} type="number" step="any" inputMode="decimal" {...register(`${base}.allowance`)} aria-invalid={Boolean(e.allowance)} />
        </Field>
        <Field label="Quantity" htmlFor={`${base}.quantity`} error={e.quantity?.message}>
          <Input id={`${base}.quantity`} type="number" min={1} max={50} step={1} {...register(`${base}.quantity`)} aria-invalid={Boolean(e.quantity)} />
        </Field>
        <fieldset>
          <legend className="mb-1 block text-sm font-medium text-ink-700">Print</legend>
          <div className="flex gap-4 pt-2 text-sm">
            <label className="inline-flex items-center gap-2">
              <input type="radio" value="shell" className="accent-kiln-600" {...register(`${base}.printMode`)} /> Shell with internal ribs (usual for molds)
            </label>
            <label className="inline-flex items-center gap-2">
              <input type="radio" value="solid" className="accent-kiln-600" {...register(`${base}.printMode`)} /> Solid
            </label>
          </div>
        </fieldset>
      </div>
      {warnings.length ? (
        <ul className="space-y-1" data-testid="material-warnings">
          {warnings.map((w) => (
            <li key={w.code} className={`rounded px-3 py-2 text-sm ${w.code === "material-temperature" ? "bg-red-50 text-signal-danger" : "bg-amber-50 text-amber-900"}`}>
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
    </Card>
  );
}
