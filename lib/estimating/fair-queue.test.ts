import { describe, expect, it } from "vitest";
import { FairQueue } from "./fair-queue";

describe("FairQueue", () => {
  it("serves lanes in turn: one firm's twenty do not hold another's one", () => {
    const q = new FairQueue<string>();
    for (let i = 1; i <= 20; i++) q.push("flood", `f${i}`);
    q.push("small", "s1");
    expect(q.length).toBe(21);
    expect(q.order().slice(0, 3)).toEqual(["f1", "s1", "f2"]);
    expect(q.shift()).toBe("f1");
    expect(q.shift()).toBe("s1");
    expect(q.shift()).toBe("f2");
    expect(q.countIn("flood")).toBe(18);
    expect(q.countIn("small")).toBe(0);
  });

  it("keeps first come, first served within a lane and across three lanes in turn", () => {
    const q = new FairQueue<string>();
    q.push("a", "a1");
    q.push("a", "a2");
    q.push("b", "b1");
    q.push("c", "c1");
    q.push("c", "c2");
    q.push("a", "a3");
    const order = q.order();
    expect(order).toEqual(["a1", "b1", "c1", "a2", "c2", "a3"]);
    expect(q.drain()).toEqual(order);
    expect(q.length).toBe(0);
    expect(q.shift()).toBeUndefined();
  });

  it("a lane that empties and comes back joins at the end of the turn", () => {
    const q = new FairQueue<string>();
    q.push("a", "a1");
    q.push("b", "b1");
    expect(q.shift()).toBe("a1");
    q.push("a", "a2");
    expect(q.order()).toEqual(["b1", "a2"]);
  });
});
