"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { moveStage, recordActuals, scheduleOrder } from "@/app/admin/production/actions";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select, Textarea } from "@/components/ui/input";
import { zoneLabel } from "@/lib/dates";
import { stageText } from "@/components/admin/format";
import { ReportUpload, type FiledReport } from "./report-upload";
import { ConfirmMove, type GuardedMove, type MoveContext } from "./stage-confirm";

type Msg = { tone: "ok" | "error"; text: string } | null;

function useSubmit() {
  const router = useRouter();
  const [msg, setMsg] = useState<Msg>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [pending, start] = useTransition();
  const run = (fn: () => Promise<{ ok: true } | { ok: false; message: string; fieldErrors?: Record<string, string[]> }>, okText: string) =>
    start(async () => {
      const r = await fn();
      // The message and the page's fresh data arrive together (one transition), so no form shows a
      // choice made for the order's old stage beside "Moved to …"; the button stays busy until then.
      start(() => {
        if (!r.ok) {
          setErrors(r.fieldErrors ?? {});
          setMsg({ tone: "error", text: r.message });
        } else {
          setErrors({});
          setMsg({ tone: "ok", text: okText });
          router.refresh();
        }
      });
    });
  return { msg, errors, pending, run };
}

export function ScheduleForm({ orderId, cells, defaultCell, defaultStart }: { orderId: string; cells: { key: string; name: string }[]; defaultCell: string; defaultStart: string }) {
  const [cellKey, setCell] = useState(defaultCell);
  const [startAt, setStart] = useState(defaultStart);
  const { msg, errors, pending, run } = useSubmit();
  return (
    <form className="space-y-3" onSubmit={(e) => (e.preventDefault(), run(() => scheduleOrder({ orderId, cellKey, start: startAt }), "Scheduled; the client has been e-mailed the planned dates."))}>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Printing cell" htmlFor="cell">
          <Select id="cell" value={cellKey} onChange={(e) => setCell(e.target.value)}>
            {cells.map((c) => <option key={c.key} value={c.key}>{c.name}</option>)}
          </Select>
        </Field>
        <Field label={`Print start (plant time, ${zoneLabel()})`} htmlFor="start" error={errors.start?.[0]}>
          <Input id="start" type="datetime-local" value={startAt} onChange={(e) => setStart(e.target.value)} />
        </Field>
      </div>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" disabled={pending}>{pending ? "Planning…" : "Schedule on this cell"}</Button>
    </form>
  );
}

/**
 * Options come ordered forward first (lib/orders/stages.ts orderMoves), so the preselected move is
 * the next forward stage; when the order's stage changes the choice goes back to that default, so
 * no choice outlives a move (the "Moved to …" message stays).
 */
export function StageForm({ orderId, options, context }: { orderId: string; options: { stage: string; ok: boolean; reason?: string; isBack?: boolean }[]; context: MoveContext }) {
  const allowed = options.filter((o) => o.ok);
  const first = allowed[0]?.stage ?? "";
  const [to, setTo] = useState(first);
  const [note, setNote] = useState("");
  const [seenFrom, setSeenFrom] = useState(context.from);
  if (seenFrom !== context.from) {
    // The order moved (this form's move, or someone else's): start again from the default.
    setSeenFrom(context.from);
    setTo(first);
    setNote("");
  }
  const [confirming, setConfirming] = useState(false);
  const [noteError, setNoteError] = useState<string | undefined>();
  const { msg, errors, pending, run } = useSubmit();
  if (allowed.length === 0) return <p className="text-sm text-ink-500">No stage change is open to you from here.</p>;
  const isBack = Boolean(allowed.find((o) => o.stage === to)?.isBack);
  const guarded: GuardedMove | null = to === "on_hold" || to === "cancelled" ? to : isBack ? { back: to } : null;
  const send = () => run(() => moveStage({ orderId, to, note: note || undefined, ...(guarded ? { confirm: to } : {}) }), `Moved to ${stageText(to)}.`);
  const submit = () => {
    if (!guarded) return send();
    if (guarded === "cancelled" && note.trim().length < 3) return setNoteError("Give the reason for cancelling; the client sees it on their timeline.");
    if (isBack && note.trim().length < 3) return setNoteError("Say why the order goes back; the client sees it on their timeline.");
    setNoteError(undefined);
    setConfirming(true);
  };
  return (
    <form className="space-y-3" onSubmit={(e) => (e.preventDefault(), submit())}>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Move to" htmlFor="to">
          <Select id="to" value={to} disabled={confirming} onChange={(e) => (setTo(e.target.value), setNoteError(undefined))}>
            {allowed.map((o) => <option key={o.stage} value={o.stage}>{o.isBack ? `back to ${stageText(o.stage)}` : stageText(o.stage)}</option>)}
          </Select>
        </Field>
        <Field label={guarded === "cancelled" || isBack ? "Reason (the client sees it)" : guarded === "on_hold" ? "Note to the client (optional)" : "Note (optional)"} htmlFor="note" error={noteError ?? errors.note?.[0]}>
          <Input id="note" value={note} disabled={confirming} aria-invalid={Boolean(noteError ?? errors.note)} onChange={(e) => setNote(e.target.value)} />
        </Field>
      </div>
      {confirming && guarded ? (
        <ConfirmMove to={guarded} ctx={context} pending={pending} onBack={() => setConfirming(false)} onConfirm={() => (send(), setConfirming(false))} />
      ) : (
        <>
          <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
          <Button type="submit" variant={guarded === "cancelled" ? "danger" : "primary"} disabled={pending}>
            {guarded === "cancelled" ? "Cancel order…" : guarded === "on_hold" ? "Put on hold…" : isBack ? "Move back…" : `Move to ${stageText(to)}`}
          </Button>
        </>
      )}
    </form>
  );
}

export interface ActualsInitial {
  actualPrintHours: number | null;
  actualMaterialKg: number | null;
  actualMachiningHours: number | null;
  inspectionResult: string | null;
  inspectionNotes: string | null;
  carrier: string | null;
  trackingNumber: string | null;
}

export function ActualsForm({ orderId, initial, reports }: { orderId: string; initial: ActualsInitial; reports: FiledReport[] }) {
  const s = (v: number | string | null) => (v === null ? "" : String(v));
  const [v, setV] = useState({
    actualPrintHours: s(initial.actualPrintHours),
    actualMaterialKg: s(initial.actualMaterialKg),
    actualMachiningHours: s(initial.actualMachiningHours),
    inspectionResult: s(initial.inspectionResult),
    inspectionNotes: s(initial.inspectionNotes),
    carrier: s(initial.carrier),
    trackingNumber: s(initial.trackingNumber),
  });
  const { msg, errors, pending, run } = useSubmit();
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((x) => ({ ...x, [k]: e.target.value }));
  return (
    <form className="space-y-3" onSubmit={(e) => (e.preventDefault(), run(() => recordActuals({ orderId, ...v }), "Actuals saved."))}>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Print hours" htmlFor="aph" error={errors.actualPrintHours?.[0]}><Input id="aph" inputMode="decimal" value={v.actualPrintHours} onChange={set("actualPrintHours")} /></Field>
        <Field label="Material used (kg)" htmlFor="akg" error={errors.actualMaterialKg?.[0]}><Input id="akg" inputMode="decimal" value={v.actualMaterialKg} onChange={set("actualMaterialKg")} /></Field>
        <Field label="Machining hours" htmlFor="amh" error={errors.actualMachiningHours?.[0]}><Input id="amh" inputMode="decimal" value={v.actualMachiningHours} onChange={set("actualMachiningHours")} /></Field>
      </div>
      <div className="grid gap-3 sm:grid-cols-[12rem_1fr]">
        <Field label="Inspection result" htmlFor="insp">
          <Select id="insp" value={v.inspectionResult} onChange={set("inspectionResult")}>
            <option value="">not inspected</option>
            <option value="pass">pass</option>
            <option value="conditional">conditional</option>
            <option value="fail">fail</option>
          </Select>
        </Field>
        <Field label="Inspection notes" htmlFor="inotes"><Textarea id="inotes" className="min-h-10" value={v.inspectionNotes} onChange={set("inspectionNotes")} /></Field>
      </div>
      <ReportUpload orderId={orderId} reports={reports} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Carrier" htmlFor="carrier"><Input id="carrier" value={v.carrier} onChange={set("carrier")} /></Field>
        <Field label="Tracking number" htmlFor="tracking"><Input id="tracking" value={v.trackingNumber} onChange={set("trackingNumber")} /></Field>
      </div>
      <FormMessage tone={msg?.tone}>{msg?.text}</FormMessage>
      <Button type="submit" variant="secondary" disabled={pending}>Save actuals</Button>
    </form>
  );
}
