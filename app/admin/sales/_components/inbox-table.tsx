"use client";

import Link from "next/link";
import { DataTable, type ColumnDef } from "@/components/data-table";
import { Badge } from "@/components/ui/badge";
import { dateText } from "@/components/admin/format";
import { useServerTable } from "@/components/admin/use-server-table";
import type { InboxRow } from "@/lib/contracts/admin";


const columns: ColumnDef<InboxRow, unknown>[] = [
  {
    accessorKey: "reference",
    header: "Request",
    cell: ({ row }) => (
      <Link href={`/admin/sales/requests/${row.original.id}`} className="font-medium text-kiln-700 underline">
        {row.original.reference}
      </Link>
    ),
  },
  { accessorKey: "projectName", header: "Project" },
  { accessorKey: "firmName", header: "Firm" },
  { accessorKey: "partCount", header: "Parts" },
  { accessorKey: "neededBy", header: "Needed by", cell: ({ getValue }) => dateText(getValue() as string | null) },
  { accessorKey: "submittedAt", header: "Submitted", cell: ({ getValue }) => dateText(getValue() as string | null) },
  {
    id: "flags",
    header: "Flags",
    enableSorting: false,
    cell: ({ row }) => (
      <div className="flex flex-wrap gap-1">
        {row.original.isControlled ? <Badge tone="danger">controlled</Badge> : null}
        {row.original.staleQuotes > 0 ? <Badge tone="warn">quote stale</Badge> : null}
        {row.original.cureProcess === "autoclave" ? <Badge tone="info">autoclave</Badge> : null}
      </div>
    ),
  },
];

/** Requests waiting for a quote; the server sends them nearest-due first, then oldest. */
export function InboxTable() {
  const { table } = useServerTable<InboxRow, { rows: InboxRow[] }>("/api/admin/inbox");
  return (
    <DataTable
      label="Sales inbox"
      columns={columns}
      {...table}
      searchPlaceholder="Search reference, project, firm"
      empty={{ title: "The inbox is empty", body: "Submitted requests appear here, nearest due date first." }}
    />
  );
}
