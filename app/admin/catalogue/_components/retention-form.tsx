"use client";

import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { saveModelRetention } from "../actions";

/** The bureau's retention period for clients' model files, in days after an order finishes. */
export function RetentionForm({ initialDays }: { initialDays: number }) {
  const [days, setDays] = useState(String(initialDays));
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [error, setError] = useState<string | undefined>();
  const [pending, start] = useTransition();
  return (
    <form
      className="grid gap-3 sm:grid-cols-[14rem_auto] sm:items-end"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await saveModelRetention({ days });
          setError(r.ok ? undefined : r.fieldErrors?.days?.[0]);
          setMsg(r.ok ? { tone: "ok", text: `Saved: files go ${r.data.days} days after an order finishes. Clients see this on their firm page.` } : { tone: "error", text: r.message });
        });
      }}
    >
      <Field label="Days kept after an order closes" htmlFor="retention-days" error={error}>
        <Input id="retention-days" inputMode="numeric" value={days} onChange={(e) => setDays(e.target.value)} aria-invalid={Boolean(error)} />
      </Field>
      <Button type="submit" disabled={pending}>
        Save
      </Button>
      <div className="sm:col-span-2">
        <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      </div>
    </form>
  );
}
