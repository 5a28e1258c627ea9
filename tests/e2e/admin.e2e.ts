import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "../../db/seed-data";
import { launchBrowser, newPage, shot, signIn, startStack, type TestStack } from "./harness";

/** Browser journeys of the back office, one per staff role, on the seeded demo. */
let stack: TestStack;
let browser: Browser;

beforeAll(async () => {
  stack = await startStack();
  browser = await launchBrowser();
}, 240_000);
afterAll(async () => {
  await browser?.close();
  await stack?.stop();
});

async function open(email: string, password: string): Promise<Page> {
  const { page } = await newPage(browser);
  await signIn(page, stack.baseUrl, email, password);
  return page;
}

describe("back office journeys", () => {
  it("sales issues a quote that the client then sees", async () => {
    const page = await open("sales@saltgrass.example", DEMO_PASSWORDS.sales);
    await page.goto(`${stack.baseUrl}/admin/sales`);
    const first = page.getByRole("table", { name: "Sales inbox" }).getByRole("link").first();
    const reference = (await first.textContent())!.trim();
    await first.click();
    await page.getByRole("button", { name: "Issue quote" }).click();
    await page.getByText(/issued; the client has been e-mailed/).waitFor();
    await shot(page, "admin-e2e-sales-issued");
    await page.context().close();

    const client = await open("lead@kittering.example", DEMO_PASSWORDS.client_admin);
    await client.goto(`${stack.baseUrl}/portal`);
    await client.getByText(reference).first().click();
    await client.waitForURL(/\/portal\/requests\//);
    await client.getByText(/quote/i).first().waitFor();
    await shot(client, "admin-e2e-client-sees-quote");
    await client.context().close();
  }, 120_000);

  it("production schedules a paid order and moves it to shipped", async () => {
    const page = await open("production@saltgrass.example", DEMO_PASSWORDS.production);
    await page.goto(`${stack.baseUrl}/admin/production`);
    await page.getByRole("region", { name: "Waiting" }).getByRole("link").filter({ hasText: "deposit paid" }).first().click();
    await page.getByLabel("Print start (UTC)").fill("2031-03-03T06:00");
    await page.getByRole("button", { name: "Schedule on this cell" }).click();
    await page.getByText(/Scheduled; the client has been e-mailed/).waitFor();
    for (const stage of ["printing", "cooling", "machining", "inspection", "finishing", "packed"]) {
      await page.getByLabel("Move to").selectOption(stage);
      await page.getByRole("button", { name: "Move stage" }).click();
      await page.getByText(`Moved to ${stage}.`).waitFor();
    }
    await page.getByLabel("Carrier").fill("Tidewater Haulage");
    await page.getByLabel("Tracking number").fill("TW-4471");
    await page.getByRole("button", { name: "Save actuals" }).click();
    await page.getByText("Actuals saved.").waitFor();
    await page.getByLabel("Move to").selectOption("shipped");
    await page.getByRole("button", { name: "Move stage" }).click();
    await page.getByText("Moved to shipped.").waitFor();
    await shot(page, "admin-e2e-production-shipped");
    await page.context().close();
  }, 120_000);

  it("accounts finds a mismatch, refunds part of a deposit and exports the CSV", async () => {
    const page = await open("accounts@saltgrass.example", DEMO_PASSWORDS.accounts);
    await page.goto(`${stack.baseUrl}/admin/accounts/reconciliation`);
    await page.getByRole("list", { name: "Findings" }).getByText("amount mismatch").first().waitFor();
    await page.getByLabel("show matched").check();
    const matched = page.getByRole("list", { name: "Findings" }).locator("li", { hasText: "matched" }).filter({ hasText: "payment ·" }).first();
    await matched.getByRole("link", { name: "Open payment" }).click();
    await page.getByLabel("Amount ($)").fill("100.00");
    await page.getByLabel("Reason").fill("Flange trimmed short by agreement");
    await page.getByRole("button", { name: "Refund" }).click();
    await page.getByText(/Refund of \$100\.00 sent/).waitFor();
    await shot(page, "admin-e2e-accounts-refunded");
    await page.goto(`${stack.baseUrl}/admin/accounts`);
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export CSV" }).click()]);
    const csv = await download.createReadStream().then(async (s) => {
      let out = "";
      for await (const chunk of s) out += chunk;
      return out;
    });
    expect(csv.split("\r\n")[0]).toMatch(/^date_utc,entry,kind,order_reference/);
    expect(csv).toMatch(/,refund,.*-100\.00/);
    await page.context().close();
  }, 120_000);
});
