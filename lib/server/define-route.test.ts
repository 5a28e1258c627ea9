import { describe, expect, it, vi } from "vitest";
import { z } from "zod";

vi.mock("@/db/client", () => ({ getDb: () => ({}) }));
vi.mock("@/lib/observability/request-id", () => ({ requestLog: async () => ({ error: () => {} }) }));
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
