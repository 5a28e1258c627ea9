"use client";

import { useState } from "react";
import { DataTable, type ColumnDef } from "@/components/data-table";
import { Field, Input, Select } from "@/components/ui/input";
import { auditActionLabel, auditEntityLabel } from "@/lib/labels";
import { dateTimeText } from "@/components/admin/format";
import { Pager } from "@/components/admin/pager";
import { useApi } from "@/components/admin/use-api";
import { describeChange } from "@/lib/audit-text";
import type { AuditAnswer, AuditRow } from "@/lib/contracts/admin";



const columns: ColumnDef<AuditRow, unknown>[] = [
  { accessorKey: "at", header: "When", enableSorting: false, cell: ({ getValue }) => <span className="figures whitespace-nowrap text-ink-500">{dateTimeText(getValue() as string)}</span> },
  { accessorKey: "actorEmail", header: "Who", enableSorting: false, cell: ({ getValue }) => (getValue() as string | null) ?? "system" },
  { accessorKey: "action", header: "Action", enableSorting: false, cell: ({ getValue }) => auditActionLabel(getValue() as string) },
  { id: "entity", header: "Entity", enableSorting: false, cell: ({ row }) => <span>{auditEntityLabel(row.original.entityType)}<span className="block max-w-[10rem] truncate font-mono text-xs text-ink-400">{row.original.entityId}</span></span> },
  {
    id: "change",
    header: "Change",
    enableSorting: false,
    cell: ({ row }) => {
      const lines = describeChange(row.original.before, row.original.after);
      if (lines.length === 0) return <span className="text-xs text-ink-500">—</span>;
      return (
        <dl className="grid max-w-md grid-cols-[auto_1fr] gap-x-2 text-xs">
          {lines.slice(0, 8).map((l) => (
            <div key={l.field} className="contents">
              <dt className="text-ink-500">{l.field}</dt>
              <dd className="break-words text-ink-800">{l.before !== null ? <span className="text-ink-500">{l.before} → </span> : null}{l.after ?? "removed"}</dd>
            </div>
          ))}
          {lines.length > 8 ? <dd className="col-span-2 text-ink-500">and {lines.length - 8} more</dd> : null}
        </dl>
      );
    },
  },
];

/** The audit log, newest first; filters go to the server. */
export function AuditTable() {
  const [actorId, setActor] = useState("");
  const [entityType, setEntity] = useState("");
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const [page, setPage] = useState(1);
  const params = new URLSearchParams({ page: String(page) });
  for (const [k, v] of Object.entries({ actorId, entityType, from, to })) if (v) params.set(k, v);
  const { data, error, isLoading, reload } = useApi<AuditAnswer>(`/api/admin/audit?${params}`);
  const reset = <T,>(fn: (v: T) => void) => (v: T) => (fn(v), setPage(1));
  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-4">
        <Field label="User" htmlFor="audit-user">
          <Select id="audit-user" value={actorId} onChange={(e) => reset(setActor)(e.target.value)}>
            <option value="">anyone</option>
            {data?.options.actors.map((a) => <option key={a.id} value={a.id}>{a.email}</option>)}
          </Select>
        </Field>
        <Field label="Entity" htmlFor="audit-entity">
          <Select id="audit-entity" value={entityType} onChange={(e) => reset(setEntity)(e.target.value)}>
            <option value="">any</option>
            {data?.options.entityTypes.map((t) => <option key={t} value={t}>{auditEntityLabel(t)}</option>)}
          </Select>
        </Field>
        <Field label="From" htmlFor="audit-from"><Input id="audit-from" type="date" value={from} onChange={(e) => reset(setFrom)(e.target.value)} /></Field>
        <Field label="To" htmlFor="audit-to"><Input id="audit-to" type="date" value={to} onChange={(e) => reset(setTo)(e.target.value)} /></Field>
      </div>
      <DataTable label="Audit log" columns={columns} data={data?.rows} isLoading={isLoading} error={error} onRetry={reload} getRowId={(r) => r.id} searchPlaceholder="Search this page" empty={{ title: "Nothing logged for these filters" }} />
      {data ? <Pager page={data.page} pageSize={data.pageSize} total={data.total} onPage={setPage} /> : null}
    </div>
  );
}
