"use client";

import { useState, useTransition } from "react";
import { inviteStaff, resetStaffTwoFactor, updateStaff } from "@/app/admin/staff/actions";
import { DataTable, type ColumnDef } from "@/components/data-table";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select } from "@/components/ui/input";
import { dateText } from "@/components/admin/format";
import { useApi } from "@/components/admin/use-api";
import type { StaffAnswer, StaffRow } from "@/lib/contracts/admin";

const ROLES = ["sales", "production", "accounts", "admin"];

/** Staff, their roles and clearance; invite by e-mail. The server keeps one admin at least. */
export function StaffTable({ selfId }: { selfId: string }) {
  const { data, error, isLoading, reload } = useApi<StaffAnswer>("/api/admin/staff");
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  const change = (userId: string, patch: { role?: string; isControlledCleared?: boolean; disabled?: boolean }) =>
    start(async () => {
      const r = await updateStaff({ userId, ...patch });
      setMsg(r.ok ? { tone: "ok", text: "Saved." } : { tone: "error", text: r.message });
      reload();
    });
  const columns: ColumnDef<StaffRow, unknown>[] = [
    { accessorKey: "email", header: "Staff member", cell: ({ row }) => <span>{row.original.name ?? "—"}<span className="block text-xs text-ink-500">{row.original.email}{row.original.id === selfId ? " (you)" : ""}</span></span> },
    {
      accessorKey: "role",
      header: "Role",
      cell: ({ row }) => (
        <Select aria-label={`Role of ${row.original.email}`} className="min-w-[9.5rem] py-1 text-sm" value={row.original.role} disabled={pending} onChange={(e) => change(row.original.id, { role: e.target.value })}>
          {ROLES.map((r) => <option key={r}>{r}</option>)}
        </Select>
      ),
    },
    { accessorKey: "isControlledCleared", header: "Controlled work", cell: ({ row }) => <label className="flex items-center gap-2 text-sm"><input type="checkbox" aria-label={`Controlled clearance of ${row.original.email}`} checked={row.original.isControlledCleared} disabled={pending} onChange={(e) => change(row.original.id, { isControlledCleared: e.target.checked })} /> cleared</label> },
    {
      accessorKey: "twoFactorSince",
      header: "Sign-in code",
      cell: ({ row }) =>
        row.original.twoFactorSince ? (
          <span className="flex flex-wrap items-center gap-2 text-sm">
            App set up {dateText(row.original.twoFactorSince)}
            <Button
              variant="ghost"
              size="sm"
              disabled={pending}
              onClick={() => {
                if (!window.confirm(`Clear ${row.original.email}'s authenticator app? They will set up a new one at their next sign-in.`)) return;
                start(async () => {
                  const r = await resetStaffTwoFactor({ userId: row.original.id });
                  setMsg(r.ok ? { tone: "ok", text: `${row.original.email} will set up a new authenticator app at their next sign-in.` } : { tone: "error", text: r.message });
                  reload();
                });
              }}
            >
              Reset
            </Button>
          </span>
        ) : (
          <span className="text-sm text-ink-500">Not set up yet (asked at next sign-in)</span>
        ),
    },
    { accessorKey: "disabledAt", header: "Access", cell: ({ row }) => <Button variant="ghost" size="sm" disabled={pending} onClick={() => change(row.original.id, { disabled: !row.original.disabledAt })}>{row.original.disabledAt ? `Disabled ${dateText(row.original.disabledAt)} — restore` : "Disable"}</Button> },
  ];
  return (
    <div className="space-y-6">
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <DataTable label="Staff" columns={columns} data={data?.rows} isLoading={isLoading} error={error} onRetry={reload} getRowId={(r) => r.id} searchPlaceholder="Search staff" filters={[{ columnId: "role", label: "Role", options: ROLES.map((r) => ({ value: r, label: r })) }]} empty={{ title: "No staff yet" }} />
      <InviteForm onDone={reload} />
      {data?.invitations.length ? (
        <p className="text-sm text-ink-500">
          Invited, not yet accepted: {data.invitations.map((i) => `${i.email} (${i.role}${i.isExpired ? ", link expired" : ""})`).join(", ")}. Invite an address again to send a fresh link.
        </p>
      ) : null}
    </div>
  );
}

function InviteForm({ onDone }: { onDone: () => void }) {
  const [email, setEmail] = useState("");
  const [role, setRole] = useState("sales");
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  return (
    <form
      className="space-y-3 rounded-md bg-white p-4 ring-1 ring-paper-200"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await inviteStaff({ email, role });
          if (!r.ok) return setErrors(r.fieldErrors ?? {}), setMsg({ tone: "error", text: r.message });
          setErrors({});
          setMsg({ tone: "ok", text: r.data.isResent ? `A fresh invitation went to ${email}; the earlier link no longer works.` : `${email} is invited; the e-mail links to a page where they set their name and password (for 7 days).` });
          setEmail("");
          onDone();
        });
      }}
    >
      <h3 className="font-semibold text-ink-800">Invite a staff member</h3>
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end">
        <Field label="E-mail" htmlFor="invite-email" error={errors.email?.[0]}><Input id="invite-email" type="email" value={email} onChange={(e) => setEmail(e.target.value)} /></Field>
        <Field label="Role" htmlFor="invite-role"><Select id="invite-role" value={role} onChange={(e) => setRole(e.target.value)}>{ROLES.map((r) => <option key={r}>{r}</option>)}</Select></Field>
        <Button type="submit" disabled={pending || !email}>Invite</Button>
      </div>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
    </form>
  );
}
