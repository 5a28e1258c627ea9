import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import type * as RequestId from "@/lib/observability/request-id";

vi.mock("@/db/client", () => ({ getDb: () => ({}) }));
const logged: { requestId: string | null }[] = [];
vi.mock("@/lib/observability/request-id", async (importOriginal) => {
  const real = await importOriginal<typeof RequestId>();
  // The log line's request id, as the real requestLog would bind it.
  return { ...real, requestLog: async () => ({ error: async () => logged.push({ requestId: await real.currentRequestId() }) }) };
});
vi.mock("./access", () => ({ enter: async () => null }));

const { defineRoute } = await import("./define-route");

const answer = z.object({ rows: z.array(z.object({ id: z.string(), at: z.string() })), total: z.number().int() });

describe("a route's contract", () => {
  it("sends data that matches it, Dates going out as ISO strings", async () => {
    const GET = defineRoute({ access: "public", response: answer }, async () => ({ rows: [{ id: "a", at: new Date("2026-12-03T08:00:00Z") }], total: 1 }));
    const res = await GET(new Request("http://x/api"));
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ rows: [{ id: "a", at: "2026-12-03T08:00:00.000Z" }], total: 1 });
  });

  it("answers 500, naming nothing to the caller, when the data drifts from it (checked outside production)", async () => {
    // A field renamed in a query but not in the contract: the screen would read undefined.
    const GET = defineRoute({ access: "public", response: answer }, async () => ({ rows: [{ id: "a", when: "2026-12-03" }], total: 1 }) as never);
    const res = await GET(new Request("http://x/api"));
    expect(res.status).toBe(500);
    expect(await res.json()).toEqual({ error: { code: "internal", message: "Something went wrong on our side." } });
  });
});

describe("a route's request id (x-request-id)", () => {
  it("keeps the caller's id when it is a plain token and returns it on the answer", async () => {
    const GET = defineRoute({ access: "public" }, async () => ({ ok: true }));
    const res = await GET(new Request("http://x/api", { headers: { "x-request-id": "front-proxy.4f2a:17" } }));
    expect(res.headers.get("x-request-id")).toBe("front-proxy.4f2a:17");
  });

  it("gives a new id when the caller sent none or one that is not a plain token", async () => {
    const GET = defineRoute({ access: "public" }, async () => ({ ok: true }));
    for (const sent of [undefined, "short", "has spaces in it", "<script>alert(1)</script>", "x".repeat(81)]) {
      const res = await GET(new Request("http://x/api", { headers: sent === undefined ? {} : { "x-request-id": sent } }));
      const id = res.headers.get("x-request-id");
      expect(id).toMatch(/^[0-9a-f-]{36}$/);
      expect(id).not.toBe(sent);
    }
  });

  it("is on refusals, on a handler's own Response, and on the log line of a failure", async () => {
    const refused = defineRoute({ access: "public", query: z.object({ n: z.coerce.number() }) }, async () => ({ ok: true }));
    const bad = await refused(new Request("http://x/api?n=x", { headers: { "x-request-id": "req-refused-0001" } }));
    expect(bad.status).toBe(400);
    expect(bad.headers.get("x-request-id")).toBe("req-refused-0001");

    const own = defineRoute({ access: "public" }, async () => Response.redirect("http://x/elsewhere", 303));
    const moved = await own(new Request("http://x/api", { headers: { "x-request-id": "req-redirect-0001" } }));
    expect(moved.status).toBe(303);
    expect(moved.headers.get("x-request-id")).toBe("req-redirect-0001");

    const failing = defineRoute({ access: "public" }, async () => {
      throw new Error("disk on fire");
    });
    logged.length = 0;
    const failed = await failing(new Request("http://x/api", { headers: { "x-request-id": "req-failed-00001" } }));
    expect(failed.status).toBe(500);
    expect(failed.headers.get("x-request-id")).toBe("req-failed-00001");
    await vi.waitFor(() => expect(logged).toEqual([{ requestId: "req-failed-00001" }]));
  });
});
