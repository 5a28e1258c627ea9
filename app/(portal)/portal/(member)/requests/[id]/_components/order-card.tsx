import { INVOICE_STANDING_LABEL, INVOICE_STANDING_TONE, PAYMENT_TERMS_LABEL } from "@/lib/labels";
import { invoiceStanding } from "@/lib/payments/terms";
import type { getOrderByRequest, listPaymentsForOrder } from "@/db/queries/payments";
import type { Stage } from "@/db/schema/common";
import { FigureKind } from "@/app/(portal)/portal/(member)/requests/_components/estimate-panel";
import { PayButton, PaymentsList, TransferButton, TransferInstructions } from "./payments";
import { ShipToBlock } from "@/components/ship-to";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle } from "@/components/ui/card";
import { formatCents } from "@/lib/money";
import { formatDate } from "@/lib/dates";

type Order = NonNullable<Awaited<ReturnType<typeof getOrderByRequest>>>;
type Payment = Awaited<ReturnType<typeof listPaymentsForOrder>>[number];

/** The order's figures, how it is paid (card, transfer or account), where it ships and its payments. */
export function OrderCard({ order, payments, stage, canPay }: { order: Order; payments: Payment[]; stage: Stage; canPay: boolean }) {
  const onAccount = order.paymentTerms !== "prepay";
  const paid = (kind: "deposit" | "balance") => payments.some((p) => p.kind === kind && (p.status === "paid" || p.status.includes("refunded")));
  const transfers = payments
    .filter((p) => p.status === "pending" && p.method === "bank_transfer" && p.transferReference && p.transferDetails)
    .map((p) => ({ kind: p.kind, reference: p.transferReference!, ...p.transferDetails!, amountCents: p.amountCents, receivedCents: p.receivedCents, currency: p.currency }));
  const standing = onAccount ? invoiceStanding({ dueAt: order.dueAt, isPaid: paid("balance"), now: new Date() }) : null;
  return (
    <Card className="space-y-4" aria-label="Order and payments">
      <div className="flex flex-wrap items-center gap-2">
        <CardTitle>Order</CardTitle>
        <FigureKind kind="quote" />
        <span className="text-sm text-ink-500">PO {order.poNumber}</span>
      </div>
      <dl className="grid grid-cols-3 gap-3 text-sm">
        <div>
          <dt className="text-xs text-ink-500">Total</dt>
          <dd className="figures font-semibold">{formatCents(order.totalCents, order.currency)}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-500">Deposit</dt>
          <dd className="figures">{onAccount ? "None (on account)" : formatCents(order.depositCents, order.currency)} {paid("deposit") ? <Badge tone="ok">paid</Badge> : null}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-500">{onAccount ? "Invoiced on account" : "Balance"}</dt>
          <dd className="figures">{formatCents(order.balanceCents, order.currency)} {paid("balance") ? <Badge tone="ok">paid</Badge> : null}</dd>
        </div>
      </dl>
      {order && onAccount && standing ? (
        <p className="flex flex-wrap items-center gap-2 text-sm" data-testid="terms-line">
          <span>
            On account, {PAYMENT_TERMS_LABEL[order.paymentTerms]}
            {order.dueAt ? <>: due by <strong>{formatDate(order.dueAt)}</strong></> : ": invoiced when the order ships"}.
          </span>
          <Badge tone={INVOICE_STANDING_TONE[standing]}>{INVOICE_STANDING_LABEL[standing]}</Badge>
        </p>
      ) : null}
      {transfers.map((t) => (
        <TransferInstructions key={t.reference} t={t} />
      ))}
      {canPay && stage === "accepted" && !paid("deposit") ? (
        <div className="flex flex-wrap items-start gap-3">
          {/* Once money came by transfer, the rest comes the same way (a card page would take the whole again). */}
          {!transfers.some((t) => t.kind === "deposit" && t.receivedCents > 0) ? <PayButton orderId={order.id} kind="deposit" amountCents={order.depositCents} currency={order.currency} /> : null}
          {!transfers.some((t) => t.kind === "deposit") ? <TransferButton orderId={order.id} kind="deposit" /> : null}
        </div>
      ) : null}
      {canPay && (stage === "shipped" || stage === "delivered") && !paid("balance") && order.balanceCents > 0 ? (
        <div className="flex flex-wrap items-start gap-3">
          {!transfers.some((t) => t.kind === "balance" && t.receivedCents > 0) ? <PayButton orderId={order.id} kind="balance" amountCents={order.balanceCents} currency={order.currency} /> : null}
          {!transfers.some((t) => t.kind === "balance") ? <TransferButton orderId={order.id} kind="balance" /> : null}
        </div>
      ) : null}
      <ShipToBlock shipTo={order.shipTo} />
      {order.taxExemption ? <p className="text-sm text-tide-700">No tax: exemption certificate {order.taxExemption.certificateNumber} ({order.taxExemption.issuedBy}).</p> : null}
      {order.carrier || order.trackingNumber ? (
        <p className="text-sm">
          Shipped with {order.carrier ?? "our carrier"}
          {order.trackingNumber ? `, tracking ${order.trackingNumber}` : ""}.
        </p>
      ) : null}
      <PaymentsList payments={payments.map((p) => ({ id: p.id, kind: p.kind, method: p.method, status: p.status, receiptNumber: p.receiptNumber, amountCents: p.amountCents, currency: p.currency, createdAt: p.createdAt.toISOString(), paidAt: p.paidAt?.toISOString() ?? null }))} />
    </Card>
  );
}
