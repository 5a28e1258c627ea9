"use client";

import { useFormContext, useWatch } from "react-hook-form";
import type { EstimateResult } from "@/lib/estimating/types";
import { formatSize } from "@/lib/units";
import type { DraftInput } from "@/lib/validation/request";

type CadBody = NonNullable<EstimateResult["cad"]>["bodies"][number];

/**
 * For a STEP/IGES assembly: which of its bodies are to be printed. Unticking a body and saving
 * re-runs the estimate on the bodies left; none unticked means every body.
 */
export function BodyPicker({ index, bodies, units }: { index: number; bodies: CadBody[]; units: "mm" | "in" }) {
  const { control, setValue } = useFormContext<DraftInput>();
  const name = `parts.${index}.bodies` as const;
  const chosen = useWatch({ control, name });
  const selected = new Set(chosen?.length ? chosen : bodies.map((b) => b.index));

  function toggle(bodyIndex: number) {
    const next = new Set(selected);
    if (next.has(bodyIndex)) next.delete(bodyIndex);
    else next.add(bodyIndex);
    if (next.size === 0) return; // at least one body stays: an empty print is no request
    const all = next.size === bodies.length;
    setValue(name, all ? null : [...next].sort((a, b) => a - b), { shouldDirty: true });
  }

  return (
    <fieldset className="space-y-2" data-testid={`body-picker-${index}`}>
      <legend className="text-sm font-medium text-ink-700">
        Bodies in this file ({selected.size} of {bodies.length} to print)
      </legend>
      <p className="text-xs text-ink-500">Untick the bodies we should not print (fasteners, reference geometry). The estimate follows when the draft saves.</p>
      <ul className="max-h-56 divide-y divide-paper-200 overflow-y-auto rounded ring-1 ring-paper-200">
        {bodies.map((b) => (
          <li key={b.index}>
            <label className="flex cursor-pointer items-center gap-3 px-3 py-1.5 text-sm hover:bg-paper-50">
              <input type="checkbox" className="accent-kiln-600" checked={selected.has(b.index)} onChange={() => toggle(b.index)} />
              <span className="min-w-0 flex-1 truncate text-ink-800">{b.name || `Body ${b.index + 1}`}</span>
              <span className="figures whitespace-nowrap text-xs text-ink-500">{formatSize(b.sizeMm, units)}</span>
            </label>
          </li>
        ))}
      </ul>
    </fieldset>
  );
}
