"use client";

import { useState } from "react";
import { acceptQuote } from "@/app/(portal)/portal/requests/[id]/actions";
import { QuoteStateBadge } from "@/components/stage-badge";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card, CardTitle, EmptyState } from "@/components/ui/card";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { formatCents } from "@/lib/money";
import { CostLines, lineQuantity } from "@/app/(portal)/portal/requests/_components/cost-lines";
import { PdfUpload } from "@/components/portal/pdf-upload";
import { FigureKind } from "@/app/(portal)/portal/requests/_components/estimate-panel";
import { day, instantDay, quoteChanges, type QuoteView } from "./quote-changes";
import { spreadMargin } from "@/lib/quoting/client-lines";

/** Lines priced by the hour: the hours are the bureau's own planning figure, not shown to the client. */
const HOURS_KINDS = new Set(["print", "machining", "engineering"]);

export type { QuoteView };

/** One of the firm's shipping addresses with what the order would cost shipped there. */
export interface ShipToChoice {
  id: string;
  label: string;
  lines: string[];
  isDefault: boolean;
  zoneName: string | null;
  transitDays: number | null;
  freightCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
}

export interface AcceptanceView {
  shipTos: ShipToChoice[];
  exemption: { certificateNumber: string; expiresOn: string } | null;
  canManageAddresses: boolean;
  /** The firm's net terms, when accounts approved them: what it owes on account now and its limit. */
  account?: { termsLabel: string; limitCents: number; openCents: number } | null;
}

type PayBy = "card" | "bank_transfer" | "account";

function PayByPicker({ value, onChange, account, totalCents, currency, error }: { value: PayBy; onChange: (v: PayBy) => void; account: AcceptanceView["account"]; totalCents: number | null; currency: string; error?: string }) {
  const available = account ? Math.max(0, account.limitCents - account.openCents) : 0;
  const isOver = account && totalCents !== null ? account.openCents + totalCents > account.limitCents : false;
  const options: { key: PayBy; title: string; text: string; disabled?: boolean }[] = [
    ...(account
      ? [{ key: "account" as const, title: `On account, ${account.termsLabel}`, text: isOver ? `Over your credit limit: ${formatCents(available, currency)} of ${formatCents(account.limitCents, currency)} is left.` : `No deposit: one invoice when the order ships, due on your terms. ${formatCents(available, currency)} of your ${formatCents(account.limitCents, currency)} limit is left.`, disabled: isOver }]
      : []),
    { key: "card", title: "Deposit by card", text: "Paid now on the payment page; the balance when the order ships." },
    { key: "bank_transfer", title: "Deposit by bank transfer", text: "We give you account details and a reference; work starts when the money arrives." },
  ];
  return (
    <fieldset className="space-y-2" aria-describedby={error ? "payby-error" : undefined}>
      <legend className="text-sm font-medium text-ink-700">How your firm pays</legend>
      {isOver ? (
        <p className="rounded bg-amber-50 px-3 py-2 text-sm text-amber-900" role="status">
          This order would take your firm past its credit limit ({formatCents(account!.openCents, currency)} owed on account, limit {formatCents(account!.limitCents, currency)}). Pay the deposit by card or bank transfer, or ask our accounts team to raise the limit.
        </p>
      ) : null}
      <div className="grid gap-2 sm:grid-cols-3">
        {options.map((o) => (
          <label key={o.key} className={`flex gap-3 rounded bg-white p-3 text-sm ring-1 ${o.disabled ? "cursor-not-allowed opacity-70" : "cursor-pointer"} ${value === o.key ? "ring-2 ring-kiln-500" : "ring-paper-300"}`} data-testid="pay-by-choice">
            <input type="radio" name="payBy" value={o.key} checked={value === o.key} disabled={o.disabled} onChange={() => onChange(o.key)} className="mt-1 accent-kiln-600" />
            <span className="min-w-0 space-y-1">
              <span className="block font-medium text-ink-800">{o.title}</span>
              <span className="block text-xs text-ink-600">{o.text}</span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p id="payby-error" className="text-xs text-signal-danger" role="alert">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

function ShipToPicker({ choices, value, onChange, currency, error }: { choices: ShipToChoice[]; value: string; onChange: (id: string) => void; currency: string; error?: string }) {
  return (
    <fieldset className="space-y-2" aria-describedby={error ? "shipto-error" : undefined}>
      <legend className="text-sm font-medium text-ink-700">Ship to</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {choices.map((c) => (
          <label key={c.id} className={`flex cursor-pointer gap-3 rounded bg-white p-3 text-sm ring-1 ${value === c.id ? "ring-2 ring-kiln-500" : "ring-paper-300"}`} data-testid="ship-to-choice">
            <input type="radio" name="shipTo" value={c.id} checked={value === c.id} onChange={() => onChange(c.id)} className="mt-1 accent-kiln-600" />
            <span className="min-w-0 space-y-1">
              <span className="block font-medium text-ink-800">{c.label}</span>
              <span className="block text-xs text-ink-500">{c.lines.join(", ")}</span>
              <span className="block text-xs text-ink-600">
                {c.zoneName ?? "Freight zone not found"}
                {c.transitDays ? `, about ${c.transitDays} working days in transit` : ""}
              </span>
              <span className="figures block">
                Freight {formatCents(c.freightCents, currency)} · total <strong>{formatCents(c.totalCents, currency)}</strong>
              </span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p id="shipto-error" className="text-xs text-signal-danger" role="alert">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

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
            {q.shipDate ? <p className="text-sm text-ink-600">Quoted ship date: {day(q.shipDate)}</p> : null}
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
