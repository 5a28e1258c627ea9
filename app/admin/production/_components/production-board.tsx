"use client";

import Link from "next/link";
import { useState } from "react";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState, Skeleton } from "@/components/ui/card";
import { BOARD_COLUMNS, BOARD_PAGE } from "@/lib/orders/board";
import { StageBadge } from "@/components/stage-badge";
import { dateText } from "@/components/admin/format";
import { useApi } from "@/components/admin/use-api";
import type { BoardAnswer, BoardCard, BoardColumn } from "@/lib/contracts/production";

/** Orders by stage, in columns, nearest work first; a column shows 20 cards and loads more on asking. */
export function ProductionBoard() {
  const { data, error, isLoading } = useApi<BoardAnswer>("/api/admin/board");
  if (error) return <p role="alert" className="text-sm text-signal-danger">{error}</p>;
  if (isLoading && !data)
    return (
      <div className="grid gap-3 md:grid-cols-3 xl:grid-cols-7" aria-busy="true">
        {BOARD_COLUMNS.map((c) => <Skeleton key={c.key} className="h-40" />)}
      </div>
    );
  const columns = data?.columns ?? [];
  if (columns.every((c) => c.total === 0)) return <EmptyState title="No orders yet">Orders appear here once a client accepts a quote.</EmptyState>;
  return (
    <div className="grid gap-3 md:grid-cols-3 xl:grid-cols-7">
      {columns.map((c) => (
        <Column key={c.key} column={c} />
      ))}
    </div>
  );
}

function Column({ column }: { column: BoardColumn }) {
  // Further pages of this column, fetched on asking; a fresh first page (after a reload) resets them.
  const [more, setMore] = useState<{ first: BoardColumn; cards: BoardCard[] }>({ first: column, cards: [] });
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const extra = more.first === column ? more.cards : [];
  const cards = [...column.cards, ...extra];
  const left = column.total - cards.length;

  async function loadMore() {
    setBusy(true);
    setProblem(null);
    try {
      const r = await fetch(`/api/admin/board?column=${encodeURIComponent(column.key)}&offset=${cards.length}&limit=${BOARD_PAGE}`, { headers: { accept: "application/json" }, cache: "no-store" });
      const body = await r.json().catch(() => null);
      if (!r.ok) throw new Error(body?.error?.message ?? `The server answered ${r.status}.`);
      const next = (body as { columns: BoardColumn[] }).columns[0]?.cards ?? [];
      setMore({ first: column, cards: [...extra, ...next] });
    } catch (e) {
      setProblem((e as Error).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section aria-label={column.title} className="rounded-md bg-paper-100 p-2">
      <h3 className="mb-2 flex items-center justify-between px-1 text-xs font-semibold uppercase tracking-wide text-ink-500">
        {column.title} <span className="figures">{column.total}</span>
      </h3>
      <ul className="space-y-2">
        {cards.length === 0 ? <li className="px-1 text-xs text-ink-400">—</li> : null}
        {cards.map((r) => (
          <li key={r.orderId}>
            <Link href={`/admin/production/orders/${r.orderId}`} className="block rounded bg-white p-2 text-sm shadow-sm ring-1 ring-paper-200 hover:ring-kiln-400">
              <span className="font-medium text-ink-800">{r.reference}</span>
              <span className="block truncate text-xs text-ink-500">{r.projectName}</span>
              <span className="block truncate text-xs text-ink-400">{r.firmName}</span>
              <span className="mt-1 flex flex-wrap gap-1">
                <StageBadge stage={r.stage} heldFrom={r.heldFromStage} />
                {r.isControlled ? <Badge tone="danger">controlled</Badge> : null}
              </span>
              {/* A planned ship date only means something until the job has shipped. */}
              {r.plannedShip && r.stage !== "shipped" && r.stage !== "delivered" ? <span className="mt-1 block text-xs text-ink-500">ships {dateText(r.plannedShip)}</span> : null}
            </Link>
          </li>
        ))}
      </ul>
      {left > 0 ? (
        <Button type="button" variant="secondary" className="mt-2 w-full text-xs" disabled={busy} onClick={loadMore}>
          {busy ? "Loading…" : `Show ${Math.min(left, BOARD_PAGE)} more of ${left}`}
        </Button>
      ) : null}
      {problem ? <p role="alert" className="mt-1 px-1 text-xs text-signal-danger">{problem}</p> : null}
    </section>
  );
}
