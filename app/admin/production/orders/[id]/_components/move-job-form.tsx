"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select, Textarea } from "@/components/ui/input";
import { zoneLabel } from "@/lib/dates";
import type { ActionResult } from "@/lib/errors";

type MoveInput = { orderId: string; start: string; reason: string };
type Moved = { moved: { orderId: string; fromDate: string; toDate: string; clientTold: boolean }[] };

/** What the two forms share: the answer shown, the field errors, the pending state, and the page refreshed after a replan. */
function useReplan(onDone: () => void) {
  const router = useRouter();
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  const submit = (call: () => Promise<ActionResult<Moved>>, said: (moved: Moved["moved"]) => string) =>
    start(async () => {
      const r = await call();
      if (!r.ok) { setErrors(r.fieldErrors ?? {}); setMsg({ tone: "error", text: r.message }); return; }
      const told = r.data.moved.filter((m) => m.clientTold).length;
      setErrors({}); onDone();
      setMsg({ tone: "ok", text: `${said(r.data.moved)}${told ? ` ${told} client${told === 1 ? " was" : "s were"} e-mailed the new ship date.` : " No ship date moved by a working day."}` });
      router.refresh();
    });
  return { msg, errors, pending, submit };
}

/**
 * Move a booked job (a delay, or earlier when the cell frees up): jobs it would overlap move back
 * behind it, and each client whose ship date moves by a working day or more is e-mailed with the
 * reason given here. The action comes from the page.
 */
export function MoveJobForm({ action, orderId, defaultStart }: { action: (input: MoveInput) => Promise<ActionResult<Moved>>; orderId: string; defaultStart: string }) {
  const [startAt, setStart] = useState(defaultStart);
  const [reason, setReason] = useState("");
  const { msg, errors, pending, submit } = useReplan(() => setReason(""));
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        submit(() => action({ orderId, start: startAt, reason }), (moved) => {
          const others = moved.filter((m) => m.orderId !== orderId).length;
          return `Moved.${others ? ` ${others} job${others === 1 ? "" : "s"} behind it moved back too.` : ""}`;
        });
      }}
    >
      <Field label={`New print start (plant time, ${zoneLabel()})`} htmlFor="move-start" error={errors.start?.[0]}>
        <Input id="move-start" type="datetime-local" value={startAt} onChange={(e) => setStart(e.target.value)} />
      </Field>
      <Field label="Reason (the client reads it if the ship date moves)" htmlFor="move-reason" error={errors.reason?.[0]}>
        <Textarea id="move-reason" rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
      </Field>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" variant="secondary" disabled={pending}>{pending ? "Moving…" : "Move the job"}</Button>
    </form>
  );
}

type EndInput = { orderId: string; kind: "print" | "cooling" | "machining"; endsAt: string; reason: string };
const KIND_WORD = { print: "Printing", cooling: "Cooling", machining: "Machining" } as const;

/** A block ends at another time than planned (finished early, running late); the action comes from the page. */
export function BlockEndForm({ action, orderId, kinds, defaultEnd }: { action: (input: EndInput) => Promise<ActionResult<Moved>>; orderId: string; kinds: EndInput["kind"][]; defaultEnd: string }) {
  const [kind, setKind] = useState<EndInput["kind"]>(kinds[0] ?? "print");
  const [endsAt, setEnd] = useState(defaultEnd);
  const [reason, setReason] = useState("");
  const { msg, errors, pending, submit } = useReplan(() => setReason(""));
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        submit(() => action({ orderId, kind, endsAt, reason }), () => "Replanned from the new end.");
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Which step" htmlFor="end-kind">
          <Select id="end-kind" value={kind} onChange={(e) => setKind(e.target.value as EndInput["kind"])}>
            {kinds.map((k) => <option key={k} value={k}>{KIND_WORD[k]}</option>)}
          </Select>
        </Field>
        <Field label={`Ends (plant time, ${zoneLabel()})`} htmlFor="end-at" error={errors.endsAt?.[0]}>
          <Input id="end-at" type="datetime-local" value={endsAt} onChange={(e) => setEnd(e.target.value)} />
        </Field>
      </div>
      <Field label="Reason (the client reads it if the ship date moves)" htmlFor="end-reason" error={errors.reason?.[0]}>
        <Textarea id="end-reason" rows={2} value={reason} onChange={(e) => setReason(e.target.value)} />
      </Field>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" variant="secondary" disabled={pending}>{pending ? "Replanning…" : "Replan from this end"}</Button>
    </form>
  );
}
