"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { reviewTaxExemption, setTerms } from "@/app/admin/accounts/terms/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select } from "@/components/ui/input";
import { PAYMENT_TERMS_LABEL, type PaymentTermsKey } from "@/lib/labels";
import { parseMoneyToCents } from "@/lib/quoting/lines";

/** Net terms and credit limit of one firm; the limit is typed in dollars and sent in cents. */
export function TermsForm({ orgId, firm, terms, limitCents }: { orgId: string; firm: string; terms: PaymentTermsKey; limitCents: number }) {
  const router = useRouter();
  const [value, setValue] = useState<PaymentTermsKey>(terms);
  const [limit, setLimit] = useState((limitCents / 100).toFixed(2));
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, start] = useTransition();
  const cents = parseMoneyToCents(limit);
  return (
    <form
      className="grid items-end gap-3 sm:grid-cols-[10rem_12rem_auto]"
      aria-label={`Terms of ${firm}`}
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await setTerms({ orgId, paymentTerms: value, creditLimitCents: value === "prepay" ? 0 : (cents ?? NaN) });
          if (!r.ok) {
            setErrors(r.fieldErrors ?? {});
            return setMsg({ tone: "error", text: r.message });
          }
          setErrors({});
          setMsg({ tone: "ok", text: value === "prepay" ? "Back on deposit and balance." : `Approved for ${PAYMENT_TERMS_LABEL[value]}.` });
          router.refresh();
        });
      }}
    >
      <Field label="Terms" htmlFor={`terms-${orgId}`} error={errors.paymentTerms?.[0]}>
        <Select id={`terms-${orgId}`} value={value} onChange={(e) => setValue(e.target.value as PaymentTermsKey)}>
          {(Object.keys(PAYMENT_TERMS_LABEL) as PaymentTermsKey[]).map((k) => (
            <option key={k} value={k}>
              {PAYMENT_TERMS_LABEL[k]}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Credit limit ($)" htmlFor={`limit-${orgId}`} error={errors.creditLimitCents?.[0] ?? (value !== "prepay" && cents === null ? "Enter an amount like 50000.00." : undefined)}>
        <Input id={`limit-${orgId}`} inputMode="decimal" value={value === "prepay" ? "0.00" : limit} disabled={value === "prepay"} onChange={(e) => setLimit(e.target.value)} />
      </Field>
      <div>
        <Button type="submit" variant="secondary" disabled={pending}>
          {pending ? "Saving…" : "Save terms"}
        </Button>
      </div>
      {msg ? (
        <div className="sm:col-span-3">
          <FormMessage tone={msg.tone}>{msg.text}</FormMessage>
        </div>
      ) : null}
    </form>
  );
}

/** Approve or reject a pending tax-exemption certificate; a rejection says why. */
export function ReviewForm({ id, number, isExpired }: { id: string; number: string; isExpired: boolean }) {
  const router = useRouter();
  const [note, setNote] = useState("");
  const [msg, setMsg] = useState<string | null>(null);
  const [pending, start] = useTransition();
  const decide = (decision: "approved" | "rejected") =>
    start(async () => {
      const r = await reviewTaxExemption({ id, decision, note });
      if (!r.ok) return setMsg(r.fieldErrors?.note?.[0] ?? r.message);
      setMsg(null);
      router.refresh();
    });
  return (
    <div className="space-y-2" aria-label={`Review certificate ${number}`}>
      <Field label="Note to the firm (needed to reject)" htmlFor={`note-${id}`}>
        <Input id={`note-${id}`} value={note} onChange={(e) => setNote(e.target.value)} />
      </Field>
      <div className="flex flex-wrap gap-2">
        <Button type="button" disabled={pending || isExpired} onClick={() => decide("approved")}>
          Approve
        </Button>
        <Button type="button" variant="secondary" disabled={pending} onClick={() => decide("rejected")}>
          Reject
        </Button>
      </div>
      {isExpired ? <p className="text-xs text-signal-warn">Expired: it can only be rejected.</p> : null}
      <FormMessage>{msg}</FormMessage>
    </div>
  );
}
