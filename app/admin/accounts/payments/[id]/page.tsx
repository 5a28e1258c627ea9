import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { dateText, dateTimeText } from "@/components/admin/format";
import { RefundForm } from "@/app/admin/accounts/payments/[id]/_components/refund-form";
import { PaymentStateBadge, RefundStateBadge } from "@/components/stage-badge";
import { OrderDocumentsCard } from "@/components/admin/order-documents";
import { Card, CardTitle, PageHeader } from "@/components/ui/card";
import { getDb } from "@/db/client";
import { getLedgerPayment, listRefundsForPayments } from "@/db/queries/ledger";
import { pagePermission } from "@/lib/auth/page-guard";
import { hasPermission } from "@/lib/auth/policy";
import { PAYMENT_KIND_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";

export const metadata: Metadata = { title: "Payment" };
export const dynamic = "force-dynamic";

export default async function PaymentPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await pagePermission("accounts:ledger", `/admin/accounts/payments/${id}`);
  const db = getDb();
  const p = await getLedgerPayment(db, id);
  if (!p) notFound();
  const refunds = await listRefundsForPayments(db, [id]);
  const taken = refunds.filter((r) => r.status !== "failed").reduce((s, r) => s + r.amountCents, 0);
  const refundable = ["paid", "partially_refunded"].includes(p.status) ? Math.max(0, p.amountCents - taken) : 0;
  return (
    <>
      <PageHeader title={`${PAYMENT_KIND_LABEL[p.kind]} · ${p.reference}`} subtitle={<span className="flex items-center gap-2">{p.firmName} · {p.projectName} <PaymentStateBadge state={p.status} /></span>} />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card>
          <CardTitle>Payment</CardTitle>
          <dl className="mt-2 grid grid-cols-2 gap-2 text-sm">
            <div><dt className="text-xs text-ink-500">Amount</dt><dd className="figures">{formatCents(p.amountCents, p.currency)}</dd></div>
            <div><dt className="text-xs text-ink-500">Processing fee</dt><dd className="figures">{p.feeCents === null ? "—" : formatCents(p.feeCents, p.currency)}</dd></div>
            <div><dt className="text-xs text-ink-500">Refunded</dt><dd className="figures">{formatCents(p.refundedCents, p.currency)}</dd></div>
            <div><dt className="text-xs text-ink-500">Paid</dt><dd>{dateText(p.paidAt)}</dd></div>
            <div><dt className="text-xs text-ink-500">Receipt number</dt><dd className="font-mono">{p.receiptNumber ?? "—"}</dd></div>
            <div><dt className="text-xs text-ink-500">Processor reference</dt><dd className="break-all font-mono text-xs">{p.processorReference ?? "—"}</dd></div>
          </dl>
          <h3 className="mt-4 text-sm font-semibold text-ink-700">Refunds</h3>
          {refunds.length === 0 ? <p className="text-sm text-ink-500">None.</p> : (
            <ul className="mt-1 space-y-1 text-sm">
              {refunds.map((r) => <li key={r.id}><span className="figures">{formatCents(r.amountCents, p.currency)}</span> <RefundStateBadge state={r.status} /> {dateTimeText(r.createdAt)} · {r.reason}</li>)}
            </ul>
          )}
        </Card>
        <OrderDocumentsCard requestId={p.requestId} user={user} />
        <Card>
          <CardTitle>Refund</CardTitle>
          <div className="mt-2">
            {hasPermission(user, "accounts:refund") ? (
              refundable > 0 ? <RefundForm paymentId={id} refundableCents={refundable} currency={p.currency} /> : <p className="text-sm text-ink-500">Nothing left to refund on this payment.</p>
            ) : <p className="text-sm text-ink-500">Your role may not refund.</p>}
          </div>
        </Card>
      </div>
    </>
  );
}
