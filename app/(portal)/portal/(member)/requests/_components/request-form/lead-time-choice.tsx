"use client";

import { useEffect } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import { formatDateLong } from "@/lib/dates";
import { formatCents } from "@/lib/money";
import { LEAD_TIME_LABEL, requestLeadTimes } from "@/lib/quoting/lead-times";
import type { EstimateResult } from "@/lib/estimating/types";
import type { DraftInput } from "@/lib/validation/request";

const WHAT = {
  standard: "Your parts take their turn on the calendar.",
  expedite: "Extra shifts and weekends, and ahead of booked work that still makes its own date.",
  economy: "A later date, fitted into spare capacity, at a lower price.",
} as const;

/**
 * The delivery the client asks for, from the estimate's choices for the whole request: each with
 * its ship date (the plant's calendar) and total. The quote carries the choice.
 */
export function LeadTimeChoice({ results }: { results: EstimateResult[] }) {
  const { register, setValue, control } = useFormContext<DraftInput>();
  const chosen = useWatch({ control, name: "project.leadTime" }) ?? "standard";
  const options = requestLeadTimes(results);
  const isOffered = options.some((o) => o.key === chosen);
  // a choice the estimate no longer offers (economy gone as the calendar filled) falls back to standard
  useEffect(() => {
    if (!isOffered) setValue("project.leadTime", "standard", { shouldDirty: true });
  }, [isOffered, setValue]);
  if (options.length < 2) return null;
  return (
    <fieldset className="rounded border border-paper-300 bg-white p-4" data-testid="lead-time-choice">
      <legend className="px-1 text-sm font-semibold text-ink-800">Delivery</legend>
      <p className="text-xs text-ink-500">Ship dates follow the current production calendar and may move until the order is booked.</p>
      <div className="mt-3 grid gap-2 sm:grid-cols-3">
        {options.map((o) => (
          <label key={o.key} className={`flex cursor-pointer flex-col gap-1 rounded p-3 ring-1 ring-inset ${chosen === o.key ? "bg-tide-50 ring-tide-500" : "ring-paper-300 hover:bg-paper-50"}`}>
            <span className="flex items-center gap-2">
              <input type="radio" value={o.key} {...register("project.leadTime")} />
              <span className="font-medium text-ink-800">{LEAD_TIME_LABEL[o.key]}</span>
            </span>
            <span className="text-sm text-ink-700">Ships {formatDateLong(`${o.shipDate}T12:00:00Z`)}</span>
            <span className="figures text-sm font-semibold text-ink-800">{formatCents(o.totalCents)}</span>
            <span className="text-xs text-ink-500">{WHAT[o.key]}</span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
