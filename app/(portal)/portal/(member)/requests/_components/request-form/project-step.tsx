"use client";

import { useFormContext, useWatch } from "react-hook-form";
import { Field, Input, Select, Textarea } from "@/components/ui/input";
import { plantToday } from "@/lib/dates";
import { isPastDay, type DraftInput } from "@/lib/validation/request";

type Errors = Record<string, { message?: string } | undefined>;

/** Step 1: the project, its cure and whether its data is controlled. */
export function ProjectStep() {
  const { register, formState, control } = useFormContext<DraftInput>();
  const e = (formState.errors.project ?? {}) as Errors;
  const cure = useWatch({ control, name: "project.cureProcess" });
  const neededBy = useWatch({ control, name: "project.neededBy" });
  const today = plantToday();
  const isPast = typeof neededBy === "string" && /^\d{4}-\d{2}-\d{2}$/.test(neededBy) && isPastDay(neededBy);
  return (
    <div className="grid gap-5 sm:grid-cols-2">
      <div className="sm:col-span-2">
        <Field label="Project name" htmlFor="projectName" error={e.projectName?.message}>
          <Input id="projectName" {...register("project.projectName")} aria-invalid={Boolean(e.projectName)} placeholder="e.g. Wing rib layup tool" />
        </Field>
      </div>
      <Field
        label="Needed by"
        htmlFor="neededBy"
        error={e.neededBy?.message ?? (isPast ? "That date has passed; pick a date from today on." : undefined)}
        hint="The date the tool must be at your site."
      >
        <Input id="neededBy" type="date" min={today} {...register("project.neededBy")} aria-invalid={Boolean(e.neededBy) || isPast} />
      </Field>
      <Field label="Cure process" htmlFor="cureProcess" error={e.cureProcess?.message}>
        <Select id="cureProcess" {...register("project.cureProcess")}>
          <option value="room">Room temperature cure</option>
          <option value="oven">Oven cure</option>
          <option value="autoclave">Autoclave cure</option>
        </Select>
      </Field>
      <Field
        label={cure === "room" ? "Cure temperature (optional)" : "Cure temperature"}
        htmlFor="cureTemp"
        error={e.cureTemp?.message}
        hint="The highest temperature the tool sees in service."
      >
        <div className="flex gap-2">
          <Input id="cureTemp" type="number" step="any" inputMode="decimal" {...register("project.cureTemp")} aria-invalid={Boolean(e.cureTemp)} />
          <div className="w-24 shrink-0">
            <Select aria-label="Temperature unit" {...register("project.cureTempUnit")}>
              <option value="C">°C</option>
              <option value="F">°F</option>
            </Select>
          </div>
        </div>
      </Field>
      <Field
        label="Expansion of the part laid up on the tool (optional)"
        htmlFor="partCte"
        error={e.partCtePpmPerK?.message}
        hint="ppm/K. Carbon/epoxy about 2–4, glass/epoxy about 10–14. Used to warn about mismatched tool materials."
      >
        <Input id="partCte" type="number" step="any" inputMode="decimal" {...register("project.partCtePpmPerK")} aria-invalid={Boolean(e.partCtePpmPerK)} />
      </Field>
      <div className="sm:col-span-2">
        <label className="flex items-start gap-3 rounded bg-paper-50 p-3 ring-1 ring-paper-200">
          <input type="checkbox" className="mt-1 accent-kiln-600" {...register("project.isControlled")} />
          <span>
            <span className="block text-sm font-medium text-ink-800">This request holds controlled (export-restricted) technical data</span>
            <span className="block text-xs text-ink-500">Its files then open only for your firm and for bureau staff cleared for controlled work; every download is logged.</span>
          </span>
        </label>
      </div>
      <div className="sm:col-span-2">
        <Field label="Notes for the bureau (optional)" htmlFor="notes" error={e.notes?.message}>
          <Textarea id="notes" rows={3} {...register("project.notes")} />
        </Field>
      </div>
    </div>
  );
}
