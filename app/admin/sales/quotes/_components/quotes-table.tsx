"use client";

import Link from "next/link";
import { DataTable, type ColumnDef } from "@/components/data-table";
import { Card } from "@/components/ui/card";
import { formatCents } from "@/lib/money";
import { dateText, hoursText } from "@/components/admin/format";
import { Pager } from "@/components/admin/pager";
import { QuoteStateBadge } from "@/components/stage-badge";
import { Badge } from "@/components/ui/badge";
import { QUOTE_STATE_LABEL, type QuoteState } from "@/lib/labels";
import { useServerTable } from "@/components/admin/use-server-table";
import type { QuoteRow, QuotesAnswer } from "@/lib/contracts/admin";


const columns: ColumnDef<QuoteRow, unknown>[] = [
  { accessorKey: "reference", header: "Request", cell: ({ row }) => <Link className="font-medium text-kiln-700 underline" href={`/admin/sales/requests/${row.original.requestId}`}>{row.original.reference}</Link> },
  { accessorKey: "version", header: "Version", enableSorting: false, cell: ({ getValue }) => `v${getValue() as number}` },
  { accessorKey: "firmName", header: "Firm", enableSorting: false },
  { accessorKey: "status", header: "Status", cell: ({ row }) => <span className="flex gap-1"><QuoteStateBadge state={row.original.status} />{row.original.isStale ? <Badge tone="warn">Out of date</Badge> : null}</span> },
  { accessorKey: "totalCents", header: "Total", cell: ({ row }) => <span className="figures">{formatCents(row.original.totalCents, row.original.currency)}</span> },
  { accessorKey: "issuedAt", header: "Issued", cell: ({ getValue }) => dateText(getValue() as string | null) },
  { accessorKey: "validUntil", header: "Valid until", enableSorting: false, cell: ({ getValue }) => dateText(getValue() as string | null) },
];

const STATUSES: QuoteState[] = ["draft", "issued", "accepted", "expired", "declined", "superseded"];

/** Quotes by status, sorted and paged on the server, with the win rate and turnaround above. */
export function QuotesTable() {
  const { data, table, pager, filterValue } = useServerTable<QuoteRow, QuotesAnswer>("/api/admin/quotes", {
    server: { initialSorting: [{ id: "createdAt", desc: true }], filterParams: ["status"] },
  });
  const status = filterValue("status");
  const s = data?.stats;
  return (
    <div className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-3">
        <Card>
          <p className="text-xs uppercase tracking-wide text-ink-500">Win rate</p>
          <p className="figures text-2xl font-semibold text-ink-900">{s ? (s.winRate.rate === null ? "—" : `${Math.round(s.winRate.rate * 100)} %`) : "…"}</p>
          <p className="text-xs text-ink-500">{s ? `${s.winRate.won} won · ${s.winRate.lost} lost · ${s.winRate.open} open` : " "}</p>
        </Card>
        <Card>
          <p className="text-xs uppercase tracking-wide text-ink-500">Submission to first quote</p>
          <p className="figures text-2xl font-semibold text-ink-900">{s ? hoursText(s.turnaround.medianHours) : "…"}</p>
          <p className="text-xs text-ink-500">{s ? `median over ${s.turnaround.count} requests · mean ${hoursText(s.turnaround.meanHours)}` : " "}</p>
        </Card>
        <Card>
          <p className="text-xs uppercase tracking-wide text-ink-500">Quotes listed</p>
          <p className="figures text-2xl font-semibold text-ink-900">{data ? data.total : "…"}</p>
          <p className="text-xs text-ink-500">{status ? `status ${status}` : "all statuses"}</p>
        </Card>
      </div>
      <DataTable
        label="Quotes"
        columns={columns}
        {...table}
        filters={[{ columnId: "status", label: "Status", options: STATUSES.map((v) => ({ value: v, label: QUOTE_STATE_LABEL[v] })) }]}
        searchPlaceholder="Search reference, project, firm"
        empty={{ title: "No quotes yet", body: "Quotes appear here once a request is priced." }}
      />
      {pager ? <Pager {...pager} /> : null}
    </div>
  );
}
