import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Db } from "../../db/client";
import { orders, payments, requests } from "../../db/schema";
import { ROLES, type Role } from "../../db/schema/common";
import { hasPermission, type Permission } from "../../lib/auth/policy";
import { createTestDb, type TestDb } from "../helpers/test-db";
import { interruptOf, USER_BY_ROLE, userIdOf } from "./admin-setup";
import { dbRef, session } from "../support/integration";

process.env.__NEXT_EXPERIMENTAL_AUTH_INTERRUPTS = "1";
vi.mock("@/lib/auth/config", async () => (await import("../support/integration")).authConfigMock);
vi.mock("@/lib/auth/session", async () => (await import("../support/integration")).sessionMock);
vi.mock("@/db/client", async (importOriginal) => (await import("../support/integration")).dbClientMock(importOriginal));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
vi.mock("@/lib/email/notify", () => ({
  notifyQuoteReady: vi.fn(async () => undefined),
  notifyScheduled: vi.fn(async () => undefined),
  notifyShipped: vi.fn(async () => undefined),
  notifyBalanceDue: vi.fn(async () => undefined),
  notifyStaffMessage: vi.fn(async () => undefined),
  notifyRefund: vi.fn(async () => undefined),
}));
vi.mock("@/lib/email/send", () => ({ sendEmail: vi.fn(async () => ({ id: "test" })) }));

let t: TestDb;
let db: Db;
const ids = { request: "", order: "", payment: "" };
const userIds = {} as Record<Role, string>;

beforeAll(async () => {
  t = await createTestDb({ seeded: true, now: new Date("2026-12-01T12:00:00Z") });
  db = t.db;
  dbRef.db = db;
  for (const role of ROLES) userIds[role] = await userIdOf(db, USER_BY_ROLE[role]);
  const [r] = await db.select({ id: requests.id }).from(requests).where(eq(requests.stage, "submitted"));
  const [o] = await db.select({ id: orders.id }).from(orders).innerJoin(requests, eq(requests.id, orders.requestId)).where(inArray(requests.stage, ["deposit_paid"]));
  const [p] = await db.select({ id: payments.id }).from(payments).where(eq(payments.status, "paid"));
  Object.assign(ids, { request: r!.id, order: o!.id, payment: p!.id });
}, 120_000);
afterAll(() => t?.close());

const as = (role: Role | null) => (session.current = role ? { user: { id: userIds[role] } } : null);

type PageModule = { default: (props: { params: Promise<{ id: string }> }) => Promise<unknown> };
const PAGES: { path: string; permission: Permission; load: () => Promise<PageModule>; params?: () => { id: string } }[] = [
  { path: "/admin/sales", permission: "sales:inbox", load: () => import("@/app/admin/sales/page") },
  { path: "/admin/sales/quotes", permission: "quote:manage", load: () => import("@/app/admin/sales/quotes/page") },
  { path: "/admin/sales/requests/[id]", permission: "sales:inbox", load: () => import("@/app/admin/sales/requests/[id]/page"), params: () => ({ id: ids.request }) },
  { path: "/admin/production", permission: "production:board", load: () => import("@/app/admin/production/page") },
  { path: "/admin/production/report", permission: "production:board", load: () => import("@/app/admin/production/report/page") },
  { path: "/admin/production/orders/[id]", permission: "production:board", load: () => import("@/app/admin/production/orders/[id]/page"), params: () => ({ id: ids.order }) },
  { path: "/admin/accounts", permission: "accounts:ledger", load: () => import("@/app/admin/accounts/page") },
  { path: "/admin/accounts/reconciliation", permission: "accounts:ledger", load: () => import("@/app/admin/accounts/reconciliation/page") },
  { path: "/admin/accounts/payments/[id]", permission: "accounts:ledger", load: () => import("@/app/admin/accounts/payments/[id]/page"), params: () => ({ id: ids.payment }) },
  { path: "/admin/accounts/terms", permission: "accounts:terms", load: () => import("@/app/admin/accounts/terms/page") },
  { path: "/admin/accounts/transfers", permission: "accounts:ledger", load: () => import("@/app/admin/accounts/transfers/page") },
  { path: "/admin/catalogue", permission: "admin:catalogue", load: () => import("@/app/admin/catalogue/page") },
  { path: "/admin/staff", permission: "admin:staff", load: () => import("@/app/admin/staff/page") },
  { path: "/admin/audit", permission: "admin:audit", load: () => import("@/app/admin/audit/page") },
];

type RouteModule = { GET: (req: Request) => Promise<Response> };
const today = new Date().toISOString().slice(0, 10);
const ROUTES: { path: string; permission: Permission; load: () => Promise<RouteModule>; query?: string }[] = [
  { path: "/api/admin/inbox", permission: "sales:inbox", load: () => import("@/app/api/admin/inbox/route") },
  { path: "/api/admin/quotes", permission: "quote:manage", load: () => import("@/app/api/admin/quotes/route") },
  { path: "/api/admin/board", permission: "production:board", load: () => import("@/app/api/admin/board/route") },
  { path: "/api/admin/calendar", permission: "production:board", load: () => import("@/app/api/admin/calendar/route"), query: "cell=long-bed" },
  { path: "/api/admin/reports/actuals", permission: "production:board", load: () => import("@/app/api/admin/reports/actuals/route") },
  { path: "/api/admin/ledger", permission: "accounts:ledger", load: () => import("@/app/api/admin/ledger/route") },
  { path: "/api/admin/ledger/export", permission: "accounts:ledger", load: () => import("@/app/api/admin/ledger/export/route"), query: `from=2026-01-01&to=${today}` },
  { path: "/api/admin/staff", permission: "admin:staff", load: () => import("@/app/api/admin/staff/route") },
  { path: "/api/admin/audit", permission: "admin:audit", load: () => import("@/app/api/admin/audit/route") },
  { path: "/api/admin/catalogue", permission: "admin:catalogue", load: () => import("@/app/api/admin/catalogue/route") },
];

const ROLES_AND_ANON: (Role | null)[] = [...ROLES, null];

describe("every /admin page × every role", () => {
  for (const page of PAGES) {
    for (const role of ROLES_AND_ANON) {
      const allowed = role !== null && hasPermission({ role }, page.permission);
      it(`${page.path} as ${role ?? "signed out"} → ${allowed ? "opens" : role ? "403" : "sign-in"}`, async () => {
        as(role);
        const mod = await page.load();
        let outcome: string = "opened";
        try {
          await mod.default({ params: Promise.resolve(page.params?.() ?? { id: "" }) });
        } catch (e) {
          outcome = interruptOf(e) ?? `threw ${(e as Error).message}`;
        }
        expect(outcome).toBe(allowed ? "opened" : role ? "forbidden" : "redirect");
      });
    }
  }
});

describe("every /api/admin route × every role", () => {
  for (const route of ROUTES) {
    for (const role of ROLES_AND_ANON) {
      const allowed = role !== null && hasPermission({ role }, route.permission);
      it(`GET ${route.path} as ${role ?? "signed out"} → ${allowed ? 200 : role ? 403 : 401}`, async () => {
        as(role);
        const { GET } = await route.load();
        const res = await GET(new Request(`http://test.local${route.path}${route.query ? `?${route.query}` : ""}`));
        expect(res.status).toBe(allowed ? 200 : role ? 403 : 401);
      });
    }
  }
  it("reconciliation refuses roles without the ledger before it calls the processor", async () => {
    const { GET } = await import("@/app/api/admin/reconciliation/route");
    for (const role of ROLES.filter((r) => !hasPermission({ role: r }, "accounts:ledger"))) {
      as(role);
      expect((await GET(new Request(`http://test.local/api/admin/reconciliation?from=2026-01-01&to=${today}`))).status).toBe(403);
    }
  });
});

describe("every back-office action refuses roles without its permission", () => {
  const ACTIONS: { name: string; permission: Permission; call: () => Promise<{ ok: boolean; code?: string }> }[] = [
    { name: "saveQuote", permission: "quote:manage", call: async () => (await import("@/app/admin/sales/actions")).saveQuote({ requestId: ids.request, lines: [{ partId: null, kind: "other", description: "x", quantity: 1, unitCents: 1, amountCents: 1, estimatedCents: null, editReason: "test" }], marginBp: 0, taxBp: 0, depositBp: 5000, validityDays: 30 }) },
    { name: "postStaffMessage", permission: "quote:manage", call: async () => (await import("@/app/admin/sales/actions")).postStaffMessage({ requestId: ids.request, body: "hello" }) },
    { name: "scheduleOrder", permission: "production:schedule", call: async () => (await import("@/app/admin/production/actions")).scheduleOrder({ orderId: ids.order, cellKey: "long-bed", start: "2030-01-07T06:00" }) },
    { name: "moveBookedJob", permission: "production:schedule", call: async () => (await import("@/app/admin/production/orders/[id]/actions")).moveBookedJob({ orderId: ids.order, start: "2031-01-07T06:00", reason: "permission test" }) },
    { name: "recordBlockEnd", permission: "production:schedule", call: async () => (await import("@/app/admin/production/orders/[id]/actions")).recordBlockEnd({ orderId: ids.order, kind: "print", endsAt: "2031-01-07T06:00", reason: "permission test" }) },
    { name: "blockResource", permission: "production:capacity", call: async () => (await import("@/app/admin/production/capacity/actions")).blockResource({ resourceKey: "router", start: "2031-01-07T06:00", end: "2031-01-07T10:00", reason: "permission test" }) },
    { name: "removeBlock", permission: "production:capacity", call: async () => (await import("@/app/admin/production/capacity/actions")).removeBlock({ id: "no-such-block" }) },
    { name: "moveStage", permission: "production:record", call: async () => (await import("@/app/admin/production/actions")).moveStage({ orderId: ids.order, to: "on_hold", confirm: "on_hold" }) },
    { name: "recordActuals", permission: "production:record", call: async () => (await import("@/app/admin/production/actions")).recordActuals({ orderId: ids.order, actualPrintHours: 1 }) },
    { name: "fileInspectionReport", permission: "production:record", call: async () => (await import("@/app/admin/production/actions")).fileInspectionReport({ orderId: ids.order, uploadId: "no-such-upload" }) },
    { name: "refundPayment", permission: "accounts:refund", call: async () => (await import("@/app/admin/accounts/actions")).refundPayment({ paymentId: ids.payment, amountCents: 100, reason: "permission test", idempotencyKey: "perm-test-key-1", confirmAmountCents: 100 }) },
    { name: "setTerms", permission: "accounts:terms", call: async () => (await import("@/app/admin/accounts/terms/actions")).setTerms({ orgId: "no-such-firm", paymentTerms: "net30", creditLimitCents: 100 }) },
    { name: "reviewTaxExemption", permission: "accounts:terms", call: async () => (await import("@/app/admin/accounts/terms/actions")).reviewTaxExemption({ id: "no-such-certificate", decision: "approved" }) },
    { name: "recordManualPayment", permission: "accounts:refund", call: async () => (await import("@/app/admin/accounts/transfers/actions")).recordManualPayment({ paymentId: ids.payment, amountCents: 100, reference: "CHQ-PERM" }) },
    { name: "resolveTransfer", permission: "accounts:refund", call: async () => (await import("@/app/admin/accounts/transfers/actions")).resolveTransfer({ fundsId: "no-such-transfer", note: "permission test" }) },
    { name: "saveRateCard", permission: "admin:catalogue", call: async () => (await import("@/app/admin/catalogue/actions")).saveRateCard({ ...(await import("@/lib/estimating/defaults")).defaultRateCard }) },
    { name: "saveMaterial", permission: "admin:catalogue", call: async () => (await import("@/app/admin/catalogue/actions")).saveMaterial({ ...(await import("@/lib/estimating/defaults")).defaultMaterials[0]! }) },
    { name: "saveCell", permission: "admin:catalogue", call: async () => { const { cellFormValues } = await import("@/lib/validation/admin-catalogue"); return (await import("@/app/admin/catalogue/actions")).saveCell(cellFormValues((await import("@/lib/estimating/defaults")).defaultCells[0]!)); } },
    { name: "inviteStaff", permission: "admin:staff", call: async () => (await import("@/app/admin/staff/actions")).inviteStaff({ email: "new.planner@ostrevane.example", role: "production" }) },
    { name: "updateStaff", permission: "admin:staff", call: async () => (await import("@/app/admin/staff/actions")).updateStaff({ userId: userIds.sales, isControlledCleared: true }) },
  ];
  for (const a of ACTIONS) {
    for (const role of ROLES_AND_ANON.filter((r) => r === null || !hasPermission({ role: r }, a.permission))) {
      it(`${a.name} as ${role ?? "signed out"} is refused`, async () => {
        as(role);
        const r = await a.call();
        expect(r.ok).toBe(false);
        expect(r.code).toBe(role ? "forbidden" : "unauthenticated");
      });
    }
    it(`${a.name} is not refused for admin`, async () => {
      as("admin");
      const r = await a.call();
      expect(r.code).not.toBe("forbidden");
    });
  }
});
