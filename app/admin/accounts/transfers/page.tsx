import type { Metadata } from "next";
import { Badge } from "@/components/ui/badge";
import { ButtonLink } from "@/components/ui/button";
import { Card, CardTitle, EmptyState, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { listOpenPayments, listTransferFunds } from "@/db/queries/transfers";
import { pagePermission } from "@/lib/auth/page-guard";
import { formatDate, formatDateTime } from "@/lib/dates";
import { FUNDS_STATUS_LABEL, FUNDS_STATUS_TONE, PAYMENT_KIND_LABEL, PAYMENT_METHOD_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { ManualPaymentForm, ResolveTransferForm } from "./_components/transfer-forms";

export const metadata: Metadata = { title: "Bank transfers" };
export const dynamic = "force-dynamic";

/** Accounts: bank transfers that arrived (matched, short, over, late, unknown), and payments still open. */
export default async function TransfersPage() {
  await pagePermission("accounts:ledger", "/admin/accounts/transfers");
  const db = getDb();
  const [arrivals, open] = await Promise.all([listTransferFunds(db), listOpenPayments(db)]);
  const toSettle = arrivals.filter((a) => a.funds.status !== "applied" && !a.funds.resolvedAt);
  return (
    <>
      <PageHeader
        title="Bank transfers"
        subtitle="Money that arrived by bank transfer, matched by the reference the payer quoted; payments still open, and money received outside the payment service."
        actions={<ButtonLink href="/admin/accounts/terms" variant="secondary">Terms and credit</ButtonLink>}
      />
      <div className="space-y-6">
        <Card className="space-y-3" aria-labelledby="arrivals-title">
          <CardTitle id="arrivals-title">Transfers received</CardTitle>
          {toSettle.length ? <p className="rounded bg-amber-50 px-3 py-2 text-sm text-amber-900" role="status">{toSettle.length} to settle: short, over, late or with an unknown reference.</p> : null}
          {arrivals.length === 0 ? <EmptyState title="No transfers yet">A transfer appears here when the bank tells the payment service it arrived.</EmptyState> : null}
          <ul className="divide-y divide-paper-200">
            {arrivals.map(({ funds: f, firm, reference, paymentKind, paymentAmountCents, paymentReceivedCents }) => (
              <li key={f.id} className="grid gap-3 py-3 sm:grid-cols-[1fr_18rem]">
                <div className="space-y-1 text-sm">
                  <div className="flex flex-wrap items-baseline gap-2">
                    <span className="figures font-semibold">{formatCents(f.amountCents, f.currency)}</span>
                    <Badge tone={FUNDS_STATUS_TONE[f.status]}>{FUNDS_STATUS_LABEL[f.status]}</Badge>
                    {f.resolvedAt ? <Badge tone="ok">settled</Badge> : null}
                    <span className="text-xs text-ink-500">arrived {formatDateTime(f.receivedAt)}</span>
                  </div>
                  <p>
                    {firm ?? "Unknown payer"} · reference <span className="font-mono">{f.reference ?? "none"}</span>
                    {reference && paymentKind ? ` · ${PAYMENT_KIND_LABEL[paymentKind]} of ${reference}` : ""}
                  </p>
                  {paymentAmountCents !== null ? (
                    <p className="figures text-ink-600">
                      Applied {formatCents(f.appliedCents, f.currency)} of {formatCents(paymentAmountCents, f.currency)} due
                      {f.amountCents > f.appliedCents ? `; ${formatCents(f.amountCents - f.appliedCents, f.currency)} not applied` : ""}
                      {paymentReceivedCents !== null && paymentReceivedCents < paymentAmountCents ? `; ${formatCents(paymentAmountCents - paymentReceivedCents, f.currency)} still owed` : ""}
                    </p>
                  ) : null}
                  {f.resolution ? <p className="text-ink-600">Settled {formatDate(f.resolvedAt)}: {f.resolution}</p> : null}
                </div>
                {f.status !== "applied" && !f.resolvedAt ? <ResolveTransferForm fundsId={f.id} isUnmatched={f.status === "unmatched"} /> : null}
              </li>
            ))}
          </ul>
        </Card>

        <Card className="space-y-3" aria-labelledby="open-title">
          <CardTitle id="open-title">Payments waiting for money</CardTitle>
          {open.length === 0 ? <EmptyState title="Nothing open">Every payment due has been received.</EmptyState> : null}
          <ul className="divide-y divide-paper-200">
            {open.map((p) => (
              <li key={p.id} className="space-y-2 py-3 text-sm">
                <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                  <span className="font-semibold text-ink-800">{p.firm}</span>
                  <span>
                    {PAYMENT_KIND_LABEL[p.kind]} of {p.reference} · PO {p.poNumber}
                  </span>
                  <Badge tone="info">{PAYMENT_METHOD_LABEL[p.method]}</Badge>
                  {p.transferReference ? <span className="font-mono text-xs">ref {p.transferReference}</span> : null}
                  <span className="figures">
                    {formatCents(p.amountCents - p.receivedCents, p.currency)} owed{p.receivedCents > 0 ? ` (${formatCents(p.receivedCents, p.currency)} received)` : ""}
                  </span>
                  {p.dueAt ? <span className="text-xs text-ink-500">due {formatDate(p.dueAt)}</span> : null}
                </div>
                <ManualPaymentForm paymentId={p.id} owedCents={p.amountCents - p.receivedCents} currency={p.currency} />
              </li>
            ))}
          </ul>
        </Card>
      </div>
    </>
  );
}
