"use client";

import Link from "next/link";
import { useState, useSyncExternalStore } from "react";
import { useRouter } from "next/navigation";
import { payByTransfer, payOrder } from "@/app/(portal)/portal/(member)/requests/[id]/actions";
import { PaymentStateBadge } from "@/components/stage-badge";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/input";
import { PAYMENT_KIND_LABEL, PAYMENT_METHOD_LABEL, type PaymentState } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { formatDate } from "@/lib/dates";

export interface PaymentView {
  id: string;
  kind: "deposit" | "balance";
  /** Card, bank transfer or recorded by accounts; card when absent. */
  method?: "card" | "bank_transfer" | "manual";
  status: PaymentState;
  receiptNumber: string | null;
  amountCents: number;
  currency: string;
  createdAt: string;
  paidAt: string | null;
}

const day = (iso: string | null) => formatDate(iso);

const noSubscription = () => () => {};

/**
 * The pay button: one click opens one payment page (the server reuses an open one). It stays
 * disabled until the page is interactive: a click before that would be lost without a word.
 */
export function PayButton({ orderId, kind, amountCents, currency }: { orderId: string; kind: "deposit" | "balance"; amountCents: number; currency: string }) {
  const interactive = useSyncExternalStore(noSubscription, () => true, () => false);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  async function pay() {
    if (busy) return;
    setBusy(true);
    setMessage(null);
    const res = await payOrder({ orderId, kind });
    if (!res.ok) {
      setMessage(res.message);
      setBusy(false);
      return;
    }
    if (res.data.url) window.location.assign(res.data.url);
    else {
      setMessage("This payment is already complete; we are recording it.");
      setBusy(false);
    }
  }
  return (
    <div className="space-y-2">
      <Button type="button" onClick={() => void pay()} disabled={busy || !interactive}>
        {busy ? "Opening the payment page…" : `Pay the ${kind} · ${formatCents(amountCents, currency)}`}
      </Button>
      <FormMessage>{message}</FormMessage>
    </div>
  );
}

/** Opens (once) the bank-transfer details for a deposit or balance; the page then shows them. */
export function TransferButton({ orderId, kind }: { orderId: string; kind: "deposit" | "balance" }) {
  const interactive = useSyncExternalStore(noSubscription, () => true, () => false);
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  async function open() {
    if (busy) return;
    setBusy(true);
    setMessage(null);
    const res = await payByTransfer({ orderId, kind });
    setBusy(false);
    if (!res.ok) return setMessage(res.message);
    router.refresh();
  }
  return (
    <div className="space-y-2">
      <Button type="button" variant="secondary" onClick={() => void open()} disabled={busy || !interactive}>
        {busy ? "Getting the bank details…" : "Pay by bank transfer instead"}
      </Button>
      <FormMessage>{message}</FormMessage>
    </div>
  );
}

/** Where to send a bank transfer and the reference to quote (the payment's own). */
export interface TransferView {
  kind: "deposit" | "balance";
  reference: string;
  bankName: string;
  accountHolder: string;
  accountNumber: string;
  routingNumber: string;
  amountCents: number;
  receivedCents: number;
  currency: string;
}

export function TransferInstructions({ t }: { t: TransferView }) {
  const left = t.amountCents - t.receivedCents;
  return (
    <div className="space-y-2 rounded bg-tide-50 p-3 text-sm ring-1 ring-tide-100" data-testid="transfer-instructions">
      <p className="font-medium text-ink-800">
        Bank transfer for the {t.kind}: {formatCents(left, t.currency)} {t.receivedCents > 0 ? `still to come (${formatCents(t.receivedCents, t.currency)} received)` : "to send"}
      </p>
      <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-2">
        <div><dt className="text-xs text-ink-500">Reference (quote it exactly)</dt><dd className="font-mono text-base font-semibold tracking-wider">{t.reference}</dd></div>
        <div><dt className="text-xs text-ink-500">Account holder</dt><dd>{t.accountHolder}</dd></div>
        <div><dt className="text-xs text-ink-500">Bank</dt><dd>{t.bankName}</dd></div>
        <div><dt className="text-xs text-ink-500">Account · routing number</dt><dd className="font-mono">{t.accountNumber} · {t.routingNumber}</dd></div>
      </dl>
      <p className="text-xs text-ink-600">We match the money by the reference. A transfer usually takes one to three working days; you get an e-mail when it is in.</p>
    </div>
  );
}

export function PaymentsList({ payments }: { payments: PaymentView[] }) {
  if (payments.length === 0) return <p className="text-sm text-ink-500">No payments yet.</p>;
  return (
    <ul className="divide-y divide-paper-200 text-sm">
      {payments.map((p) => (
        <li key={p.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2">
          <span className="font-medium">
            {PAYMENT_KIND_LABEL[p.kind]}
            {p.method && p.method !== "card" ? <span className="font-normal text-ink-600"> · {PAYMENT_METHOD_LABEL[p.method].toLowerCase()}</span> : null}
          </span>
          <span className="figures">{formatCents(p.amountCents, p.currency)}</span>
          <PaymentStateBadge state={p.status} />
          <span className="text-xs text-ink-500">{p.paidAt ? `paid ${day(p.paidAt)}` : `opened ${day(p.createdAt)}`}</span>
          {p.status === "paid" || p.status.includes("refunded") ? (
            <Link href={`/portal/payments/${p.id}`} className="ml-auto text-kiln-700 underline">
              Receipt{p.receiptNumber ? ` ${p.receiptNumber}` : ""}
            </Link>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
