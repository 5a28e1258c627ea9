import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createClient } from "@libsql/client";
import { DEMO_PASSWORDS, DEMO_USERS } from "../../db/seed-data";
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

  it("a wrong password gets a plain message that does not say whether the e-mail exists", async () => {
    const { context, page } = await newPage(browser);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail", { exact: true }).fill("nobody@nowhere.example");
    await page.getByLabel("Password").fill("wrong-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await expect(page.getByRole("alert").filter({ hasText: "do not match an account" }).waitFor()).resolves.toBeUndefined();
    await context.close();
  });

  it("a client is refused /admin (403) and gets 404 for another firm's order", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "engineer@kittering.example", DEMO_PASSWORDS.client);
    const admin = await page.goto(`${stack.baseUrl}/admin`);
    expect(admin?.status()).toBe(403);
    const db = createClient({ url: stack.dbUrl });
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
});
