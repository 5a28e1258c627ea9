import { describe, expect, it } from "vitest";
import { serverTableUrl } from "./use-server-table";

describe("serverTableUrl", () => {
  it("sends page, the extra parameters, set filters, search and sort, in that order (as the ledger did)", () => {
    const url = serverTableUrl("/api/admin/ledger", {
      page: 3,
      params: { from: "2026-09-01", to: "2026-12-01" },
      filterParams: ["status", "kind"],
      filters: [{ id: "kind", value: "deposit" }, { id: "status", value: "paid" }],
      search: "LW-2026",
      sorting: [{ id: "amountCents", desc: false }],
    });
    expect(url).toBe("/api/admin/ledger?page=3&from=2026-09-01&to=2026-12-01&status=paid&kind=deposit&q=LW-2026&sort=amountCents&dir=asc");
  });

  it("leaves out unset filters, an empty search, filters the route does not take, and sorting when there is none", () => {
    const url = serverTableUrl("/api/admin/quotes", { page: 1, filterParams: ["status"], filters: [{ id: "firmName", value: "x" }], search: "", sorting: [] });
    expect(url).toBe("/api/admin/quotes?page=1");
  });

  it("descending sort reads dir=desc", () => {
    expect(serverTableUrl("/api/admin/quotes", { page: 1, filterParams: ["status"], filters: [{ id: "status", value: "issued" }], search: "", sorting: [{ id: "createdAt", desc: true }] })).toBe(
      "/api/admin/quotes?page=1&status=issued&sort=createdAt&dir=desc",
    );
  });
});
