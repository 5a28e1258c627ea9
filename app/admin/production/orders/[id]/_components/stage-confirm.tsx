"use client";

import { useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { formatCents } from "@/lib/money";
import { stageText } from "@/components/admin/format";

/** What a hold or a cancel does beyond the stage, for the "are you sure" step. */
export interface MoveContext {
  /** Where the order is now (a held order returns here). */
  from: string;
  /** Received on the order so far (paid and partly refunded payments, before refunds), in cents. */
  paidCents: number;
  currency: string;
  /** The cell whose time is booked for the order, when it has blocks. */
  bookedCell: string | null;
}

/** A move the form confirms first: a hold, a cancel, or a step back along the flow to `target`. */
export type GuardedMove = "on_hold" | "cancelled" | { back: string };

/** The consequences of the move, in the order staff weigh them. */
export function moveConsequences(to: GuardedMove, ctx: MoveContext): { title: string; lines: string[]; confirm: string } {
  const paid = ctx.paidCents > 0 ? formatCents(ctx.paidCents, ctx.currency) : null;
  if (typeof to === "object") {
    return {
      title: `Move this order back to ${stageText(to.back)}?`,
      confirm: `Yes, back to ${stageText(to.back)}`,
      lines: [
        `The client sees the order go back from ${stageText(ctx.from)} to ${stageText(to.back)} on their timeline, with your note.`,
        "Payments and booked cell time stay as they are.",
      ],
    };
  }
  if (to === "on_hold") {
    return {
      title: "Put this order on hold?",
      confirm: "Yes, put it on hold",
      lines: [
        "The client sees “On hold” on their order's timeline, with your note. No e-mail is sent; sales can message them from the request.",
        paid ? `Payments stay as they are: the ${paid} received is kept, nothing is refunded or charged.` : "Payments stay as they are: nothing is refunded or charged.",
        ctx.bookedCell ? `Its time on ${ctx.bookedCell} stays booked while it is held; no other job can take it.` : "It has no cell time booked.",
        `Releasing the hold sends it back to ${stageText(ctx.from)}.`,
      ],
    };
  }
  return {
    title: "Cancel this order?",
    confirm: "Yes, cancel the order",
    lines: [
      "The client sees “Cancelled” and your reason on their order's timeline. No e-mail is sent; sales can message them from the request.",
      paid ? `The ${paid} received is not refunded automatically: accounts refunds what is due from the ledger.` : "Nothing has been paid on this order.",
      ctx.bookedCell ? `Its booked time on ${ctx.bookedCell} is released for other jobs.` : "It has no cell time booked.",
      "A cancelled order can not be reopened.",
    ],
  };
}

/** The inline "are you sure" panel: consequences, then confirm or go back. */
export function ConfirmMove({ to, ctx, pending, onConfirm, onBack }: { to: GuardedMove; ctx: MoveContext; pending: boolean; onConfirm: () => void; onBack: () => void }) {
  const c = moveConsequences(to, ctx);
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);
  return (
    <div role="alertdialog" aria-labelledby="confirm-move-title" aria-describedby="confirm-move-lines" className={to === "cancelled" ? "rounded border-l-4 border-red-300 bg-red-50 px-4 py-3 text-sm text-red-900" : "rounded border-l-4 border-amber-300 bg-amber-50 px-4 py-3 text-sm text-amber-900"}>
      <h3 id="confirm-move-title" ref={heading} tabIndex={-1} className="font-semibold outline-none">
        {c.title}
      </h3>
      <ul id="confirm-move-lines" className="mt-2 list-disc space-y-1 pl-5">
        {c.lines.map((l) => <li key={l}>{l}</li>)}
      </ul>
      <div className="mt-3 flex flex-wrap gap-2">
        <Button type="button" variant={to === "cancelled" ? "danger" : "primary"} disabled={pending} onClick={onConfirm}>
          {pending ? "Saving…" : c.confirm}
        </Button>
        <Button type="button" variant="secondary" disabled={pending} onClick={onBack}>
          Go back
        </Button>
      </div>
    </div>
  );
}
