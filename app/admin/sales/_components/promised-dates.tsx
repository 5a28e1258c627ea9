import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle } from "@/components/ui/card";
import type { Db } from "@/db/client";
import { loadCapacityQueue } from "@/lib/analysis/capacity-queue";
import { loadCatalogue } from "@/db/queries/catalogue";
import { listBrokenPromises, listOpenQuotesWithEstimates } from "@/db/queries/ship-dates";
import { formatDate } from "@/lib/dates";
import { Ledger } from "@/lib/estimating/ledger";
import { plantOf } from "@/lib/estimating/stages/schedule";
import { LEAD_TIME_LABEL } from "@/lib/quoting/lead-times";
import { shipDateNow, specFromEstimates } from "@/lib/scheduling/promises";
import type { LeadTimeKey } from "@/lib/estimating/types";

const dayOf = (d: Date) => d.toISOString().slice(0, 10);
/** A quoted ship date is stored as its calendar day (UTC midnight): shown as that day, not shifted into the plant's zone. */
const quotedDay = (d: Date | null) => (d ? formatDate(`${dayOf(d)}T12:00:00Z`) : "—");

/**
 * Promised dates that no longer hold: orders whose planned ship is past the date their quote gave,
 * and issued quotes the calendar could no longer meet if accepted today (placed as booked now).
 */
export async function PromisedDates({ db, now }: { db: Db; now: Date }) {
  const cat = await loadCatalogue(db);
  const [orders, open, queue] = await Promise.all([listBrokenPromises(db), listOpenQuotesWithEstimates(db), cat ? loadCapacityQueue(db, now, cat.cells.map((c) => c.key)) : null]);
  const quotes = cat && queue
    ? open.flatMap((q) => {
        const spec = specFromEstimates(q.results, cat.cells, cat.rateCard);
        if (!spec) return [];
        const now2 = shipDateNow(new Ledger(queue, now.getTime(), plantOf(cat.rateCard)), spec);
        return now2 > dayOf(q.shipDate) ? [{ ...q, calendarDate: now2 }] : [];
      })
    : [];
  return (
    <Card className="mt-6" data-testid="promised-dates">
      <CardTitle>Promised dates that no longer hold</CardTitle>
      {orders.length === 0 && quotes.length === 0 ? (
        <p className="mt-2 text-sm text-ink-500">Every open quote and order can still ship by its promised date.</p>
      ) : (
        <ul className="mt-2 divide-y divide-paper-200 text-sm">
          {orders.map((o) => (
            <li key={o.orderId} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
              <span><Link className="font-medium underline" href={`/admin/sales/requests/${o.requestId}`}>{o.reference}</Link> · {o.projectName} · {o.firmName}</span>
              <span className="figures">promised {quotedDay(o.promised)}, now planned {formatDate(o.planned)} <Badge tone="danger">order</Badge></span>
            </li>
          ))}
          {quotes.map((q) => (
            <li key={q.quoteId} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
              <span><Link className="font-medium underline" href={`/admin/sales/requests/${q.requestId}`}>{q.reference}</Link> · quote {q.version} · {q.firmName}{q.leadTime !== "standard" ? ` · ${LEAD_TIME_LABEL[q.leadTime as LeadTimeKey]}` : ""}</span>
              <span className="figures">quoted {quotedDay(q.shipDate)}, calendar gives {formatDate(`${q.calendarDate}T12:00:00Z`)} <Badge tone="warn">issued quote</Badge></span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
