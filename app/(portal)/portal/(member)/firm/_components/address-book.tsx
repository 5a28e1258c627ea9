"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { addAddress, editAddress, makeDefaultShipTo, removeAddress } from "@/app/(portal)/portal/(member)/firm/address-actions";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/input";
import { AddressFields, addressErrors, emptyAddress, type AddressDraft } from "@/components/portal/address-fields";

export interface AddressView extends AddressDraft {
  id: string;
  kind: "billing" | "shipping";
  isDefault: boolean;
  lines: string[];
  zoneName: string | null;
  transitDays: number | null;
}

const draftOf = (a: AddressView): AddressDraft => ({ label: a.label, attention: a.attention, line1: a.line1, line2: a.line2, city: a.city, region: a.region, postalCode: a.postalCode, country: a.country, phone: a.phone, deliveryNotes: a.deliveryNotes });

function AddressForm({ kind, initial, id, onDone }: { kind: "billing" | "shipping"; initial: AddressDraft; id?: string; onDone: () => void }) {
  const router = useRouter();
  const [v, setV] = useState(initial);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    const res = id ? await editAddress({ id, address: v }) : await addAddress({ kind, address: v });
    setBusy(false);
    if (!res.ok) {
      setErrors(addressErrors(res.fieldErrors));
      return setMsg(res.message);
    }
    router.refresh();
    onDone();
  }
  const prefix = `${kind}-${id ?? "new"}`;
  return (
    <form onSubmit={submit} className="space-y-3 rounded bg-paper-50 p-4 ring-1 ring-paper-200" aria-label={id ? `Edit ${initial.label}` : kind === "billing" ? "Billing address" : "New shipping address"}>
      <AddressFields value={v} onChange={setV} errors={errors} prefix={prefix} withNotes={kind === "shipping"} />
      <FormMessage>{msg}</FormMessage>
      <div className="flex gap-2">
        <Button type="submit" disabled={busy}>
          {busy ? "Saving…" : id ? "Save address" : kind === "billing" ? "Save billing address" : "Add shipping address"}
        </Button>
        <Button type="button" variant="ghost" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function AddressRow({ a }: { a: AddressView }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (editing) return <AddressForm kind={a.kind} id={a.id} initial={draftOf(a)} onDone={() => setEditing(false)} />;
  async function run(p: Promise<{ ok: boolean; message?: string }>) {
    const res = await p;
    if (!res.ok) return setError(res.message ?? "That did not work.");
    router.refresh();
  }
  return (
    <li className="flex flex-wrap items-start gap-x-4 gap-y-2 py-3 text-sm" data-testid="address" data-kind={a.kind}>
      <div className="min-w-0 flex-1">
        <p className="flex flex-wrap items-center gap-2 font-medium text-ink-800">
          {a.label}
          {a.kind === "shipping" && a.isDefault ? <Badge tone="accent">default ship-to</Badge> : null}
          {a.zoneName ? <Badge tone="info">{a.zoneName}{a.transitDays ? ` · about ${a.transitDays} working days` : ""}</Badge> : null}
        </p>
        <address className="not-italic text-ink-600">
          {a.lines.map((l) => (
            <span key={l} className="block">
              {l}
            </span>
          ))}
        </address>
        {a.deliveryNotes ? <p className="text-xs text-ink-500">Delivery: {a.deliveryNotes}</p> : null}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
          Edit
        </Button>
        {a.kind === "shipping" && !a.isDefault ? (
          <Button size="sm" variant="secondary" onClick={() => void run(makeDefaultShipTo({ id: a.id }))}>
            Make default
          </Button>
        ) : null}
        {a.kind === "shipping" ? (
          confirming ? (
            <>
              <Button size="sm" variant="danger" onClick={() => void run(removeAddress({ id: a.id }))}>
                Remove {a.label}
              </Button>
              <Button size="sm" variant="ghost" onClick={() => setConfirming(false)}>
                Keep
              </Button>
            </>
          ) : (
            <Button size="sm" variant="ghost" onClick={() => setConfirming(true)}>
              Remove
            </Button>
          )
        ) : null}
      </div>
      {error ? <p className="w-full text-xs text-signal-danger" role="alert">{error}</p> : null}
    </li>
  );
}

/** The firm's billing address and shipping addresses, each shipping one with its freight zone. */
export function AddressBook({ addresses }: { addresses: AddressView[] }) {
  const [adding, setAdding] = useState<"billing" | "shipping" | null>(null);
  const billing = addresses.filter((a) => a.kind === "billing");
  const shipping = addresses.filter((a) => a.kind === "shipping");
  return (
    <div className="space-y-5">
      <section aria-label="Billing address">
        <h3 className="text-xs font-medium uppercase tracking-wide text-ink-500">Billing address (on invoices)</h3>
        {billing.length ? (
          <ul className="divide-y divide-paper-200">{billing.map((a) => <AddressRow key={a.id} a={a} />)}</ul>
        ) : adding === "billing" ? null : (
          <p className="py-2 text-sm text-ink-500">
            No billing address yet.{" "}
            <button type="button" className="text-kiln-700 underline" onClick={() => setAdding("billing")}>
              Add it
            </button>
          </p>
        )}
        {adding === "billing" ? <AddressForm kind="billing" initial={emptyAddress("Accounts payable")} onDone={() => setAdding(null)} /> : null}
      </section>
      <section aria-label="Shipping addresses" className="space-y-2">
        <h3 className="text-xs font-medium uppercase tracking-wide text-ink-500">Shipping addresses</h3>
        {shipping.length ? (
          <ul className="divide-y divide-paper-200">{shipping.map((a) => <AddressRow key={a.id} a={a} />)}</ul>
        ) : (
          <p className="text-sm text-ink-500">No shipping address yet: estimates price freight to the bureau&apos;s default zone until you add one.</p>
        )}
        {adding === "shipping" ? (
          <AddressForm kind="shipping" initial={emptyAddress()} onDone={() => setAdding(null)} />
        ) : (
          <Button variant="secondary" onClick={() => setAdding("shipping")}>
            Add a shipping address
          </Button>
        )}
      </section>
    </div>
  );
}
