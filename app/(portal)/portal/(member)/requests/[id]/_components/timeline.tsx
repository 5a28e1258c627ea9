import type { Stage } from "@/db/schema/common";
import { FLOW } from "@/lib/orders/stages";
import { cn } from "@/components/ui/cn";
import { STAGE_LABEL } from "@/lib/labels";
import { formatDate } from "@/lib/dates";

export interface TimelineEvent {
  toStage: Stage;
  at: Date;
  note: string | null;
  actorName: string | null;
}

const day = (d: Date) => formatDate(d);

/** A planned ship date that moved, with the reason the bureau gave. */
export interface ShipDateMove {
  id: string;
  fromDate: Date | null;
  toDate: Date;
  reason: string;
  at: Date;
}

/** The order's life as a vertical timeline: actual dates where reached, planned dates ahead, and each move of the ship date. */
export function StageTimeline({ stage, events, planned, dateChanges = [] }: { stage: Stage; events: TimelineEvent[]; planned: Partial<Record<Stage, Date | null>>; dateChanges?: ShipDateMove[] }) {
  const reached = new Map<Stage, TimelineEvent>();
  for (const e of events) reached.set(e.toStage, e);
  const current = FLOW.indexOf(stage === "on_hold" ? (events.at(-2)?.toStage ?? "draft") : stage);
  const off = stage === "on_hold" || stage === "cancelled";
  return (
    <ol className="relative space-y-0 text-sm" aria-label="Order timeline">
      {FLOW.map((s, i) => {
        const ev = reached.get(s);
        const done = i <= current && Boolean(ev || i === 0);
        const isNow = s === stage;
        const plan = planned[s];
        return (
          <li key={s} className="relative flex gap-3 pb-3 last:pb-0">
            <span className="flex flex-col items-center">
              <span className={cn("mt-1 h-3 w-3 rounded-full ring-2", isNow ? "bg-kiln-500 ring-kiln-100" : done ? "bg-tide-500 ring-tide-100" : "bg-white ring-paper-300")} aria-hidden="true" />
              {i < FLOW.length - 1 ? <span className={cn("w-px flex-1", done && i < current ? "bg-tide-500" : "bg-paper-300")} aria-hidden="true" /> : null}
            </span>
            <div className="min-w-0 pb-1">
              <p className={cn("font-medium", isNow ? "text-kiln-700" : done ? "text-ink-800" : "text-ink-400")}>
                {STAGE_LABEL[s]}
                {isNow ? <span className="sr-only"> (current)</span> : null}
              </p>
              <p className="text-xs text-ink-500">
                {ev ? `${day(ev.at)}${ev.actorName ? ` · ${ev.actorName}` : ""}` : plan ? `planned ${day(plan)}` : null}
                {ev?.note ? ` · ${ev.note}` : ""}
              </p>
            </div>
          </li>
        );
      })}
      {dateChanges.length ? (
        <li className="mt-2 rounded bg-paper-100 px-3 py-2">
          <p className="text-xs font-medium text-ink-600">Ship date changes</p>
          <ul className="mt-1 space-y-1 text-xs text-ink-700">
            {dateChanges.map((c) => (
              <li key={c.id}>
                {day(c.at)}: planned ship moved from <span className="figures">{c.fromDate ? day(c.fromDate) : "—"}</span> to <span className="figures font-medium">{day(c.toDate)}</span>. {c.reason}
              </li>
            ))}
          </ul>
        </li>
      ) : null}
      {off ? (
        <li className="mt-2 rounded bg-amber-50 px-3 py-2 text-amber-900">
          {STAGE_LABEL[stage]}
          {events.at(-1)?.note ? `: ${events.at(-1)!.note}` : ""}
        </li>
      ) : null}
    </ol>
  );
}
