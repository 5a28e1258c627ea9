"use client";

import { useRouter } from "next/navigation";
import { useEffect, useRef, useState, useTransition } from "react";
import { refundPayment } from "@/app/admin/accounts/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Textarea } from "@/components/ui/input";
import { PAYMENT_STATE_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { parseMoneyToCents } from "@/lib/quoting/lines";

/**
 * Full or partial refund. "Refund…" first shows what will happen (amount, where it goes, the
 * client's e-mail); only "Yes, refund" sends it, with the amount again as the server's
 * confirmation. The key is made once per form, so a double submit is refused.
 */
export function RefundForm({ paymentId, refundableCents, currency }: { paymentId: string; refundableCents: number; currency: string }) {
  const router = useRouter();
  const [key, setKey] = useState(() => crypto.randomUUID());
  const [amount, setAmount] = useState((refundableCents / 100).toFixed(2));
  const [reason, setReason] = useState("");
  const [confirming, setConfirming] = useState(false);
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    if (confirming) heading.current?.focus();
  }, [confirming]);
  const cents = parseMoneyToCents(amount);
  const tooMuch = cents !== null && cents > refundableCents;
  const send = () =>
    start(async () => {
      const r = await refundPayment({ paymentId, amountCents: cents ?? NaN, reason, idempotencyKey: key, confirmAmountCents: cents ?? NaN });
      setConfirming(false);
      if (!r.ok) {
        setErrors(r.fieldErrors ?? {});
        return setMsg({ tone: "error", text: r.message });
      }
      setErrors({});
      setMsg({ tone: "ok", text: `Refund of ${formatCents(cents ?? 0, currency)} sent; the payment is now “${PAYMENT_STATE_LABEL[r.data.status]}”. The client has been e-mailed.` });
      setKey(crypto.randomUUID());
      setReason("");
      router.refresh();
    });
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (reason.trim().length < 3) return setErrors({ reason: ["Say why the money goes back."] });
        setErrors({});
        setMsg(null);
        setConfirming(true);
      }}
    >
      <p className="text-sm text-ink-600">Up to {formatCents(refundableCents, currency)} can be refunded.</p>
      <Field label="Amount ($)" htmlFor="refund-amount" error={errors.amountCents?.[0] ?? (cents === null ? "Enter an amount like 1250.00." : tooMuch ? `At most ${formatCents(refundableCents, currency)}.` : undefined)}>
        <Input id="refund-amount" inputMode="decimal" value={amount} disabled={confirming} onChange={(e) => setAmount(e.target.value)} />
      </Field>
      <Field label="Reason" htmlFor="refund-reason" error={errors.reason?.[0]}>
        <Textarea id="refund-reason" className="min-h-16" value={reason} disabled={confirming} onChange={(e) => setReason(e.target.value)} />
      </Field>
      {confirming && cents !== null ? (
        <div role="alertdialog" aria-labelledby="refund-confirm-title" className="rounded border-l-4 border-red-300 bg-red-50 px-4 py-3 text-sm text-red-900">
          <h3 id="refund-confirm-title" ref={heading} tabIndex={-1} className="font-semibold outline-none">
            Refund {formatCents(cents, currency)}?
          </h3>
          <ul className="mt-2 list-disc space-y-1 pl-5">
            <li>The money goes back to the card the client paid with; this can not be undone here.</li>
            <li>{cents === refundableCents ? "This refunds all that is left of the payment." : `${formatCents(refundableCents - cents, currency)} stays on the payment.`}</li>
            <li>The client and their billing contact are e-mailed the amount and your reason.</li>
          </ul>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button type="button" variant="danger" disabled={pending} onClick={send}>
              {pending ? "Refunding…" : `Yes, refund ${formatCents(cents, currency)}`}
            </Button>
            <Button type="button" variant="secondary" disabled={pending} onClick={() => setConfirming(false)}>
              Go back
            </Button>
          </div>
        </div>
      ) : (
        <>
          <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
          <Button type="submit" variant="danger" disabled={pending || cents === null || tooMuch || refundableCents <= 0}>
            Refund…
          </Button>
        </>
      )}
    </form>
  );
}
