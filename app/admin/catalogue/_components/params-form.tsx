"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { saveCell, saveMaterial, saveRateCard } from "@/app/admin/catalogue/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Textarea } from "@/components/ui/input";
import { CELL_FIELDS, MATERIAL_FIELDS, RATE_CARD_FIELDS, fromShown, shownUnit, toShown, type NumberField } from "@/lib/validation/catalogue-fields";

const ACTIONS = { material: saveMaterial, cell: saveCell, rateCard: saveRateCard } as const;
const NUMBERS: Record<keyof typeof ACTIONS, NumberField[]> = { material: MATERIAL_FIELDS, cell: CELL_FIELDS, rateCard: RATE_CARD_FIELDS };
const TEXTS: Record<keyof typeof ACTIONS, { name: string; label: string; long?: boolean; list?: boolean }[]> = {
  material: [{ name: "key", label: "Catalogue code (CLI and API)" }, { name: "name", label: "Name" }, { name: "notes", label: "Notes", long: true }, { name: "source", label: "Source of the figures", long: true }],
  cell: [{ name: "key", label: "Catalogue code (CLI and API)" }, { name: "name", label: "Name" }, { name: "beadWidthsMm", label: "Bead widths (mm, comma separated)", list: true }, { name: "layerHeightsMm", label: "Layer heights (mm, comma separated)", list: true }, { name: "holidays", label: "Closed dates (YYYY-MM-DD, comma separated)", list: true }],
  rateCard: [{ name: "key", label: "Catalogue code (CLI and API)" }, { name: "name", label: "Name" }, { name: "currency", label: "Currency" }, { name: "plantTimeZone", label: "Plant time zone (IANA id)" }, { name: "holidays", label: "Plant closed dates (YYYY-MM-DD, comma separated)", list: true }, { name: "source", label: "Source of the figures", long: true }],
};
const DAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"];

/** One form for a catalogue entry; saving makes a new version, the old one stays for old quotes. */
export function ParamsForm({ kind, initial, idPrefix, keyLocked }: { kind: keyof typeof ACTIONS; initial: Record<string, unknown>; idPrefix: string; keyLocked?: boolean }) {
  const router = useRouter();
  // Money and shares are edited as dollars and percent; the action receives cents and basis points.
  const [values, setValues] = useState<Record<string, unknown>>(() => {
    const shown = { ...initial };
    for (const f of NUMBERS[kind]) if (typeof initial[f.name] === "number") shown[f.name] = toShown(f, initial[f.name] as number);
    return shown;
  });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  const set = (name: string, v: unknown) => setValues((x) => ({ ...x, [name]: v }));
  const str = (v: unknown) => (v === undefined || v === null ? "" : String(v));
  return (
    <form
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const stored = { ...values };
          for (const f of NUMBERS[kind]) stored[f.name] = fromShown(f, values[f.name]);
          const r = await ACTIONS[kind](stored);
          if (!r.ok) {
            setErrors(r.fieldErrors ?? {});
            return setMsg({ tone: "error", text: r.message });
          }
          setErrors({});
          setMsg({ tone: "ok", text: `Saved as version ${r.data.version}. Quotes made earlier keep their values.` });
          router.refresh();
        });
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        {TEXTS[kind].map((t) => (
          <Field key={t.name} label={t.label} htmlFor={`${idPrefix}-${t.name}`} error={errors[t.name]?.[0]}>
            {t.long ? (
              <Textarea id={`${idPrefix}-${t.name}`} className="min-h-16" value={str(values[t.name])} onChange={(e) => set(t.name, e.target.value)} />
            ) : (
              <Input id={`${idPrefix}-${t.name}`} value={str(values[t.name])} readOnly={t.name === "key" && keyLocked} onChange={(e) => set(t.name, e.target.value)} />
            )}
          </Field>
        ))}
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
        {NUMBERS[kind].map((f) => (
          <Field key={f.name} label={`${f.label} (${shownUnit(f)})`} htmlFor={`${idPrefix}-${f.name}`} error={errors[f.name]?.[0]}>
            <Input id={`${idPrefix}-${f.name}`} inputMode="decimal" value={str(values[f.name])} aria-invalid={Boolean(errors[f.name])} onChange={(e) => set(f.name, e.target.value)} />
          </Field>
        ))}
      </div>
      {kind !== "rateCard" ? (
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-2"><input type="checkbox" checked={values.isActive !== false} onChange={(e) => set("isActive", e.target.checked)} /> in service</label>
          {kind === "cell" ? <label className="flex items-center gap-2"><input type="checkbox" checked={Boolean(values.canPrintVertical)} onChange={(e) => set("canPrintVertical", e.target.checked)} /> can print vertically</label> : null}
        </div>
      ) : null}
      {kind === "cell" ? (
        <fieldset className="text-sm">
          <legend className="font-medium text-ink-700">Working days</legend>
          <div className="mt-1 flex flex-wrap gap-3">
            {DAYS.map((d, i) => {
              const days = (values.workingWeekdays as number[] | undefined) ?? [];
              return (
                <label key={d} className="flex items-center gap-1">
                  <input type="checkbox" checked={days.includes(i)} onChange={(e) => set("workingWeekdays", e.target.checked ? [...days, i] : days.filter((x) => x !== i))} /> {d}
                </label>
              );
            })}
          </div>
          {errors.workingWeekdays ? <p className="text-xs text-signal-danger">{errors.workingWeekdays[0]}</p> : null}
        </fieldset>
      ) : null}
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save new version"}</Button>
    </form>
  );
}
