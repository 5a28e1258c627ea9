"use client";

import Link from "next/link";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Skeleton } from "@/components/ui/card";
import { cn } from "@/components/ui/cn";
import { dateTimeText } from "./format";
import { useApi } from "./use-api";

interface CalendarAnswer {
  cell: { key: string; name: string; calendar: { workingWeekdays: number[] } };
  from: string;
  to: string;
  blocks: { id: string; orderId: string; kind: string; startsAt: string; endsAt: string; reference: string; stage: string }[];
}

const KIND_CLASS: Record<string, string> = {
  print: "bg-kiln-500 text-white",
  cooling: "bg-kiln-100 text-kiln-700",
  machining: "bg-tide-500 text-white",
  finishing: "bg-tide-100 text-tide-700",
};
const DAY = 86_400_000;

/** A cell's timeline: one lane per order, blocks placed by time across the window. */
export function CellCalendar({ cellKey, cellName, days = 21 }: { cellKey: string; cellName: string; days?: number }) {
  const [offset, setOffset] = useState(0);
  const today = new Date(new Date().toISOString().slice(0, 10) + "T00:00:00Z").getTime() - 3 * DAY;
  const from = new Date(today + offset * 7 * DAY).toISOString().slice(0, 10);
  const { data, error, isLoading } = useApi<CalendarAnswer>(`/api/admin/calendar?cell=${encodeURIComponent(cellKey)}&from=${from}&days=${days}`);
  const start = Date.parse(`${from}T00:00:00Z`);
  const span = days * DAY;
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
      <div className="overflow-x-auto">
        <div className="min-w-[44rem]">
          <div className="relative flex h-6 border-b border-paper-200 text-[10px] text-ink-400">
            {Array.from({ length: days }, (_, i) => {
              const d = new Date(start + i * DAY);
              const weekend = !(data?.cell.calendar.workingWeekdays ?? [1, 2, 3, 4, 5]).includes(d.getUTCDay());
              return (
                <div key={i} className={cn("flex-1 border-l border-paper-200 px-0.5", weekend && "bg-paper-100")}>
                  {d.getUTCDate()}/{d.getUTCMonth() + 1}
                </div>
              );
            })}
          </div>
          {error ? <p role="alert" className="py-3 text-sm text-signal-danger">{error}</p> : null}
          {isLoading && !data ? <Skeleton className="mt-2 h-12" /> : null}
          {data && lanes.size === 0 ? <p className="py-3 text-sm text-ink-500">Nothing scheduled on {cellName} in these three weeks.</p> : null}
          {[...lanes.entries()].map(([orderId, blocks]) => (
            <div key={orderId} className="relative h-8 border-b border-paper-100">
              {blocks.map((b) => (
                <Link
                  key={b.id}
                  href={`/admin/production/orders/${orderId}`}
                  title={`${b.reference} · ${b.kind} · ${dateTimeText(b.startsAt)} – ${dateTimeText(b.endsAt)}`}
                  className={cn("absolute top-1 h-6 overflow-hidden rounded px-1 text-[11px] leading-6", KIND_CLASS[b.kind])}
                  style={{ left: `${pos(b.startsAt)}%`, width: `${Math.max(0.6, pos(b.endsAt) - pos(b.startsAt))}%` }}
                >
                  {b.kind === "print" ? b.reference : ""}
                </Link>
              ))}
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
