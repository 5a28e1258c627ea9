"use client";

import { useState } from "react";
import { acceptQuote } from "@/app/(portal)/portal/(member)/requests/[id]/actions";
import { QuoteStateBadge } from "@/components/stage-badge";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card, CardTitle, EmptyState } from "@/components/ui/card";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { formatCents } from "@/lib/money";
import { CostLines, lineQuantity } from "@/app/(portal)/portal/(member)/requests/_components/cost-lines";
import { PdfUpload } from "@/components/portal/pdf-upload";
import { FigureKind } from "@/app/(portal)/portal/(member)/requests/_components/estimate-panel";
import { day, instantDay, quoteChanges, type QuoteView } from "./quote-changes";
import { PayByPicker, ShipToPicker, type AcceptanceView, type PayBy, type ShipToChoice } from "./accept-choices";
import { spreadMargin } from "@/lib/quoting/client-lines";
import { LEAD_TIME_LABEL } from "@/lib/quoting/lead-times";

/** Lines priced by the hour: the hours are the bureau's own planning figure, not shown to the client. */
const HOURS_KINDS = new Set(["print", "machining", "engineering"]);

export type { QuoteView };

export type { AcceptanceView, ShipToChoice };

function AcceptForm({ quote, defaultPo, acceptance }: { quote: QuoteView; defaultPo: string; acceptance: AcceptanceView | null }) {
  const choices = acceptance?.shipTos ?? [];
  const [shipToId, setShipToId] = useState((choices.find((c) => c.isDefault) ?? choices[0])?.id ?? "");
  const chosen = choices.find((c) => c.id === shipToId) ?? null;
  const depositCents = chosen?.depositCents ?? quote.depositCents;
  const [po, setPo] = useState(defaultPo);
  const account = acceptance?.account ?? null;
  const fitsAccount = account && chosen ? account.openCents + chosen.totalCents <= account.limitCents : false;
  const [payBy, setPayBy] = useState<PayBy>(fitsAccount ? "account" : "card");
  const effectivePayBy: PayBy = payBy === "account" && !fitsAccount ? "card" : payBy;
  const [poUploadId, setPoUploadId] = useState<string | null>(null);
  const [terms, setTerms] = useState(false);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setMessage(null);
    const res = await acceptQuote({ quoteId: quote.id, poNumber: po, acceptTerms: terms as true, shipToId: shipToId || undefined, payBy: effectivePayBy, poUploadId: poUploadId ?? undefined });
    if (!res.ok) {
      setErrors(res.fieldErrors ?? {});
      setMessage(res.message);
      setBusy(false);
      return;
    }
    if (res.data.url) window.location.assign(res.data.url);
    else window.location.reload();
  }
  return (
    <form onSubmit={submit} className="space-y-3 rounded bg-kiln-50 p-4 ring-1 ring-kiln-100" aria-label={`Accept quote version ${quote.version}`}>
      {choices.length === 0 ? (
        <p className="rounded bg-amber-50 px-3 py-2 text-sm text-amber-900" role="alert">
          Your firm has no shipping address yet: the order needs one, and the freight is priced to it.{" "}
          {acceptance?.canManageAddresses ? (
            <a href="/portal/firm" className="underline">
              Add one on your firm&apos;s page
            </a>
          ) : (
            "Ask your firm's lead to add one."
          )}
        </p>
      ) : (
        <ShipToPicker choices={choices} value={shipToId} onChange={setShipToId} currency={quote.currency} error={errors.shipToId?.[0]} />
      )}
      {acceptance?.exemption ? (
        <p className="rounded bg-tide-50 px-3 py-2 text-sm text-tide-700">
          No tax: your firm&apos;s exemption certificate {acceptance.exemption.certificateNumber} is on file, valid until {day(acceptance.exemption.expiresOn)}.
        </p>
      ) : null}
      <PayByPicker value={effectivePayBy} onChange={setPayBy} account={account} totalCents={chosen?.totalCents ?? null} currency={quote.currency} error={errors.payBy?.[0]} />
      <p className="text-sm text-ink-700">
        Accepting makes the order{chosen ? <> for <strong className="figures">{formatCents(chosen.totalCents, quote.currency)}</strong></> : null}.{" "}
        {effectivePayBy === "account" ? (
          <>No deposit: the order is invoiced on your firm&apos;s terms ({account?.termsLabel}) when it ships.</>
        ) : (
          <>
            A deposit of <strong className="figures">{formatCents(depositCents, quote.currency)}</strong> is paid next {effectivePayBy === "card" ? "by card" : "by bank transfer"}; the balance when the order ships.
          </>
        )}
      </p>
      <Field label="Your purchase order number" htmlFor={`po-${quote.id}`} error={errors.poNumber?.[0]}>
        <Input id={`po-${quote.id}`} value={po} onChange={(e) => setPo(e.target.value)} aria-invalid={Boolean(errors.poNumber)} autoComplete="off" />
      </Field>
      <PdfUpload id={`po-file-${quote.id}`} label="Purchase order PDF (optional)" hint="Attach your PO; it is filed with the order." onUploaded={setPoUploadId} />
      {errors.poUploadId ? <p className="text-xs text-signal-danger" role="alert">{errors.poUploadId[0]}</p> : null}
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1 accent-kiln-600" checked={terms} onChange={(e) => setTerms(e.target.checked)} />
        <span>
          I accept the terms of this quote on behalf of my firm{quote.terms ? `: ${quote.terms}` : "."}
          {quote.termsVersion ? (
            <>
              {" "}and the bureau&rsquo;s terms of sale, version {quote.termsVersion}
              {quote.pdf ? (
                <>
                  {" "}(printed on{" "}
                  <a href={quote.pdf.url} className="text-kiln-700 underline">
                    quotation {quote.pdf.number}
                  </a>
                  )
                </>
              ) : null}
              .
            </>
          ) : null}
        </span>
      </label>
      {errors.acceptTerms ? <p className="text-xs text-signal-danger" role="alert">{errors.acceptTerms[0]}</p> : null}
      <FormMessage>{message}</FormMessage>
      <Button type="submit" disabled={busy || choices.length === 0}>
        {busy ? "Accepting…" : effectivePayBy === "account" ? "Accept on account" : effectivePayBy === "bank_transfer" ? "Accept and pay by bank transfer" : "Accept and pay the deposit"}
      </Button>
    </form>
  );
}

/** Every issued version of the request's quote, newest first, with its lines and changes. */
export function QuotesSection({ quotes, canAccept, defaultPo, now, acceptance = null }: { quotes: QuoteView[]; canAccept: boolean; defaultPo: string; now: string; acceptance?: AcceptanceView | null }) {
  if (quotes.length === 0) {
    return (
      <Card>
        <CardTitle>Quote</CardTitle>
        <EmptyState title="No quote yet">Our sales engineers review the automatic estimate and issue a quote, usually within two working days. You will get an e-mail.</EmptyState>
      </Card>
    );
  }
  const latestIssued = quotes.find((q) => q.status === "issued");
  return (
    <Card className="space-y-5">
      <CardTitle>Quote</CardTitle>
      {quotes.map((q, i) => {
        const expired = q.status === "expired" || (q.status === "issued" && q.validUntil !== null && q.validUntil < now);
        const changes = quoteChanges(q, quotes[i + 1]);
        return (
          <section key={q.id} className="space-y-3 border-t border-paper-200 pt-4 first:border-0 first:pt-0" aria-label={`Quote version ${q.version}`}>
            <div className="flex flex-wrap items-center gap-2">
              <h3 className="font-semibold text-ink-800">Version {q.version}</h3>
              <QuoteStateBadge state={expired ? "expired" : q.status} />
              <FigureKind kind="quote" />
              {q.isStale ? <Badge tone="warn">Files changed since this quote</Badge> : null}
              <span className="text-xs text-ink-500">
                issued {instantDay(q.issuedAt)} · valid until {instantDay(q.validUntil)}
              </span>
            </div>
            {changes.length ? (
              <div className="rounded bg-paper-50 px-3 py-2 text-sm ring-1 ring-paper-200">
                <p className="text-xs font-medium uppercase tracking-wide text-ink-500">Changes since version {quotes[i + 1]?.version}</p>
                <ul className="mt-1 list-disc pl-5">
                  {changes.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              </div>
            ) : null}
            <CostLines
              heading="Line (quote)"
              currency={q.currency}
              lines={spreadMargin(q.lines, q.marginCents).map((l) => ({ key: l.id, label: l.description, quantity: HOURS_KINDS.has(l.kind) ? "" : lineQuantity(l.quantity), amountCents: l.amountCents }))}
              totals={[
                { label: "Tax", cents: q.taxCents },
                { label: "Quoted total", cents: q.totalCents, tone: "total" },
                { label: "Deposit on acceptance", cents: q.depositCents, tone: "muted" },
              ]}
            />
            {q.shipDate ? (
              <p className="text-sm text-ink-600">
                Quoted ship date: {day(q.shipDate)}
                {q.leadTime && q.leadTime !== "standard" ? ` (${LEAD_TIME_LABEL[q.leadTime].toLowerCase()} delivery)` : ""}
              </p>
            ) : null}
            {q.notes ? <p className="text-sm text-ink-600">{q.notes}</p> : null}
            {canAccept && q === latestIssued && !expired && !q.isStale ? <AcceptForm quote={q} defaultPo={defaultPo} acceptance={acceptance} /> : null}
            {canAccept && q === latestIssued && expired ? (
              <p className="rounded bg-amber-50 px-3 py-2 text-sm text-amber-900">This quote has expired and can no longer be accepted. Ask us for a fresh one in the messages below.</p>
            ) : null}
          </section>
        );
      })}
    </Card>
  );
}
