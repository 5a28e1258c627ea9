"use client";

import Link from "next/link";
import { useState, useTransition } from "react";
import { noteFinding } from "@/app/admin/accounts/actions";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card, EmptyState, Skeleton } from "@/components/ui/card";
import { Field, Input, Textarea } from "@/components/ui/input";
import { formatDateTime } from "@/lib/dates";
import { formatCents } from "@/lib/money";
import { useApi } from "@/components/admin/use-api";
import type { ReconciliationAnswer as Answer, ReconciliationFinding as Finding } from "@/lib/contracts/admin";


const KIND: Record<Finding["kind"], { label: string; tone: BadgeTone }> = {
  amount_mismatch: { label: "amount mismatch", tone: "danger" },
  missing_ours: { label: "missing on our side", tone: "warn" },
  missing_theirs: { label: "missing at the processor", tone: "warn" },
  matched: { label: "matched", tone: "ok" },
};
const ORDER: Finding["kind"][] = ["amount_mismatch", "missing_ours", "missing_theirs", "matched"];

/** Ledger against processor for a period; problems first. */
export function ReconciliationView() {
  const [from, setFrom] = useState(() => new Date(Date.now() - 90 * 86_400_000).toISOString().slice(0, 10));
  const [to, setTo] = useState(() => new Date().toISOString().slice(0, 10));
  const [query, setQuery] = useState<string | null>(`from=${from}&to=${to}`);
  const [showMatched, setShowMatched] = useState(false);
  const [round, setRound] = useState(0);
  const { data, error, isLoading } = useApi<Answer>(query ? `/api/admin/reconciliation?${query}&r=${round}` : null);
  const findings = (data?.findings ?? []).filter((f) => showMatched || f.kind !== "matched").sort((a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind));
  return (
    <div className="space-y-4">
      <form className="flex flex-wrap items-end gap-3" onSubmit={(e) => (e.preventDefault(), setQuery(`from=${from}&to=${to}`))}>
        <Field label="From" htmlFor="rec-from"><Input id="rec-from" type="date" value={from} onChange={(e) => setFrom(e.target.value)} /></Field>
        <Field label="To" htmlFor="rec-to"><Input id="rec-to" type="date" value={to} onChange={(e) => setTo(e.target.value)} /></Field>
        <Button type="submit">Reconcile</Button>
        <label className="flex items-center gap-2 text-sm text-ink-600"><input type="checkbox" checked={showMatched} onChange={(e) => setShowMatched(e.target.checked)} /> show matched</label>
      </form>
      {error ? <p role="alert" className="text-sm text-signal-danger">{error}</p> : null}
      {isLoading && !data ? <Skeleton className="h-40" /> : null}
      {data ? (
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          {ORDER.map((k) => (
            <Card key={k} className="p-4">
              <p className="text-xs uppercase tracking-wide text-ink-500">{KIND[k].label}</p>
              <p className="figures text-2xl font-semibold text-ink-900">{data.summary[k]}</p>
            </Card>
          ))}
        </div>
      ) : null}
      {data && findings.length === 0 ? <EmptyState title="Nothing to look into">Every payment and refund in the period agrees with the processor.</EmptyState> : null}
      {findings.length ? (
        <ul className="divide-y divide-paper-200 rounded-md bg-white ring-1 ring-paper-200" aria-label="Findings">
          {findings.map((f, i) => (
            <li key={`${f.kind}-${f.paymentId}-${f.processorId}-${i}`} className="flex flex-col gap-1 px-4 py-3 text-sm sm:flex-row sm:flex-wrap sm:items-center sm:gap-x-4">
              <Badge tone={KIND[f.kind].tone}>{KIND[f.kind].label}</Badge>
              <span className="font-medium">{f.subject}{f.reference ? ` · ${f.reference}` : ""}</span>
              <span className="figures text-ink-600">ours {f.oursCents === null ? "—" : formatCents(f.oursCents)} · processor {f.theirsCents === null ? "—" : formatCents(f.theirsCents)}</span>
              <span className="text-ink-500 sm:flex-1">{f.note}{f.processorId ? <span className="block break-all font-mono text-xs">processor reference {f.processorId}</span> : null}</span>
              {f.isResolved ? <Badge tone="ok">resolved</Badge> : null}
              {f.paymentId && f.reference ? <Link className="text-kiln-700 underline" href={`/admin/accounts/payments/${f.paymentId}`}>Open payment</Link> : null}
              {f.kind !== "matched" ? <FindingNotes finding={f} onSaved={() => setRound((r) => r + 1)} /> : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

/** Accounts' notes on one finding, and a note (optionally resolving it) of their own. */
function FindingNotes({ finding, onSaved }: { finding: Finding; onSaved: () => void }) {
  const [open, setOpen] = useState(false);
  const [text, setText] = useState("");
  const [resolve, setResolve] = useState(!finding.isResolved);
  const [problem, setProblem] = useState<string | null>(null);
  const [pending, start] = useTransition();
  const id = `note-${finding.findingKey.replace(/[^A-Za-z0-9_-]/g, "-")}`;
  return (
    <div className="w-full basis-full space-y-2 pt-1">
      {finding.notes.length ? (
        <ul className="space-y-1 border-l-2 border-paper-200 pl-3 text-xs text-ink-600" aria-label="Notes">
          {finding.notes.map((n, i) => (
            <li key={i}>
              <span className="text-ink-500">{formatDateTime(n.at)}{n.author ? ` · ${n.author}` : ""}{n.isResolved ? " · resolved" : ""}:</span> {n.note}
            </li>
          ))}
        </ul>
      ) : null}
      {open ? (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            start(async () => {
              const r = await noteFinding({ findingKey: finding.findingKey, note: text, resolve });
              if (!r.ok) return setProblem(r.fieldErrors?.note?.[0] ?? r.message);
              setProblem(null);
              setText("");
              setOpen(false);
              onSaved();
            });
          }}
        >
          <Field label="Note" htmlFor={id} error={problem ?? undefined}>
            <Textarea id={id} className="min-h-14" value={text} onChange={(e) => setText(e.target.value)} />
          </Field>
          <label className="flex items-center gap-2 text-xs text-ink-600">
            <input type="checkbox" checked={resolve} onChange={(e) => setResolve(e.target.checked)} /> mark resolved
          </label>
          <div className="flex gap-2">
            <Button type="submit" size="sm" disabled={pending}>{pending ? "Saving…" : "Save note"}</Button>
            <Button type="button" size="sm" variant="ghost" onClick={() => setOpen(false)}>Close</Button>
          </div>
        </form>
      ) : (
        <Button type="button" size="sm" variant="secondary" onClick={() => setOpen(true)}>
          {finding.isResolved ? "Add a note" : "Note or resolve"}
        </Button>
      )}
    </div>
  );
}
