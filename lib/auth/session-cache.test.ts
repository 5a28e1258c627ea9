import { describe, expect, it } from "vitest";
import { SessionCache, sessionTokenFrom } from "./session-cache";

describe("SessionCache", () => {
  it("remembers a verified token for ttl, then forgets it", () => {
    const cache = new SessionCache({ ttlMs: 30_000, maxEntries: 10 });
    cache.set("t1", "user-1", 1_000);
    expect(cache.get("t1", 1_000)).toBe("user-1");
    expect(cache.get("t1", 30_999)).toBe("user-1");
    expect(cache.get("t1", 31_000)).toBeUndefined();
    expect(cache.size).toBe(0);
  });

  it("keeps a 'no session' answer apart from an unknown token", () => {
    const cache = new SessionCache({ ttlMs: 10, maxEntries: 10 });
    cache.set("forged", null, 0);
    expect(cache.get("forged", 5)).toBeNull();
    expect(cache.get("other", 5)).toBeUndefined();
  });

  it("never holds more than maxEntries, dropping the oldest", () => {
    const cache = new SessionCache({ ttlMs: 1_000, maxEntries: 3 });
    for (let i = 0; i < 10; i++) cache.set(`t${i}`, `u${i}`, i);
    expect(cache.size).toBe(3);
    expect(cache.get("t0", 10)).toBeUndefined();
    expect(cache.get("t9", 10)).toBe("u9");
    expect(cache.get("t7", 10)).toBe("u7");
  });

  it("drops stale entries first when full", () => {
    const cache = new SessionCache({ ttlMs: 100, maxEntries: 2 });
    cache.set("a", "u", 0);
    cache.set("b", "u", 50);
    cache.set("c", "u", 120); // a is stale at 120 and goes; b stays
    expect(cache.get("b", 120)).toBe("u");
    expect(cache.get("c", 120)).toBe("u");
  });
});

describe("sessionTokenFrom", () => {
  it("joins chunked session cookies in order and ignores the rest", () => {
    const token = sessionTokenFrom([
      { name: "authjs.csrf-token", value: "x" },
      { name: "authjs.session-token.1", value: "B" },
      { name: "authjs.session-token.0", value: "A" },
      { name: "authjs.session-token.10", value: "K" },
      { name: "authjs.session-token.2", value: "C" },
    ]);
    expect(token).toBe("authjs.session-token.0=A;authjs.session-token.1=B;authjs.session-token.2=C;authjs.session-token.10=K");
  });

  it("returns null without a session cookie", () => {
    expect(sessionTokenFrom([{ name: "authjs.callback-url", value: "/" }])).toBeNull();
    expect(sessionTokenFrom([{ name: "authjs.session-token", value: "" }])).toBeNull();
  });

  it("reads the __Secure- name too", () => {
    expect(sessionTokenFrom([{ name: "__Secure-authjs.session-token", value: "S" }])).toBe("__Secure-authjs.session-token=S");
  });
});
