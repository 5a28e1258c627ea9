"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import { DataTable, type ColumnDef, type ColumnFiltersState, type SortingState } from "@/components/data-table";
import { ButtonLink } from "@/components/ui/button";
import { Badge } from "@/components/ui/badge";
import { STAGES } from "@/db/schema/common";
import { formatCents } from "@/lib/money";
import { fetchJson } from "@/components/portal/query-provider";
import { StageBadge } from "@/components/stage-badge";
import { STAGE_LABEL } from "@/lib/labels";
import { formatDate, formatDay } from "@/lib/dates";
import type { PortalList, PortalListRow } from "@/lib/contracts/portal";

export type PortalRow = PortalListRow;


/** The client home: the firm's requests and orders, sorted, filtered and searched by the API. */
export function RequestsTable({ showAuthor }: { showAuthor: boolean }) {
  const router = useRouter();
  const [sorting, setSorting] = useState<SortingState>([{ id: "updatedAt", desc: true }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [search, setSearch] = useState("");
  const [debounced, setDebounced] = useState("");
  useEffect(() => {
    const t = setTimeout(() => setDebounced(search), 250);
    return () => clearTimeout(t);
  }, [search]);

  const stage = (filters.find((f) => f.id === "stage")?.value as string | undefined) ?? "";
  const params = new URLSearchParams({ sort: sorting[0]?.id ?? "updatedAt", dir: sorting[0]?.desc === false ? "asc" : "desc" });
  if (debounced.trim()) params.set("q", debounced.trim());
  if (stage) params.set("stage", stage);

  const query = useQuery({
    queryKey: ["portal-requests", params.toString()],
    queryFn: () => fetchJson<PortalList>(`/api/portal/requests?${params}`),
    placeholderData: keepPreviousData,
  });

  const columns = useMemo<ColumnDef<PortalRow, unknown>[]>(
    () => [
      {
        id: "reference",
        accessorKey: "reference",
        header: "Ref",
        cell: ({ row }) => (
          <Link href={`/portal/requests/${row.original.id}`} className="whitespace-nowrap font-mono text-sm font-medium text-kiln-700 underline-offset-2 hover:underline">
            {row.original.reference}
          </Link>
        ),
      },
      {
        id: "projectName",
        accessorKey: "projectName",
        header: "Project",
        cell: ({ row }) => (
          <div className="min-w-48">
            <span className="font-medium text-ink-800">{row.original.projectName}</span>
            {row.original.isControlled ? <Badge tone="warn" className="ml-2">Controlled</Badge> : null}
            <div className="text-xs text-ink-400">
              {row.original.partCount} part{row.original.partCount === 1 ? "" : "s"}
              {showAuthor && row.original.createdByName ? ` · ${row.original.createdByName}` : ""}
            </div>
            {/* On a phone the stage column is off to the side; show the stage here too. */}
            <div className="mt-1 sm:hidden">
              <StageBadge stage={row.original.stage} />
            </div>
          </div>
        ),
      },
      { id: "stage", accessorKey: "stage", header: "Stage", cell: ({ row }) => <StageBadge stage={row.original.stage} /> },
      {
        id: "totalCents",
        accessorKey: "totalCents",
        header: "Quoted total",
        cell: ({ row }) =>
          row.original.totalCents === null ? <span className="text-ink-400">—</span> : <span className="figures whitespace-nowrap">{formatCents(row.original.totalCents)}</span>,
      },
      { id: "neededBy", accessorKey: "neededBy", header: "Needed by", cell: ({ row }) => <span className="whitespace-nowrap">{formatDay(row.original.neededBy)}</span> },
      { id: "updatedAt", accessorKey: "updatedAt", header: "Updated", cell: ({ row }) => <span className="whitespace-nowrap text-ink-500">{formatDate(row.original.updatedAt)}</span> },
    ],
    [showAuthor],
  );

  return (
    <DataTable
      label="Requests and orders"
      columns={columns}
      data={query.data?.rows}
      getRowId={(r) => r.id}
      isLoading={query.isFetching}
      error={query.isError ? `Could not load your requests: ${query.error.message}` : null}
      onRetry={() => void query.refetch()}
      searchPlaceholder="Search reference, project or notes"
      filters={[{ columnId: "stage", label: "Stage", options: STAGES.map((s) => ({ value: s, label: STAGE_LABEL[s] })) }]}
      manual={{ sorting, onSortingChange: setSorting, columnFilters: filters, onColumnFiltersChange: setFilters, search, onSearchChange: setSearch }}
      onRowClick={(row) => router.push(`/portal/requests/${row.original.id}`)}
      empty={{
        title: "No requests yet",
        body: (
          <div className="space-y-3">
            <p>Upload a mesh or CAD export of a mold, plug or fixture to see at once which cell it fits and what it costs.</p>
            <ButtonLink href="/portal/requests/new">Start a request</ButtonLink>
          </div>
        ),
      }}
      noMatch="No requests match the search and stage."
    />
  );
}
