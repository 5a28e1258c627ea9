import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createClient } from "@libsql/client";
import { DEMO_PASSWORDS, DEMO_USERS } from "@/lib/seed/data";
import { homePathFor } from "../../lib/auth/policy";
import { DESKTOP, launchBrowser, newPage, PHONE, shot, signIn, startStack, type TestStack } from "./harness";

let stack: TestStack;
let browser: Browser;

beforeAll(async () => {
  stack = await startStack();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

describe("smoke: every role lands on its own home", () => {
  it("the landing page shows the cells and materials, at desktop and phone width", async () => {
    for (const [label, viewport] of [["desktop", DESKTOP], ["phone", PHONE]] as const) {
      const { context, page } = await newPage(browser, viewport);
      await page.goto(stack.baseUrl);
      await expect(page.getByRole("heading", { name: /Layup molds, master plugs and fixtures/ }).isVisible()).resolves.toBe(true);
      await expect(page.getByText("Long Bed").isVisible()).resolves.toBe(true);
      await shot(page, `landing-${label}`);
      await page.goto(`${stack.baseUrl}/sign-in`);
      await shot(page, `sign-in-${label}`);
      await context.close();
    }
  });

  for (const user of DEMO_USERS.filter((u, i, all) => all.findIndex((x) => x.role === u.role) === i)) {
    it(`${user.role} signs in and lands on ${homePathFor(user.role)}`, async () => {
      const { context, page } = await newPage(browser);
      await signIn(page, stack.baseUrl, user.email, DEMO_PASSWORDS[user.role]);
      expect(new URL(page.url()).pathname).toBe(homePathFor(user.role));
      await shot(page, `home-${user.role}-desktop`);
      await page.setViewportSize(PHONE);
      await shot(page, `home-${user.role}-phone`);
      await context.close();
    });
  }

  // Every area's index page, at both widths: the pictures' axe check and the phone's sideways check
  // (`shot` in tests/e2e/harness.ts) cover the pages no other journey opens.
  const AREAS: { email: string; role: keyof typeof DEMO_PASSWORDS; paths: string[] }[] = [
    { email: "admin@ostrevane.example", role: "admin", paths: ["/admin/sales", "/admin/production", "/admin/accounts", "/admin/accounts/terms", "/admin/accounts/transfers", "/admin/catalogue", "/admin/firms", "/admin/staff", "/admin/audit", "/admin/outbox"] },
    { email: "lead@caldrith.example", role: "client_admin", paths: ["/portal/payments", "/portal/firm", "/portal/requests/new"] },
  ];
  for (const area of AREAS) {
    it(`${area.role}'s pages pass the accessibility and phone-width checks: ${area.paths.join(", ")}`, async () => {
      const { context, page } = await newPage(browser);
      await signIn(page, stack.baseUrl, area.email, DEMO_PASSWORDS[area.role]);
      for (const p of area.paths) {
        const name = p.slice(1).replaceAll("/", "-");
        await page.setViewportSize(DESKTOP);
        await page.goto(`${stack.baseUrl}${p}`);
        await page.waitForLoadState("load");
        await shot(page, `${name}-desktop`);
        await page.setViewportSize(PHONE);
        await shot(page, `${name}-phone`);
      }
      await context.close();
    }, 180_000);
  }

  it("a wrong password gets a plain message that does not say whether the e-mail exists", async () => {
    const { context, page } = await newPage(browser);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail", { exact: true }).fill("nobody@nowhere.example");
    await page.getByLabel("Password").fill("wrong-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await expect(page.getByRole("alert").filter({ hasText: "do not match an account" }).waitFor()).resolves.toBeUndefined();
    await context.close();
  });

  it("an e-mail link signs in once; the same link again gets a clear page and no session", async () => {
    const { context, page } = await newPage(browser);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail for a sign-in link").fill("buyer@bramblewake.example");
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await page.waitForURL(/check-email/);
    const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
    let html = "";
    for (let i = 0; i < 40 && !html; i++) {
      const r = await db.execute("SELECT html FROM email_outbox WHERE to_addresses LIKE '%buyer@bramblewake.example%' ORDER BY created_at DESC LIMIT 1");
      html = String(r.rows[0]?.html ?? "");
      if (!html) await new Promise((res) => setTimeout(res, 250));
    }
    db.close();
    const link = html.match(/href="([^"]*callback\/email[^"]*)"/)?.[1]?.replaceAll("&amp;", "&");
    expect(link, "sign-in link in the outbox").toBeTruthy();
    await page.goto(link!);
    await page.waitForURL((u) => u.pathname === "/portal");
    await context.close();

    const second = await newPage(browser);
    await second.page.goto(link!);
    await second.page.waitForURL(/sign-in\/problem/);
    await expect(second.page.getByText(/expired or has already been used/).waitFor()).resolves.toBeUndefined();
    const home = await second.page.goto(`${stack.baseUrl}/portal`);
    expect(new URL(home!.url()).pathname).toBe("/sign-in");
    await second.context.close();
  });

  it("an unknown address asking for a link sees the same page, and nothing is sent", async () => {
    const { context, page } = await newPage(browser);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail for a sign-in link").fill("stranger@nowhere.example");
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await page.waitForURL(/check-email/);
    const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
    const r = await db.execute("SELECT count(*) AS n FROM email_outbox WHERE to_addresses LIKE '%stranger@nowhere.example%'");
    db.close();
    expect(Number(r.rows[0]?.n)).toBe(0);
    await context.close();
  });

  it("five wrong passwords pause sign-in for that account, even with the right password", async () => {
    const { context, page } = await newPage(browser);
    for (let i = 0; i < 5; i++) {
      await page.goto(`${stack.baseUrl}/sign-in`);
      await page.getByLabel("E-mail", { exact: true }).fill("lab@tarnavel.example");
      await page.getByLabel("Password").fill(`wrong-${i}`);
      await page.getByRole("button", { name: "Sign in", exact: true }).click();
      await page.getByRole("alert").first().waitFor();
    }
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail", { exact: true }).fill("lab@tarnavel.example");
    await page.getByLabel("Password").fill(DEMO_PASSWORDS.client_admin);
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await expect(page.getByRole("alert").filter({ hasText: "Too many failed attempts" }).waitFor()).resolves.toBeUndefined();
    await context.close();
  });

  it("a staff member outside a role gets 403 from that role's page and its API alike", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "sales@ostrevane.example", DEMO_PASSWORDS.sales);
    for (const path of ["/admin/accounts", "/admin/production", "/admin/catalogue", "/admin/staff", "/admin/audit", "/admin/outbox"]) {
      const res = await page.goto(`${stack.baseUrl}${path}`);
      expect(res?.status(), path).toBe(403);
    }
    for (const path of ["/api/admin/ledger", "/api/admin/board", "/api/admin/staff", "/api/admin/audit"]) {
      const res = await page.request.get(`${stack.baseUrl}${path}`);
      expect(res.status(), path).toBe(403);
      expect(await res.text()).not.toMatch(/at .*\.(js|ts):\d+/);
    }
    expect((await page.goto(`${stack.baseUrl}/admin/sales`))?.status()).toBe(200);
    await context.close();
  });

  it("a client is refused /admin (403) and gets 404 for another firm's order", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    const admin = await page.goto(`${stack.baseUrl}/admin`);
    expect(admin?.status()).toBe(403);
    const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
    const other = await db.execute(
      "SELECT r.id FROM requests r JOIN organisations o ON o.id = r.org_id WHERE o.slug = 'bramblewake-boatworks' LIMIT 1",
    );
    db.close();
    const otherId = String(other.rows[0]?.id);
    const res = await page.goto(`${stack.baseUrl}/portal/requests/${otherId}`);
    expect(res?.status()).toBe(404);
    const api = await page.request.get(`${stack.baseUrl}/api/portal/requests/${otherId}`);
    expect(api.status()).toBe(404);
    await context.close();
  });
  it("every answer names its request id (pages through the proxy, API routes through their wrapper), keeping a caller's plain id", async () => {
    const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
    for (const path of ["/sign-in", "/api/health", "/api/portal/requests"]) {
      const fresh = await fetch(`${stack.baseUrl}${path}`, { redirect: "manual" });
      expect(fresh.headers.get("x-request-id"), path).toMatch(uuid);
      const kept = await fetch(`${stack.baseUrl}${path}`, { redirect: "manual", headers: { "x-request-id": "edge-7c1f.42:9" } });
      expect(kept.headers.get("x-request-id"), path).toBe("edge-7c1f.42:9");
      const replaced = await fetch(`${stack.baseUrl}${path}`, { redirect: "manual", headers: { "x-request-id": "no good; id" } });
      expect(replaced.headers.get("x-request-id"), path).toMatch(uuid);
    }
    // The signed-out API answer is the route's own 401 (the proxy redirects pages only).
    expect((await fetch(`${stack.baseUrl}/api/portal/requests`, { redirect: "manual" })).status).toBe(401);
    const page = await fetch(`${stack.baseUrl}/portal`, { redirect: "manual" });
    expect(page.status).toBe(307);
    expect(page.headers.get("location")).toContain("/sign-in?callbackUrl=%2Fportal");
    expect(page.headers.get("x-request-id")).toMatch(uuid);
  });
});
