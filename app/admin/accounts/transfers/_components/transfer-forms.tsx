"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { recordManualPayment, resolveTransfer } from "@/app/admin/accounts/transfers/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { formatCents } from "@/lib/money";
import { parseMoneyToCents } from "@/lib/quoting/lines";

/** Money that came outside the payment service, recorded against one payment after a confirm step. */
export function ManualPaymentForm({ paymentId, owedCents, currency }: { paymentId: string; owedCents: number; currency: string }) {
  const router = useRouter();
  const [amount, setAmount] = useState((owedCents / 100).toFixed(2));
  const [reference, setReference] = useState("");
  const [confirming, setConfirming] = useState(false);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  const cents = parseMoneyToCents(amount);
  const send = () =>
    start(async () => {
      const r = await recordManualPayment({ paymentId, amountCents: cents ?? NaN, reference, confirmAmountCents: cents ?? NaN, note: "" });
      setConfirming(false);
      if (!r.ok) {
        setErrors(r.fieldErrors ?? {});
        return setMsg({ tone: "error", text: r.message });
      }
      setErrors({});
      setMsg({ tone: "ok", text: r.data.isPaid ? "Recorded; the payment is paid and the client has its receipt." : "Recorded; the rest is still owed." });
      router.refresh();
    });
  return (
    <form
      className="grid items-end gap-2 sm:grid-cols-[9rem_12rem_auto]"
      aria-label="Record a payment received outside the payment service"
      onSubmit={(e) => {
        e.preventDefault();
        setMsg(null);
        if (cents === null || cents <= 0) return setErrors({ amountCents: ["Enter an amount like 1250.00."] });
        if (reference.trim().length < 3) return setErrors({ reference: ["Enter the bank's or cheque's reference."] });
        setErrors({});
        setConfirming(true);
      }}
    >
      <Field label="Amount ($)" htmlFor={`mp-amount-${paymentId}`} error={errors.amountCents?.[0]}>
        <Input id={`mp-amount-${paymentId}`} inputMode="decimal" value={amount} disabled={confirming} onChange={(e) => setAmount(e.target.value)} />
      </Field>
      <Field label="Bank or cheque reference" htmlFor={`mp-ref-${paymentId}`} error={errors.reference?.[0]}>
        <Input id={`mp-ref-${paymentId}`} value={reference} disabled={confirming} onChange={(e) => setReference(e.target.value)} />
      </Field>
      {confirming ? (
        <div className="flex flex-wrap gap-2" role="group" aria-label="Confirm">
          <Button type="button" disabled={pending} onClick={send}>
            {pending ? "Recording…" : `Yes, record ${formatCents(cents ?? 0, currency)}`}
          </Button>
          <Button type="button" variant="secondary" disabled={pending} onClick={() => setConfirming(false)}>
            Go back
          </Button>
        </div>
      ) : (
        <div>
          <Button type="submit" variant="secondary">
            Record a payment…
          </Button>
        </div>
      )}
      {msg ? (
        <div className="sm:col-span-3">
          <FormMessage tone={msg.tone}>{msg.text}</FormMessage>
        </div>
      ) : null}
    </form>
  );
}

/** Settle an arrival: apply an unknown reference to the right payment, or note what was done. */
export function ResolveTransferForm({ fundsId, isUnmatched }: { fundsId: string; isUnmatched: boolean }) {
  const router = useRouter();
  const [ref, setRef] = useState("");
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<string | null>(null);
  const [pending, start] = useTransition();
  return (
    <form
      className="space-y-2"
      aria-label="Settle this transfer"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await resolveTransfer({ fundsId, note, applyToReference: ref.trim() || undefined });
          if (!r.ok) {
            setErrors(r.fieldErrors ?? {});
            return setMsg(r.message);
          }
          setErrors({});
          setMsg(null);
          router.refresh();
        });
      }}
    >
      {isUnmatched ? (
        <Field label="Apply to the transfer reference (optional)" htmlFor={`rt-ref-${fundsId}`} error={errors.applyToReference?.[0]}>
          <Input id={`rt-ref-${fundsId}`} value={ref} onChange={(e) => setRef(e.target.value.toUpperCase())} />
        </Field>
      ) : null}
      <Field label="What was done" htmlFor={`rt-note-${fundsId}`} error={errors.note?.[0]}>
        <Input id={`rt-note-${fundsId}`} value={note} placeholder="e.g. excess returned to the firm" onChange={(e) => setNote(e.target.value)} />
      </Field>
      <Button type="submit" variant="secondary" size="sm" disabled={pending}>
        {pending ? "Saving…" : "Settle"}
      </Button>
      <FormMessage>{msg}</FormMessage>
    </form>
  );
}
