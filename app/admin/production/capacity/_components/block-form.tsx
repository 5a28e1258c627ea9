"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select } from "@/components/ui/input";
import { zoneLabel } from "@/lib/dates";
import type { ActionResult } from "@/lib/errors";

type BlockInput = { resourceKey: string; start: string; end: string; reason: string };

/** Block a cell or the router for maintenance; the action comes from the page (server action as a prop). */
export function BlockForm({ action, resources }: { action: (input: BlockInput) => Promise<ActionResult<{ id: string }>>; resources: { key: string; name: string }[] }) {
  const router = useRouter();
  const [v, setV] = useState<BlockInput>({ resourceKey: resources[0]?.key ?? "", start: "", end: "", reason: "" });
  const [msg, setMsg] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  const set = (k: keyof BlockInput) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          const r = await action(v);
          if (!r.ok) { setErrors(r.fieldErrors ?? {}); setMsg({ tone: "error", text: r.message }); return; }
          setErrors({}); setMsg({ tone: "ok", text: "Blocked; new estimates go around it." }); setV({ ...v, start: "", end: "", reason: "" });
          router.refresh();
        });
      }}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Cell or router" htmlFor="block-resource" error={errors.resourceKey?.[0]}>
          <Select id="block-resource" value={v.resourceKey} onChange={set("resourceKey")}>
            {resources.map((r) => <option key={r.key} value={r.key}>{r.name}</option>)}
          </Select>
        </Field>
        <Field label="What is done" htmlFor="block-reason" error={errors.reason?.[0]}>
          <Input id="block-reason" value={v.reason} onChange={set("reason")} placeholder="e.g. screw and barrel inspection" />
        </Field>
        <Field label={`From (plant time, ${zoneLabel()})`} htmlFor="block-start" error={errors.start?.[0]}>
          <Input id="block-start" type="datetime-local" value={v.start} onChange={set("start")} />
        </Field>
        <Field label={`Until (plant time, ${zoneLabel()})`} htmlFor="block-end" error={errors.end?.[0]}>
          <Input id="block-end" type="datetime-local" value={v.end} onChange={set("end")} />
        </Field>
      </div>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" disabled={pending}>{pending ? "Blocking…" : "Block for maintenance"}</Button>
    </form>
  );
}

export function RemoveBlockButton({ action, id, label }: { action: (input: { id: string }) => Promise<ActionResult<{ removed: string }>>; id: string; label: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [error, setError] = useState<string | null>(null);
  return (
    <span className="flex items-center gap-2">
      {error ? <span className="text-xs text-signal-danger">{error}</span> : null}
      <Button type="button" variant="secondary" size="sm" aria-label={label} disabled={pending} onClick={() => start(async () => { const r = await action({ id }); if (!r.ok) setError(r.message); else router.refresh(); })}>
        {pending ? "Removing…" : "Remove"}
      </Button>
    </span>
  );
}
