import { createClient, type Client } from "@libsql/client";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "@/lib/seed/data";
import { launchBrowser, newPage, PHONE, shot, signIn, startStack, type TestStack } from "./harness";

/** The capacity view (production) and the delivery choice on the client's review step. */
let stack: TestStack;
let browser: Browser;
let db: Client;
const WIDE = { width: 1440, height: 900 };

beforeAll(async () => {
  stack = await startStack();
  browser = await launchBrowser();
  db = createClient({ url: stack.dbUrl, timeout: 10_000 });
}, 180_000);

afterAll(async () => {
  db?.close();
  await browser?.close();
  await stack?.stop();
});

const requestId = async (project: string) => String((await db.execute({ sql: "select id from requests where project_name like ?", args: [`${project}%`] })).rows[0]?.id);

async function both(page: Page, name: string) {
  await page.mouse.move(0, 0);
  await shot(page, `${name}-1440`);
  await page.setViewportSize(PHONE);
  await shot(page, `${name}-390`);
  await page.setViewportSize(WIDE);
}

describe("capacity and delivery", () => {
  it("production sees eight weeks per cell and the router, the demo's booked work and its maintenance blocks", async () => {
    const { context, page } = await newPage(browser, WIDE);
    await signIn(page, stack.baseUrl, "production@ostrevane.example", DEMO_PASSWORDS.production);
    await page.goto(`${stack.baseUrl}/admin/production`);
    await page.getByRole("link", { name: "Capacity, 8 weeks" }).click();
    await page.waitForURL(/\/admin\/production\/capacity$/);
    await page.getByRole("heading", { name: "Capacity", level: 1 }).waitFor();
    // four cells and the router, eight columns each
    await expect(page.getByRole("img", { name: /^Week of / }).count()).resolves.toBe(5 * 8);
    await expect(page.getByRole("heading", { name: "Router", level: 3 }).isVisible()).resolves.toBe(true);
    const blocks = await page.locator("main").textContent();
    expect(blocks).toMatch(/Screw and barrel inspection/);
    expect(blocks).toMatch(/Spindle bearing service/);
    // the scheduled demo job is behind a column
    await page.getByText("Jobs behind the columns").first().click();
    await expect(page.getByRole("link", { name: /^LW-/ }).count()).resolves.toBeGreaterThan(0);
    await both(page, "capacity-view");
    await context.close();
  });

  it("the client picks expedited delivery on the review step, with its date and total", async () => {
    const { context, page } = await newPage(browser, WIDE);
    await signIn(page, stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    await page.goto(`${stack.baseUrl}/portal/requests/${await requestId("Spar cap tool")}`);
    await page.getByRole("button", { name: "Continue" }).click();
    await page.getByLabel(/Confirm millimetres|Units confirmed/).first().check();
    await page.getByRole("button", { name: "3. Review & submit" }).click();
    const choice = page.getByTestId("lead-time-choice");
    await expect(choice.textContent({ timeout: 60_000 })).resolves.toMatch(/Standard.*Ships.*Expedited.*Ships/s);
    await choice.getByLabel(/Expedited/).check();
    await expect(choice.getByLabel(/Expedited/).isChecked()).resolves.toBe(true);
    await choice.scrollIntoViewIfNeeded();
    await both(page, "lead-time-choice");
    await context.close();
  });
});
