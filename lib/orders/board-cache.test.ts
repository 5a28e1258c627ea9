import { describe, expect, it } from "vitest";
import { VersionedCache } from "./board-cache";

describe("VersionedCache", () => {
  it("answers only for the version the value was built at", () => {
    const c = new VersionedCache<string>();
    c.set("all", 7, "board@7");
    expect(c.get("all", 7)).toBe("board@7");
    expect(c.get("all", 8)).toBeUndefined();
    expect(c.get("shipped:20", 7)).toBeUndefined();
  });

  it("keeps at most maxEntries keys, the oldest going first", () => {
    const c = new VersionedCache<number>(2);
    c.set("a", 1, 1);
    c.set("b", 1, 2);
    c.set("c", 1, 3);
    expect(c.get("a", 1)).toBeUndefined();
    expect(c.get("b", 1)).toBe(2);
    expect(c.get("c", 1)).toBe(3);
  });
});
