"use client";

import Link from "next/link";
import { useState } from "react";
import { DataTable, type ColumnDef } from "@/components/data-table";
import { buttonClass } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/input";
import { formatCents } from "@/lib/money";
import { dateText } from "@/components/admin/format";
import { Pager } from "@/components/admin/pager";
import { PaymentStateBadge } from "@/components/stage-badge";
import { PAYMENT_KIND_LABEL, PAYMENT_STATE_LABEL } from "@/lib/labels";
import { useServerTable } from "@/components/admin/use-server-table";
import type { LedgerAnswer, LedgerRow } from "@/lib/contracts/admin";


const columns: ColumnDef<LedgerRow, unknown>[] = [
  { accessorKey: "reference", header: "Order", cell: ({ row }) => <Link className="font-medium text-kiln-700 underline" href={`/admin/accounts/payments/${row.original.id}`}><span className="whitespace-nowrap">{row.original.reference}</span></Link> },
  { accessorKey: "firmName", header: "Firm", enableSorting: false },
  { accessorKey: "kind", header: "Kind", enableSorting: false, cell: ({ row }) => PAYMENT_KIND_LABEL[row.original.kind] },
  { accessorKey: "status", header: "Status", cell: ({ row }) => <PaymentStateBadge state={row.original.status} /> },
  { accessorKey: "amountCents", header: "Amount", cell: ({ row }) => <span className="figures">{formatCents(row.original.amountCents, row.original.currency)}</span> },
  { accessorKey: "feeCents", header: "Fee", enableSorting: false, cell: ({ row }) => <span className="figures">{row.original.feeCents === null ? "—" : formatCents(row.original.feeCents, row.original.currency)}</span> },
  { accessorKey: "refundedCents", header: "Refunded", enableSorting: false, cell: ({ row }) => <span className="figures">{row.original.refundedCents ? formatCents(row.original.refundedCents, row.original.currency) : "—"}</span> },
  { accessorKey: "receiptNumber", header: "Receipt", enableSorting: false, cell: ({ getValue }) => <span className="whitespace-nowrap font-mono text-xs">{(getValue() as string | null) ?? "—"}</span> },
  { accessorKey: "paidAt", header: "Paid", cell: ({ getValue }) => dateText(getValue() as string | null) },
  { accessorKey: "createdAt", header: "Created", cell: ({ getValue }) => dateText(getValue() as string | null) },
];

const monthAgo = () => new Date(Date.now() - 90 * 86_400_000).toISOString().slice(0, 10);
const today = () => new Date().toISOString().slice(0, 10);

/** Every payment; sorted, filtered and paged on the server; CSV export of the chosen dates. */
export function LedgerTable() {
  const [from, setFrom] = useState(monthAgo);
  const [to, setTo] = useState(today);
  const { table, pager, firstPage } = useServerTable<LedgerRow, LedgerAnswer>("/api/admin/ledger", {
    server: { initialSorting: [{ id: "createdAt", desc: true }], filterParams: ["status", "kind"] },
    params: { from, to },
    enabled: Boolean(from && to),
  });
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <Field label="From" htmlFor="ledger-from"><Input id="ledger-from" type="date" value={from} onChange={(e) => (setFrom(e.target.value), firstPage())} /></Field>
        <Field label="To" htmlFor="ledger-to"><Input id="ledger-to" type="date" value={to} onChange={(e) => (setTo(e.target.value), firstPage())} /></Field>
        <a className={buttonClass("secondary")} href={`/api/admin/ledger/export?from=${from}&to=${to}`} download>
          Export CSV
        </a>
      </div>
      <DataTable
        label="Ledger"
        columns={columns}
        {...table}
        filters={[
          { columnId: "status", label: "Status", options: (["pending", "paid", "partially_refunded", "refunded", "failed", "expired"] as const).map((v) => ({ value: v, label: PAYMENT_STATE_LABEL[v] })) },
          { columnId: "kind", label: "Kind", options: (["deposit", "balance"] as const).map((v) => ({ value: v, label: PAYMENT_KIND_LABEL[v] })) },
        ]}
        searchPlaceholder="Search order, firm, receipt or processor reference"
        empty={{ title: "No payments in these dates", body: "Deposits and balances appear here as clients pay." }}
      />
      {pager ? <Pager {...pager} /> : null}
    </div>
  );
}
