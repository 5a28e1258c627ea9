"use client";

import Link from "next/link";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Skeleton } from "@/components/ui/card";
import { cn } from "@/components/ui/cn";
import { addPlantDays, formatDay, fromPlantInput, plantToday } from "@/lib/dates";
import { dateTimeText, stageText } from "@/components/admin/format";
import { useApi } from "@/components/admin/use-api";
import type { CalendarAnswer } from "@/lib/contracts/production";

const KIND_CLASS: Record<string, string> = {
  print: "bg-kiln-500 text-white",
  cooling: "bg-kiln-100 text-kiln-700",
  machining: "bg-tide-500 text-white",
  finishing: "bg-tide-100 text-tide-700",
};

/** A cell's timeline: one lane per order, blocks placed by time across the window. */
export function CellCalendar({ cellKey, cellName, days = 21 }: { cellKey: string; cellName: string; days?: number }) {
  const [offset, setOffset] = useState(0);
  // Days are the plant's days (lib/dates.ts): the window starts at the plant's midnight.
  const from = addPlantDays(plantToday(), offset * 7 - 3);
  const { data, error, isLoading } = useApi<CalendarAnswer>(`/api/admin/calendar?cell=${encodeURIComponent(cellKey)}&from=${from}&days=${days}`);
  const start = fromPlantInput(`${from}T00:00`)!.getTime();
  const span = fromPlantInput(`${addPlantDays(from, days)}T00:00`)!.getTime() - start;
  const pos = (iso: string) => Math.min(100, Math.max(0, ((Date.parse(iso) - start) / span) * 100));
  const lanes = new Map<string, CalendarAnswer["blocks"]>();
  for (const b of data?.blocks ?? []) lanes.set(b.orderId, [...(lanes.get(b.orderId) ?? []), b]);

  return (
    <section aria-label={`${cellName} calendar`} className="rounded-md bg-white p-3 ring-1 ring-paper-200">
      <div className="mb-2 flex items-center justify-between gap-2">
        <h3 className="font-semibold text-ink-800">{cellName}</h3>
        <div className="flex gap-1">
          <Button variant="ghost" size="sm" onClick={() => setOffset((o) => o - 1)} aria-label={`${cellName}: earlier week`}>←</Button>
          <Button variant="ghost" size="sm" onClick={() => setOffset(0)}>Now</Button>
          <Button variant="ghost" size="sm" onClick={() => setOffset((o) => o + 1)} aria-label={`${cellName}: later week`}>→</Button>
        </div>
      </div>
      <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto">
        <div className="min-w-[44rem]">
          <div className="relative flex h-6 border-b border-paper-200 text-[10px] text-ink-400">
            <div className="sticky left-0 z-10 w-36 shrink-0 bg-white px-1 leading-6">Order</div>
            {Array.from({ length: days }, (_, i) => {
              const ymd = addPlantDays(from, i);
              const weekday = new Date(`${ymd}T12:00:00Z`).getUTCDay();
              const weekend = !(data?.cell.calendar.workingWeekdays ?? [1, 2, 3, 4, 5]).includes(weekday);
              return (
                <div key={i} className={cn("flex-1 border-l border-paper-200 px-0.5 leading-6 text-ink-600", weekend && "bg-paper-100")}>
                  {formatDay(ymd).replace(/ \d{4}$/, "")}
                </div>
              );
            })}
          </div>
          {error ? <p role="alert" className="py-3 text-sm text-signal-danger">{error}</p> : null}
          {isLoading && !data ? <Skeleton className="mt-2 h-12" /> : null}
          {data && lanes.size === 0 ? <p className="py-3 text-sm text-ink-500">Nothing scheduled on {cellName} in these three weeks.</p> : null}
          {[...lanes.entries()].map(([orderId, blocks]) => (
            <div key={orderId} className="flex h-10 border-b border-paper-100">
              {/* The order is named once, beside its lane, so no bar has to carry a label it can't fit. */}
              <Link href={`/admin/production/orders/${orderId}`} className="sticky left-0 z-10 w-36 shrink-0 truncate bg-white px-1 text-xs leading-tight text-ink-800 hover:underline">
                <span className="figures block pt-1 font-medium">{blocks[0]!.reference}</span>
                <span className="block text-ink-500">{stageText(blocks[0]!.stage)}</span>
              </Link>
              <div className="relative flex-1">
              {blocks.map((b) => (
                <Link
                  key={b.id}
                  href={`/admin/production/orders/${orderId}`}
                  title={`${b.reference} · ${b.kind} · ${dateTimeText(b.startsAt)} – ${dateTimeText(b.endsAt)}`}
                  aria-label={`${b.reference} ${b.kind}, ${dateTimeText(b.startsAt)} to ${dateTimeText(b.endsAt)}`}
                  className={cn("absolute top-2 h-6 rounded", KIND_CLASS[b.kind])}
                  style={{ left: `${pos(b.startsAt)}%`, width: `${Math.max(0.6, pos(b.endsAt) - pos(b.startsAt))}%` }}
                />
              ))}
              </div>
            </div>
          ))}
        </div>
      </div>
      <p className="mt-2 flex flex-wrap gap-3 text-xs text-ink-500">
        {Object.entries(KIND_CLASS).map(([k, c]) => (
          <span key={k} className="flex items-center gap-1"><span className={cn("inline-block h-3 w-3 rounded", c)} />{k}{k === "print" || k === "cooling" ? " (holds the cell)" : ""}</span>
        ))}
      </p>
    </section>
  );
}
