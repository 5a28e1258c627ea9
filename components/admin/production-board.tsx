"use client";

import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { EmptyState, Skeleton } from "@/components/ui/card";
import { dateText, stageText } from "./format";
import { useApi } from "./use-api";

interface BoardRow {
  orderId: string;
  reference: string;
  projectName: string;
  firmName: string;
  stage: string;
  heldFromStage: string | null;
  isControlled: boolean;
  cellKey: string | null;
  plannedStart: string | null;
  plannedShip: string | null;
}

const COLUMNS: { title: string; stages: string[] }[] = [
  { title: "Waiting", stages: ["accepted", "deposit_paid"] },
  { title: "Scheduled", stages: ["scheduled"] },
  { title: "On the cell", stages: ["printing", "cooling"] },
  { title: "Machining & inspection", stages: ["machining", "inspection"] },
  { title: "Finishing & packing", stages: ["finishing", "packed"] },
  { title: "Shipped", stages: ["shipped", "delivered"] },
  { title: "On hold", stages: ["on_hold"] },
];

/** Orders by stage, in columns; closed and cancelled orders stay off the board. */
export function ProductionBoard() {
  const { data, error, isLoading } = useApi<{ rows: BoardRow[] }>("/api/admin/board");
  if (error) return <p role="alert" className="text-sm text-signal-danger">{error}</p>;
  if (isLoading && !data)
    return (
      <div className="grid gap-3 md:grid-cols-3 xl:grid-cols-7" aria-busy="true">
        {COLUMNS.map((c) => <Skeleton key={c.title} className="h-40" />)}
      </div>
    );
  const rows = data?.rows ?? [];
  if (rows.length === 0) return <EmptyState title="No orders yet">Orders appear here once a client accepts a quote.</EmptyState>;
  return (
    <div className="grid gap-3 md:grid-cols-3 xl:grid-cols-7">
      {COLUMNS.map((c) => {
        const inCol = rows.filter((r) => c.stages.includes(r.stage));
        return (
          <section key={c.title} aria-label={c.title} className="rounded-md bg-paper-100 p-2">
            <h3 className="mb-2 flex items-center justify-between px-1 text-xs font-semibold uppercase tracking-wide text-ink-500">
              {c.title} <span className="figures">{inCol.length}</span>
            </h3>
            <ul className="space-y-2">
              {inCol.length === 0 ? <li className="px-1 text-xs text-ink-400">—</li> : null}
              {inCol.map((r) => (
                <li key={r.orderId}>
                  <Link href={`/admin/production/orders/${r.orderId}`} className="block rounded bg-white p-2 text-sm shadow-sm ring-1 ring-paper-200 hover:ring-kiln-400">
                    <span className="font-medium text-ink-800">{r.reference}</span>
                    <span className="block truncate text-xs text-ink-500">{r.projectName}</span>
                    <span className="mt-1 flex flex-wrap gap-1">
                      <Badge tone={r.stage === "deposit_paid" ? "ok" : "neutral"}>{stageText(r.stage)}{r.heldFromStage ? ` (${stageText(r.heldFromStage)})` : ""}</Badge>
                      {r.isControlled ? <Badge tone="danger">controlled</Badge> : null}
                    </span>
                    {r.plannedShip ? <span className="mt-1 block text-xs text-ink-500">ships {dateText(r.plannedShip)}</span> : null}
                  </Link>
                </li>
              ))}
            </ul>
          </section>
        );
      })}
    </div>
  );
}
