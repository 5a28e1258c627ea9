"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { inviteMember, removeMember, saveBilling } from "@/app/(portal)/portal/(member)/firm/actions";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select } from "@/components/ui/input";

export function InviteForm() {
  const router = useRouter();
  const [email, setEmail] = useState("");
  const [role, setRole] = useState("client");
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    const res = await inviteMember({ email, role });
    setBusy(false);
    if (!res.ok) return setMsg({ tone: "error", text: res.fieldErrors?.email?.[0] ?? res.message });
    setMsg({ tone: "ok", text: `Invitation sent to ${email}.` });
    setEmail("");
    router.refresh();
  }
  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-[1fr_16rem_auto] sm:items-end" aria-label="Invite a colleague">
      <Field label="Colleague's e-mail" htmlFor="invite-email">
        <Input id="invite-email" type="email" value={email} onChange={(e) => setEmail(e.target.value)} required />
      </Field>
      <Field label="Role" htmlFor="invite-role">
        <Select id="invite-role" value={role} onChange={(e) => setRole(e.target.value)}>
          <option value="client">Engineer: own requests</option>
          <option value="client_admin">Lead: firm, members, billing</option>
        </Select>
      </Field>
      <Button type="submit" disabled={busy}>
        {busy ? "Inviting…" : "Invite"}
      </Button>
      <div className="sm:col-span-3">
        <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      </div>
    </form>
  );
}

export function RemoveMemberButton({ userId, email, isSelf }: { userId: string; email: string; isSelf: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  if (isSelf) return <Badge>you</Badge>;
  async function go() {
    const res = await removeMember({ userId });
    if (!res.ok) return setError(res.message);
    router.refresh();
  }
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      {confirming ? (
        <>
          <span className="text-xs">Remove {email}?</span>
          <Button size="sm" variant="danger" onClick={() => void go()}>
            Remove
          </Button>
          <Button size="sm" variant="ghost" onClick={() => setConfirming(false)}>
            Keep
          </Button>
        </>
      ) : (
        <Button size="sm" variant="secondary" onClick={() => setConfirming(true)}>
          Remove
        </Button>
      )}
      {error ? <span className="text-xs text-signal-danger" role="alert">{error}</span> : null}
    </span>
  );
}

export function BillingForm({ initial }: { initial: { billingContact: string; billingEmail: string; defaultPoNumber: string } }) {
  const [v, setV] = useState(initial);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const res = await saveBilling(v);
    if (!res.ok) {
      setErrors(res.fieldErrors ?? {});
      return setMsg({ tone: "error", text: res.message });
    }
    setErrors({});
    setMsg({ tone: "ok", text: "Billing details saved." });
  }
  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-3" aria-label="Billing">
      <Field label="Billing contact" htmlFor="billingContact" error={errors.billingContact?.[0]}>
        <Input id="billingContact" value={v.billingContact} onChange={(e) => setV({ ...v, billingContact: e.target.value })} />
      </Field>
      <Field label="Invoices to (e-mail)" htmlFor="billingEmail" error={errors.billingEmail?.[0]}>
        <Input id="billingEmail" type="email" value={v.billingEmail} onChange={(e) => setV({ ...v, billingEmail: e.target.value })} />
      </Field>
      <Field label="Default PO number" htmlFor="defaultPoNumber" error={errors.defaultPoNumber?.[0]} hint="Filled in when you accept a quote.">
        <Input id="defaultPoNumber" value={v.defaultPoNumber} onChange={(e) => setV({ ...v, defaultPoNumber: e.target.value })} />
      </Field>
      <div className="flex items-center gap-3 sm:col-span-3">
        <Button type="submit">Save billing</Button>
        <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      </div>
    </form>
  );
}
