"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState, useTransition } from "react";
import { saveQuote } from "@/app/admin/sales/actions";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { Field, FormMessage, Input, Select, Textarea } from "@/components/ui/input";
import { formatCents } from "@/lib/money";
import { isEdited, lineAmount, LINE_KINDS, parseMoneyToCents, quoteTotals, type DraftLine } from "@/lib/quoting/lines";
import { useQuoteNotice, type QuoteMessage } from "./quote-notice";

export interface QuoteEditorProps {
  requestId: string;
  quoteId?: string;
  basisAnalysisIds: string[];
  initial: { lines: DraftLine[]; marginBp: number; taxBp: number; depositBp: number; validityDays: number; terms: string; notes: string; shipDate: string | null; leadTime: "standard" | "expedite" | "economy" };
  isStale: boolean;
  /** For a new version: the version its lines were copied from, 0 for the automatic estimate. */
  startedFrom?: number | null;
}

type Row = DraftLine & { unitText: string; key: number };
let seq = 0;
const toRow = (l: DraftLine): Row => ({ ...l, unitText: (l.unitCents / 100).toFixed(2), key: ++seq });

/** Quote lines prefilled from the estimate; each change away from it asks for a reason. */
export function QuoteEditor({ requestId, quoteId, basisAnalysisIds, initial, isStale, startedFrom = null }: QuoteEditorProps) {
  const router = useRouter();
  const [rows, setRows] = useState<Row[]>(() => initial.lines.map(toRow));
  const [marginPct, setMarginPct] = useState(String(initial.marginBp / 100));
  const [taxPct, setTaxPct] = useState(String(initial.taxBp / 100));
  const [depositPct, setDepositPct] = useState(String(initial.depositBp / 100));
  const [validityDays, setValidity] = useState(String(initial.validityDays));
  const [terms, setTerms] = useState(initial.terms);
  const [notes, setNotes] = useState(initial.notes);
  const [shipDate, setShipDate] = useState(initial.shipDate ?? "");
  const [leadTime, setLeadTime] = useState(initial.leadTime);
  const notice = useQuoteNotice();
  const [message, setMessage] = useState<QuoteMessage>(notice.last);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();

  const bp = (s: string) => Math.round(Number(s) * 100);
  const totals = useMemo(() => {
    try {
      return quoteTotals(rows, { marginBp: bp(marginPct), taxBp: bp(taxPct), depositBp: bp(depositPct) });
    } catch {
      return null;
    }
  }, [rows, marginPct, taxPct, depositPct]);

  const update = (key: number, patch: Partial<Row>) =>
    setRows((rs) =>
      rs.map((r) => {
        if (r.key !== key) return r;
        const next = { ...r, ...patch };
        const unit = parseMoneyToCents(next.unitText);
        next.unitCents = unit ?? r.unitCents;
        next.amountCents = lineAmount(next.quantity, next.unitCents);
        return next;
      }),
    );

  const submit = (issue: boolean) =>
    start(async () => {
      setMessage(null);
      const res = await saveQuote({
        requestId,
        quoteId,
        basisAnalysisIds,
        lines: rows.map(({ unitText: _u, key: _k, ...l }) => ({ ...l, editReason: l.editReason?.trim() ? l.editReason : null })),
        marginBp: bp(marginPct),
        taxBp: bp(taxPct),
        depositBp: bp(depositPct),
        validityDays: Number(validityDays),
        terms,
        notes,
        shipDate: shipDate || null,
        leadTime,
        issue,
      });
      if (!res.ok) {
        setErrors(res.fieldErrors ?? {});
        setMessage({ tone: "error", text: res.message });
        return;
      }
      setErrors({});
      const done: QuoteMessage = { tone: "ok", text: res.data.status === "issued" ? `Version ${res.data.version} issued; the client has been e-mailed.` : `Draft version ${res.data.version} saved.` };
      setMessage(done);
      notice.keep(done); // the refreshed page may mount a new editor; it opens with this answer
      router.refresh();
    });

  return (
    <Card className="space-y-4">
      <CardTitle>{quoteId ? "Edit draft" : "New quote version"}</CardTitle>
      {startedFrom ? <p className="text-sm text-ink-500">Starts from version {startedFrom}&rsquo;s lines and rates.</p> : startedFrom === 0 ? <p className="text-sm text-ink-500">Starts from the automatic estimate.</p> : null}
      {isStale ? <FormMessage>This draft is stale: a part has a new file revision. Start a new version from the fresh analysis.</FormMessage> : null}
      <div className="space-y-3">
        {rows.map((r, i) => {
          const edited = isEdited(r);
          const err = errors[`lines.${i}`]?.[0];
          return (
            <div key={r.key} className={err ? "rounded border-2 border-signal-danger p-3" : "rounded border border-paper-200 p-3"}>
              <div className="grid gap-2 sm:grid-cols-[9.5rem_1fr_6rem_8rem_8rem_auto] sm:items-end">
                <Field label="Kind" htmlFor={`kind-${r.key}`}>
                  <Select id={`kind-${r.key}`} value={r.kind} onChange={(e) => update(r.key, { kind: e.target.value as Row["kind"] })}>
                    {LINE_KINDS.map((k) => (
                      <option key={k}>{k}</option>
                    ))}
                  </Select>
                </Field>
                <Field label="Description" htmlFor={`desc-${r.key}`}>
                  <Input id={`desc-${r.key}`} value={r.description} onChange={(e) => update(r.key, { description: e.target.value })} />
                </Field>
                <Field label="Qty" htmlFor={`qty-${r.key}`}>
                  <Input id={`qty-${r.key}`} inputMode="decimal" value={String(r.quantity)} aria-invalid={!(r.quantity > 0)} onChange={(e) => update(r.key, { quantity: Number(e.target.value) || 0 })} />
                </Field>
                <Field label="Unit price ($)" htmlFor={`unit-${r.key}`}>
                  <Input id={`unit-${r.key}`} inputMode="decimal" value={r.unitText} onChange={(e) => update(r.key, { unitText: e.target.value })} aria-invalid={parseMoneyToCents(r.unitText) === null} />
                </Field>
                <div className="text-sm">
                  <p className="text-xs text-ink-500">Amount</p>
                  <p className="figures font-medium">{formatCents(r.amountCents)}</p>
                  {r.estimatedCents !== null && edited ? <p className="figures text-xs text-ink-400">est. {formatCents(r.estimatedCents)}</p> : null}
                </div>
                <Button variant="ghost" size="sm" onClick={() => setRows((rs) => rs.filter((x) => x.key !== r.key))} aria-label={`Remove line ${i + 1}`}>
                  Remove
                </Button>
              </div>
              {edited ? (
                <div className="mt-2">
                  <Field label={r.estimatedCents === null ? "Why this line is added" : "Why it differs from the estimate"} htmlFor={`reason-${r.key}`} error={err}>
                    <Input id={`reason-${r.key}`} value={r.editReason ?? ""} onChange={(e) => update(r.key, { editReason: e.target.value })} />
                  </Field>
                </div>
              ) : err ? (
                <p className="mt-1 text-xs text-signal-danger">{err}</p>
              ) : null}
            </div>
          );
        })}
        <div className="flex flex-wrap gap-2">
          {(["engineering", "option", "crating", "freight"] as const).map((k) => (
            <Button
              key={k}
              variant="secondary"
              size="sm"
              onClick={() => setRows((rs) => [...rs, toRow({ partId: null, kind: k, description: k === "option" ? "Sealing coat" : k === "engineering" ? "Extra engineering" : k === "crating" ? "Crating" : "Freight", quantity: 1, unitCents: 0, amountCents: 0, estimatedCents: null, editReason: "" })])}
            >
              Add {k} line
            </Button>
          ))}
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-5">
        <Field label="Margin %" htmlFor="margin" error={errors.marginBp?.[0]}>
          <Input id="margin" inputMode="decimal" value={marginPct} onChange={(e) => setMarginPct(e.target.value)} />
        </Field>
        <Field label="Tax %" htmlFor="tax" error={errors.taxBp?.[0]}>
          <Input id="tax" inputMode="decimal" value={taxPct} onChange={(e) => setTaxPct(e.target.value)} />
        </Field>
        <Field label="Deposit %" htmlFor="deposit" error={errors.depositBp?.[0]}>
          <Input id="deposit" inputMode="decimal" value={depositPct} onChange={(e) => setDepositPct(e.target.value)} />
        </Field>
        <Field label="Valid for (days)" htmlFor="validity" error={errors.validityDays?.[0]}>
          <Input id="validity" inputMode="numeric" value={validityDays} onChange={(e) => setValidity(e.target.value)} />
        </Field>
        <Field label="Ship date" htmlFor="ship">
          <Input id="ship" type="date" value={shipDate} onChange={(e) => setShipDate(e.target.value)} />
        </Field>
        <Field label="Delivery" htmlFor="lead-time" hint="Prefilled with the client's choice and its line; change the line and the date with it.">
          <Select id="lead-time" value={leadTime} onChange={(e) => setLeadTime(e.target.value as typeof leadTime)}>
            <option value="standard">Standard</option>
            <option value="expedite">Expedited</option>
            <option value="economy">Economy</option>
          </Select>
        </Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Terms" htmlFor="terms">
          <Textarea id="terms" value={terms} onChange={(e) => setTerms(e.target.value)} />
        </Field>
        <Field label="Notes to the client" htmlFor="notes">
          <Textarea id="notes" value={notes} onChange={(e) => setNotes(e.target.value)} />
        </Field>
      </div>
      <dl className="grid grid-cols-2 gap-2 rounded bg-paper-50 p-3 text-sm sm:grid-cols-6">
        {totals
          ? ([["Subtotal", totals.subtotalCents], ["Margin", totals.marginCents], ["Tax", totals.taxCents], ["Total", totals.totalCents], ["Deposit", totals.depositCents], ["Balance", totals.balanceCents]] as const).map(([label, v]) => (
              <div key={label}>
                <dt className="text-xs text-ink-500">{label}</dt>
                <dd className="figures font-semibold text-ink-900">{formatCents(v)}</dd>
              </div>
            ))
          : <p className="col-span-full text-signal-danger">Rates must be whole basis points and not negative.</p>}
      </dl>
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" disabled={pending} onClick={() => submit(false)}>
          Save draft
        </Button>
        <Button disabled={pending || isStale} onClick={() => submit(true)}>
          {pending ? "Working…" : "Issue quote"}
        </Button>
      </div>
    </Card>
  );
}
