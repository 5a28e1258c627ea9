import { STAGES, type Role, type Stage } from "../../db/schema/common";
import { STAGE_LABEL } from "../labels";

/**
 * The order's life (DESIGN.md) as a pure state machine. `next` lists the forward moves; on_hold
 * and cancelled are reachable where they make sense, and a held order returns to where it was.
 */
export const FLOW: readonly Stage[] = STAGES.filter((s) => s !== "on_hold" && s !== "cancelled");

const NEXT: Partial<Record<Stage, Stage[]>> = {
  draft: ["submitted"],
  submitted: ["quoted"],
  // A re-quote on a new revision keeps "quoted"; an accepted quote waits for its deposit.
  quoted: ["accepted", "quoted"],
  accepted: ["deposit_paid", "quoted"],
  deposit_paid: ["scheduled"],
  scheduled: ["printing"],
  printing: ["cooling"],
  cooling: ["machining"],
  machining: ["inspection"],
  // A failed inspection goes back to machining for rework.
  inspection: ["finishing", "machining"],
  finishing: ["packed"],
  packed: ["shipped"],
  shipped: ["delivered"],
  delivered: ["closed"],
};

/** Stages from which an order may be put on hold or cancelled. */
const HOLDABLE = new Set<Stage>(["submitted", "quoted", "accepted", "deposit_paid", "scheduled", "printing", "cooling", "machining", "inspection", "finishing", "packed"]);
const CANCELLABLE = new Set<Stage>(["draft", "submitted", "quoted", "accepted", "deposit_paid", "scheduled", "on_hold"]);

export interface TransitionCheck {
  ok: boolean;
  reason?: string;
}

/** Is `from → to` allowed? `heldFrom` is where an on_hold order came from. */
export function checkTransition(from: Stage, to: Stage, heldFrom?: Stage | null): TransitionCheck {
  if (from === "closed" || from === "cancelled") return { ok: false, reason: `The order is ${from}; it can not change stage.` };
  if (to === "cancelled") {
    return CANCELLABLE.has(from)
      ? { ok: true }
      : { ok: false, reason: `An order at ${label(from)} can not be cancelled; put it on hold and talk to the client.` };
  }
  if (to === "on_hold") {
    return HOLDABLE.has(from) ? { ok: true } : { ok: false, reason: `An order at ${label(from)} can not be put on hold.` };
  }
  if (from === "on_hold") {
    if (!heldFrom) return { ok: false, reason: "The stage before the hold is unknown." };
    return to === heldFrom ? { ok: true } : { ok: false, reason: `A held order returns to ${label(heldFrom)} first.` };
  }
  const allowed = NEXT[from] ?? [];
  if (allowed.includes(to)) return { ok: true };
  const expected = allowed.map(label).join(" or ");
  return { ok: false, reason: `From ${label(from)} the order goes to ${expected || "no other stage"}, not ${label(to)}.` };
}

/** Stages staff move by hand, and who may move them. Payment and acceptance moves come from the system. */
export function roleMayMove(role: Role, from: Stage, to: Stage): boolean {
  if (role === "admin") return true;
  if (to === "on_hold" || to === "cancelled" || from === "on_hold") return role === "sales" || role === "production";
  const production = FLOW.indexOf("deposit_paid");
  const i = FLOW.indexOf(from);
  if (role === "production") return i >= production && to !== "deposit_paid";
  if (role === "sales") return from === "submitted" || from === "quoted" || from === "accepted";
  return false;
}

/**
 * A move back along the flow (inspection → machining for rework): the client's timeline shows
 * it, so staff confirm it and say why. Holds, cancels and a held order's return are not "back".
 */
export function isBackwardMove(from: Stage, to: Stage): boolean {
  const a = FLOW.indexOf(from);
  const b = FLOW.indexOf(to);
  return a >= 0 && b >= 0 && b < a;
}

/**
 * The moves a stage form offers, in the order it lists them: forward moves first (the first is
 * the default, so one click never moves an order backwards), then steps back, then hold, then
 * cancel.
 */
export function orderMoves<T extends { stage: Stage }>(from: Stage, moves: readonly T[]): T[] {
  const rank = (to: Stage) => (to === "cancelled" ? 4 : to === "on_hold" ? 3 : isBackwardMove(from, to) ? 2 : to === from ? 1 : 0);
  return [...moves].sort((x, y) => rank(x.stage) - rank(y.stage) || FLOW.indexOf(x.stage) - FLOW.indexOf(y.stage));
}

/** A stage's name quoted inside a sentence (the words of lib/labels.ts). */
export function label(stage: Stage): string {
  return `“${STAGE_LABEL[stage]}”`;
}

/** Where the order stands on the forward flow (for timelines): index, or -1 when held or cancelled. */
export function flowIndex(stage: Stage): number {
  return FLOW.indexOf(stage);
}

/** Stages the client is e-mailed about. */
export const CLIENT_NOTIFIED: ReadonlySet<Stage> = new Set(["quoted", "deposit_paid", "scheduled", "shipped"]);
