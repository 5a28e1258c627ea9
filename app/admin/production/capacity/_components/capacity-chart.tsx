import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";
import { cn } from "@/components/ui/cn";
import type { ResourceWeeks, WeekBar } from "@/lib/scheduling/capacity";

const day = (iso: string) => new Date(`${iso}T12:00:00Z`).toLocaleDateString("en-GB", { day: "numeric", month: "short", timeZone: "UTC" });
const h = (v: number) => `${Math.round(v)} h`;

/** One week as a stacked column: booked, waiting and blocked against the week's shift hours (the frame). */
function WeekColumn({ w, scale }: { w: WeekBar; scale: number }) {
  const px = (v: number) => `${Math.min(100, (v / scale) * 100)}%`;
  const label = `Week of ${day(w.weekStart)}: ${h(w.bookedHours)} booked, ${w.waitingHours ? `${h(w.waitingHours)} waiting, ` : ""}${w.blockedHours ? `${h(w.blockedHours)} blocked, ` : ""}${h(w.availableHours)} available${w.isOverloaded ? ", overloaded" : ""}`;
  return (
    <div className="flex min-w-0 flex-col items-center gap-1">
      <div role="img" aria-label={label} title={label} className={cn("relative h-28 w-full max-w-12 overflow-hidden rounded-sm bg-paper-100 ring-1", w.isOverloaded ? "ring-2 ring-signal-danger" : "ring-paper-300")}>
        {/* the week's shift hours as the frame's height; the stack fills from the bottom */}
        <div className="absolute inset-x-0 bottom-0 flex flex-col-reverse" style={{ height: "100%" }}>
          <div className="w-full bg-tide-500" style={{ height: px(w.bookedHours) }} />
          <div className="w-full bg-amber-300" style={{ height: px(w.waitingHours) }} />
          <div className="w-full bg-[repeating-linear-gradient(45deg,theme(colors.ink.400)_0_3px,theme(colors.paper.100)_3px_6px)]" style={{ height: px(w.blockedHours) }} />
        </div>
        <div className="absolute inset-x-0 border-t border-dashed border-ink-500" style={{ bottom: px(w.availableHours) }} aria-hidden="true" />
      </div>
      <span className="text-[11px] leading-tight text-ink-600 figures">{day(w.weekStart)}</span>
      <span className={cn("text-[11px] leading-tight figures", w.isOverloaded ? "font-semibold text-signal-danger" : "text-ink-500")}>
        {Math.round(w.bookedHours + w.waitingHours + w.blockedHours)}/{Math.round(w.availableHours)}
      </span>
    </div>
  );
}

/**
 * Each cell and the router: eight weekly columns (booked, accepted work waiting for a slot, and
 * maintenance, against the week's shift hours), an overloaded week ringed and named, and the jobs
 * behind each column listed under it.
 */
export function CapacityChart({ rows }: { rows: ResourceWeeks[] }) {
  return (
    <div className="space-y-4">
      <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-ink-600">
        <span className="inline-flex items-center gap-1"><span className="h-3 w-3 rounded-sm bg-tide-500" aria-hidden="true" />Booked</span>
        <span className="inline-flex items-center gap-1"><span className="h-3 w-3 rounded-sm bg-amber-300" aria-hidden="true" />Accepted, waiting for a slot (in the week before its promised date)</span>
        <span className="inline-flex items-center gap-1"><span className="h-3 w-3 rounded-sm bg-[repeating-linear-gradient(45deg,theme(colors.ink.400)_0_3px,theme(colors.paper.100)_3px_6px)]" aria-hidden="true" />Maintenance</span>
        <span className="inline-flex items-center gap-1"><span className="h-0 w-4 border-t border-dashed border-ink-500" aria-hidden="true" />Shift hours of the week</span>
      </p>
      {rows.map((r) => {
        const scale = Math.max(1, ...r.weeks.map((w) => Math.max(w.availableHours, w.bookedHours + w.waitingHours + w.blockedHours)));
        const over = r.weeks.filter((w) => w.isOverloaded);
        return (
          <Card key={r.key}>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h3 className="font-semibold text-ink-800">{r.name}</h3>
              {over.length ? <Badge tone="danger">Overloaded: week of {over.map((w) => day(w.weekStart)).join(", ")}</Badge> : <Badge tone="ok">Within its shift hours</Badge>}
            </div>
            <div className="mt-3 grid grid-cols-8 gap-1 sm:gap-2">
              {r.weeks.map((w) => <WeekColumn key={w.weekStart} w={w} scale={scale} />)}
            </div>
            <details className="mt-3 text-sm">
              <summary className="cursor-pointer text-ink-700">Jobs behind the columns</summary>
              <ul className="mt-2 space-y-2">
                {r.weeks.filter((w) => w.jobs.length || w.blocks.length).map((w) => (
                  <li key={w.weekStart}>
                    <span className="font-medium">Week of {day(w.weekStart)}</span>
                    <ul className="ml-4 list-disc text-ink-600">
                      {w.jobs.map((j) => (
                        <li key={`${j.orderId}-${j.isWaiting}`}>
                          <Link className="underline" href={`/admin/production/orders/${j.orderId}`}>{j.reference}</Link>{" "}
                          <span className="figures">{h(j.hours)}</span>{j.isWaiting ? " (accepted, not yet booked)" : ""}
                        </li>
                      ))}
                      {w.blocks.map((b, i) => <li key={`b${i}`}>Maintenance: {b.reason} <span className="figures">{h(b.hours)}</span></li>)}
                    </ul>
                  </li>
                ))}
              </ul>
            </details>
          </Card>
        );
      })}
    </div>
  );
}
