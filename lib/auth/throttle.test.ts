import { describe, expect, it } from "vitest";
import { afterFailure, EMAIL_RULE, isLocked, type ThrottleState } from "./throttle";

const t0 = new Date("2026-12-01T10:00:00Z");
const at = (minutes: number) => new Date(t0.getTime() + minutes * 60_000);

describe("sign-in throttling", () => {
  it("locks an e-mail after five failures inside the window, for fifteen minutes", () => {
    let state: ThrottleState | null = null;
    for (let i = 0; i < 4; i++) state = afterFailure(state, at(i), EMAIL_RULE);
    expect(isLocked(state, at(4))).toBe(false);
    state = afterFailure(state, at(4), EMAIL_RULE);
    expect(state.failures).toBe(5);
    expect(isLocked(state, at(5))).toBe(true);
    expect(isLocked(state, at(4 + 15.01))).toBe(false);
  });
  it("starts a new window when the old one has passed", () => {
    let state: ThrottleState | null = null;
    for (let i = 0; i < 4; i++) state = afterFailure(state, at(i), EMAIL_RULE);
    state = afterFailure(state, at(40), EMAIL_RULE);
    expect(state.failures).toBe(1);
    expect(isLocked(state, at(40))).toBe(false);
  });
});
