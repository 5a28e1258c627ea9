import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { getOrganisation } from "@/db/queries/organisations";
import { getOrderWithRequest, getPayment } from "@/db/queries/payments";
import { Card, PageHeader } from "@/components/ui/card";
import { assertCanSee } from "@/lib/auth/guard";
import { orPageError, pageUser } from "@/lib/auth/page-guard";
import { PAYMENT_KIND_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { formatDate } from "@/lib/dates";

export const metadata: Metadata = { title: "Receipt" };
export const dynamic = "force-dynamic";

const day = (d: Date | null) => formatDate(d);

/** Our receipt for one payment, under the bureau's own receipt number. */
export default async function ReceiptPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await pageUser(`/portal/payments/${id}`);
  const db = getDb();
  const { payment, order, request } = await orPageError(async () => {
    const p = await getPayment(db, id);
    const row = p ? await getOrderWithRequest(db, p.orderId) : null;
    assertCanSee(user, row ? { orgId: row.request.orgId, createdById: row.request.createdById } : null, "payment");
    if (p!.status !== "paid" && !p!.status.includes("refunded")) assertCanSee(user, null, "receipt");
    return { payment: p!, order: row!.order, request: row!.request };
  });
  const org = await getOrganisation(db, request.orgId);
  return (
    <>
      <PageHeader title={`Receipt${payment.receiptNumber ? ` ${payment.receiptNumber}` : ""}`} subtitle={`${PAYMENT_KIND_LABEL[payment.kind]} · ${request.reference} · ${request.projectName}`} />
      <Card className="max-w-xl space-y-3 text-sm">
        <dl className="grid grid-cols-[9rem_1fr] gap-y-2 sm:grid-cols-[10rem_1fr]">
          <dt className="text-ink-500">Receipt number</dt>
          <dd className="font-mono">{payment.receiptNumber ?? "being issued"}</dd>
          <dt className="text-ink-500">Received from</dt>
          <dd>{org?.name}</dd>
          <dt className="text-ink-500">Received by</dt>
          <dd>Ostrevane Additive Works</dd>
          <dt className="text-ink-500">For</dt>
          <dd>
            {PAYMENT_KIND_LABEL[payment.kind]} on order {request.reference}, PO {order.poNumber}
          </dd>
          <dt className="text-ink-500">Amount</dt>
          <dd className="figures font-semibold">{formatCents(payment.amountCents, payment.currency)}</dd>
          <dt className="text-ink-500">Paid by</dt>
          <dd>Card</dd>
          {payment.refundedCents > 0 ? (
            <>
              <dt className="text-ink-500">Refunded</dt>
              <dd className="figures">{formatCents(payment.refundedCents, payment.currency)}</dd>
            </>
          ) : null}
          <dt className="text-ink-500">Paid on</dt>
          <dd>{day(payment.paidAt)}</dd>
          <dt className="text-ink-500">Order total</dt>
          <dd className="figures">{formatCents(order.totalCents, order.currency)} (sales-approved quote)</dd>
        </dl>
        <p className="text-xs text-ink-500">Quote the receipt number and the order reference in any question about this payment.</p>
      </Card>
    </>
  );
}
