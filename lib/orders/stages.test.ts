import { describe, expect, it } from "vitest";
import { STAGES, type Stage } from "../../db/schema/common";
import { checkTransition, FLOW, roleMayMove } from "./stages";

/**
 * The allowed moves, written out from DESIGN.md ("The order's life") independently of the
 * machine: each stage to the next; a re-quote on a new revision (quoted → quoted, accepted →
 * quoted); a failed inspection back to machining; hold from any working stage, cancel before
 * printing starts.
 */
const FORWARD: [Stage, Stage][] = [
  ["draft", "submitted"], ["submitted", "quoted"], ["quoted", "accepted"], ["accepted", "deposit_paid"],
  ["deposit_paid", "scheduled"], ["scheduled", "printing"], ["printing", "cooling"], ["cooling", "machining"],
  ["machining", "inspection"], ["inspection", "finishing"], ["finishing", "packed"], ["packed", "shipped"],
  ["shipped", "delivered"], ["delivered", "closed"],
  ["quoted", "quoted"], ["accepted", "quoted"], ["inspection", "machining"],
];
const HOLDABLE: Stage[] = ["submitted", "quoted", "accepted", "deposit_paid", "scheduled", "printing", "cooling", "machining", "inspection", "finishing", "packed"];
const CANCELLABLE: Stage[] = ["draft", "submitted", "quoted", "accepted", "deposit_paid", "scheduled", "on_hold"];

function expected(from: Stage, to: Stage, heldFrom: Stage | null): boolean {
  if (from === "closed" || from === "cancelled") return false;
  if (to === "cancelled") return CANCELLABLE.includes(from);
  if (to === "on_hold") return HOLDABLE.includes(from);
  if (from === "on_hold") return to === heldFrom;
  return FORWARD.some(([a, b]) => a === from && b === to);
}

describe("checkTransition: every pair of stages", () => {
  const pairs = STAGES.flatMap((from) => STAGES.map((to) => [from, to] as const));
  it.each(pairs)("%s → %s", (from, to) => {
    const heldFrom: Stage | null = from === "on_hold" ? "machining" : null;
    const r = checkTransition(from, to, heldFrom);
    expect(r.ok).toBe(expected(from, to, heldFrom));
    if (!r.ok) expect(r.reason).toMatch(/\w/);
  });
});

describe("checkTransition: reasons and holds", () => {
  it("refuses skipping printing and says where the order goes", () => {
    const r = checkTransition("scheduled", "machining");
    expect(r).toEqual({ ok: false, reason: "From “Scheduled” the order goes to “Printing”, not “Machining”." });
  });
  it("returns a held order only to where it was", () => {
    for (const stage of HOLDABLE) {
      expect(checkTransition("on_hold", stage, stage).ok).toBe(true);
      const other = HOLDABLE.find((s) => s !== stage)!;
      expect(checkTransition("on_hold", other, stage).ok).toBe(false);
    }
    expect(checkTransition("on_hold", "printing", null).reason).toMatch(/unknown/);
  });
  it("the forward flow is DESIGN.md's order", () => {
    expect(FLOW.join(" → ")).toBe(
      "draft → submitted → quoted → accepted → deposit_paid → scheduled → printing → cooling → machining → inspection → finishing → packed → shipped → delivered → closed",
    );
  });
});

describe("roleMayMove", () => {
  it("production moves the shop-floor stages, not sales stages", () => {
    expect(roleMayMove("production", "scheduled", "printing")).toBe(true);
    expect(roleMayMove("production", "packed", "shipped")).toBe(true);
    expect(roleMayMove("production", "submitted", "quoted")).toBe(false);
    expect(roleMayMove("production", "accepted", "deposit_paid")).toBe(false);
  });
  it("sales moves the quoting stages only", () => {
    expect(roleMayMove("sales", "submitted", "quoted")).toBe(true);
    expect(roleMayMove("sales", "printing", "cooling")).toBe(false);
  });
  it("accounts and clients move nothing by hand; admin may", () => {
    for (const role of ["accounts", "client", "client_admin"] as const) {
      expect(roleMayMove(role, "scheduled", "printing")).toBe(false);
      expect(roleMayMove(role, "printing", "on_hold")).toBe(false);
    }
    expect(roleMayMove("admin", "scheduled", "printing")).toBe(true);
  });
  it("hold and cancel: sales and production", () => {
    expect(roleMayMove("sales", "printing", "on_hold")).toBe(true);
    expect(roleMayMove("production", "on_hold", "printing")).toBe(true);
  });
});
