"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { refundPayment } from "@/app/admin/accounts/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Textarea } from "@/components/ui/input";
import { PAYMENT_STATE_LABEL } from "@/lib/labels";
import { formatCents } from "@/lib/money";
import { parseMoneyToCents } from "@/lib/quoting/lines";

/** Full or partial refund; the key is made once per form, so a double submit is refused. */
export function RefundForm({ paymentId, refundableCents, currency }: { paymentId: string; refundableCents: number; currency: string }) {
  const router = useRouter();
  const [key, setKey] = useState(() => crypto.randomUUID());
  const [amount, setAmount] = useState((refundableCents / 100).toFixed(2));
  const [reason, setReason] = useState("");
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  const cents = parseMoneyToCents(amount);
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await refundPayment({ paymentId, amountCents: cents ?? NaN, reason, idempotencyKey: key });
          if (!r.ok) {
            setErrors(r.fieldErrors ?? {});
            return setMsg({ tone: "error", text: r.message });
          }
          setErrors({});
          setMsg({ tone: "ok", text: `Refund of ${formatCents(cents ?? 0, currency)} sent; the payment is now “${PAYMENT_STATE_LABEL[r.data.status]}”.` });
          setKey(crypto.randomUUID());
          setReason("");
          router.refresh();
        });
      }}
    >
      <p className="text-sm text-ink-600">Up to {formatCents(refundableCents, currency)} can be refunded.</p>
      <Field label="Amount ($)" htmlFor="refund-amount" error={errors.amountCents?.[0] ?? (cents === null ? "Enter an amount like 1250.00." : undefined)}>
        <Input id="refund-amount" inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} />
      </Field>
      <Field label="Reason" htmlFor="refund-reason" error={errors.reason?.[0]}>
        <Textarea id="refund-reason" className="min-h-16" value={reason} onChange={(e) => setReason(e.target.value)} />
      </Field>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" variant="danger" disabled={pending || cents === null || refundableCents <= 0}>
        {pending ? "Refunding…" : "Refund"}
      </Button>
    </form>
  );
}
