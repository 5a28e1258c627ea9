import { createClient } from "@libsql/client";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "@/lib/seed/data";
import { totpCodeForStep, totpStepAt } from "../../lib/auth/two-factor";
import { launchBrowser, newPage, PHONE, shot, signIn, startStack, type TestStack } from "./harness";

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
    const page = await open("sales@ostrevane.example", DEMO_PASSWORDS.sales);
    await page.goto(`${stack.baseUrl}/admin/sales`);
    const first = page.getByRole("table", { name: "Sales inbox" }).getByRole("link").first();
    const reference = (await first.textContent())!.trim();
    await first.click();
    await page.getByRole("button", { name: "Issue quote" }).click();
    // Issuing numbers and renders the quotation's PDF before it answers.
    await page.getByText(/issued; the client has been e-mailed/).waitFor({ timeout: 90_000 });
    await shot(page, "admin-e2e-sales-issued");
    await page.context().close();

    const client = await open("lead@caldrith.example", DEMO_PASSWORDS.client_admin);
    await client.goto(`${stack.baseUrl}/portal`);
    await client.getByText(reference).first().click();
    await client.waitForURL(/\/portal\/requests\//);
    await client.getByText(/quote/i).first().waitFor();
    await shot(client, "admin-e2e-client-sees-quote");
    await client.context().close();
  }, 240_000); // the first journey also pays for the server's first render of each page

  it("production schedules a paid order and moves it to shipped", async () => {
    const page = await open("production@ostrevane.example", DEMO_PASSWORDS.production);
    await page.goto(`${stack.baseUrl}/admin/production`);
    await page.getByRole("region", { name: "Waiting" }).getByRole("link").filter({ hasText: "deposit paid" }).first().click();
    await page.getByLabel(/Print start/).fill("2031-03-03T06:00");
    await page.getByRole("button", { name: "Schedule on this cell" }).click();
    await page.getByText(/Scheduled; the client has been e-mailed/).waitFor();
    // Each time the preselected move is the next stage forward: one click, never a step back.
    for (const stage of ["printing", "cooling", "machining", "inspection", "finishing", "packed"]) {
      await expect.poll(() => page.getByLabel("Move to").inputValue(), { timeout: 15_000 }).toBe(stage);
      await page.getByRole("button", { name: `Move to ${stage}` }).click();
      await page.getByText(`Moved to ${stage}.`).waitFor();
    }
    // The inspection report is filed as soon as it is uploaded, and listed on the order.
    const report = { name: "dimensional-inspection.pdf", mimeType: "application/pdf", buffer: Buffer.from("%PDF-1.4\n% dimensional inspection, 14 points within 0.5 mm\n%%EOF\n") };
    await page.locator("#inspection-report").setInputFiles(report);
    await page.getByText(/“dimensional-inspection\.pdf” is filed with the order/).waitFor({ timeout: 60_000 });
    await page.getByRole("list", { name: "Inspection reports on file" }).getByRole("link", { name: "dimensional-inspection.pdf" }).waitFor();
    await page.getByLabel("Carrier").fill("Tidewater Haulage");
    await page.getByLabel("Tracking number").fill("TW-4471");
    await page.getByRole("button", { name: "Save actuals" }).click();
    await page.getByText("Actuals saved.").waitFor();
    await expect.poll(() => page.getByLabel("Move to").inputValue(), { timeout: 15_000 }).toBe("shipped");
    await page.getByRole("button", { name: "Move to shipped" }).click();
    await page.getByText("Moved to shipped.").waitFor();
    await shot(page, "admin-e2e-production-shipped");
    const orderId = new URL(page.url()).pathname.split("/").pop()!;
    await page.context().close();

    // The client finds the report with the order's files and can download it.
    const requestId = await sqlValue("SELECT request_id FROM orders WHERE id = ?", [orderId]);
    const clientEmail = await sqlValue("SELECT u.email FROM users u JOIN requests r ON r.created_by_id = u.id WHERE r.id = ?", [requestId]);
    const clientRole = (await sqlValue("SELECT role FROM users WHERE email = ?", [clientEmail])) as keyof typeof DEMO_PASSWORDS;
    const client = await open(clientEmail, DEMO_PASSWORDS[clientRole]);
    await client.goto(`${stack.baseUrl}/portal/requests/${requestId}`);
    const link = client.getByRole("link", { name: /dimensional-inspection\.pdf/ });
    await link.waitFor();
    const res = await client.request.get(`${stack.baseUrl}${await link.getAttribute("href")}`);
    expect(res.status()).toBe(200);
    expect((await res.body()).toString()).toContain("dimensional inspection");
    await shot(client, "admin-e2e-client-sees-report");
    await client.context().close();
  }, 180_000);

  it("accounts finds a mismatch, refunds part of a deposit and exports the CSV", async () => {
    const page = await open("accounts@ostrevane.example", DEMO_PASSWORDS.accounts);
    await page.goto(`${stack.baseUrl}/admin/accounts/reconciliation`);
    await page.getByRole("list", { name: "Findings" }).getByText("amount mismatch").first().waitFor();
    await page.getByLabel("show matched").check();
    const matched = page.getByRole("list", { name: "Findings" }).locator("li", { hasText: "matched" }).filter({ hasText: "payment ·" }).first();
    await matched.getByRole("link", { name: "Open payment" }).click();
    await page.getByLabel("Amount ($)").fill("100.00");
    await page.getByLabel("Reason").fill("Flange trimmed short by agreement");
    await page.getByRole("button", { name: "Refund…" }).click();
    await page.getByRole("alertdialog", { name: "Refund $100.00?" }).getByRole("button", { name: "Yes, refund $100.00" }).click();
    await page.getByText(/Refund of \$100\.00 sent/).waitFor();
    await shot(page, "admin-e2e-accounts-refunded");
    await page.goto(`${stack.baseUrl}/admin/accounts`);
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export CSV" }).click()]);
    const csv = await download.createReadStream().then(async (s) => {
      let out = "";
      for await (const chunk of s) out += chunk;
      return out;
    });
    expect(csv.split("\r\n")[0]).toMatch(/^Date \(UTC\),Entry,Kind,Order,Firm,Status,Amount,Fee,Refunded,Currency,Receipt number,Processor reference,Reason$/);
    expect(csv).toMatch(/,Refund,.*-100\.00/);
    await page.context().close();
  }, 120_000);
});

/** One value from the stack's database (the e2e stack runs on its own throwaway file). */
async function sqlValue(sql: string, args: (string | number)[] = []): Promise<string> {
  const db = createClient({ url: stack.dbUrl, timeout: 10_000 });
  try {
    return String((await db.execute({ sql, args })).rows[0]?.[0] ?? "");
  } finally {
    db.close();
  }
}

describe("confirmation steps, notices and invitations", () => {
  it("production puts an order on hold only after the are-you-sure step, at desktop and phone width", async () => {
    const orderId = await sqlValue("SELECT o.id FROM orders o JOIN requests r ON r.id = o.request_id WHERE r.stage = 'printing' LIMIT 1");
    for (const [viewport, name] of [[undefined, "desktop"], [PHONE, "phone"]] as const) {
      const { page } = await newPage(browser, viewport);
      await signIn(page, stack.baseUrl, "production@ostrevane.example", DEMO_PASSWORDS.production);
      await page.goto(`${stack.baseUrl}/admin/production/orders/${orderId}`);
      await page.getByLabel("Move to").selectOption("on_hold");
      await page.getByLabel("Note to the client (optional)").fill("Waiting for the revised flange drawing");
      await page.getByRole("button", { name: "Put on hold…" }).click();
      const dialog = page.getByRole("alertdialog", { name: "Put this order on hold?" });
      await dialog.getByText(/The client sees “On hold”/).waitFor();
      await dialog.getByText(/stays booked/).waitFor();
      await shot(page, `admin-e2e-hold-confirm-${name}`);
      expect(await sqlValue("SELECT stage FROM requests r JOIN orders o ON o.request_id = r.id WHERE o.id = ?", [orderId])).toBe("printing");
      if (name === "desktop") {
        await dialog.getByRole("button", { name: "Go back" }).click();
        expect(await page.getByRole("alertdialog").count()).toBe(0);
      } else {
        await dialog.getByRole("button", { name: "Yes, put it on hold" }).click();
        await page.getByText("Moved to on hold.").waitFor();
        expect(await sqlValue("SELECT stage FROM requests r JOIN orders o ON o.request_id = r.id WHERE o.id = ?", [orderId])).toBe("on_hold");
      }
      await page.context().close();
    }
  }, 120_000);

  it("a staff message reaches the client as an e-mail notice, shown in the outbox", async () => {
    const requestId = await sqlValue("SELECT id FROM requests WHERE stage IN ('submitted', 'quoted') AND is_controlled = 0 ORDER BY stage DESC LIMIT 1");
    const sales = await open("sales@ostrevane.example", DEMO_PASSWORDS.sales);
    await sales.goto(`${stack.baseUrl}/admin/sales/requests/${requestId}`);
    await sales.getByLabel("Message to the client").fill("Thanks for the revised file: the flange now fits the Long Bed with 140 mm to spare.\n\nCould you confirm the 3 mm finish allowance on the sealing face?");
    await sales.getByRole("button", { name: "Send message" }).click();
    await sales.getByText("the flange now fits the Long Bed", { exact: false }).first().waitFor();
    await sales.context().close();
    let mailId = "";
    for (let i = 0; i < 50 && !mailId; i++) {
      mailId = await sqlValue("SELECT id FROM email_outbox WHERE subject LIKE 'New message on %' ORDER BY created_at DESC LIMIT 1");
      if (!mailId) await new Promise((r) => setTimeout(r, 200));
    }
    expect(mailId).not.toBe("");
    for (const [viewport, name] of [[undefined, "desktop"], [PHONE, "phone"]] as const) {
      const { page } = await newPage(browser, viewport);
      await signIn(page, stack.baseUrl, "admin@ostrevane.example", DEMO_PASSWORDS.admin);
      await page.goto(`${stack.baseUrl}/admin/outbox/${mailId}`);
      await page.frameLocator('iframe[title="Rendered e-mail"]').locator("p", { hasText: "140 mm to spare" }).waitFor();
      await shot(page, `admin-e2e-staff-message-mail-${name}`);
      await page.context().close();
    }
  }, 120_000);

  it("an invited staff member accepts, sets a password and signs in with it; the used link then says so", async () => {
    const admin = await open("admin@ostrevane.example", DEMO_PASSWORDS.admin);
    await admin.goto(`${stack.baseUrl}/admin/staff`);
    await admin.locator("#invite-email").fill("new.planner@ostrevane.example");
    await admin.locator("#invite-role").selectOption("production");
    await admin.getByRole("button", { name: "Invite" }).click();
    await admin.getByText(/is invited; the e-mail links to a page/).waitFor();
    await admin.context().close();
    let html = "";
    for (let i = 0; i < 50 && !html; i++) {
      html = await sqlValue("SELECT html FROM email_outbox WHERE subject = 'You are invited to the Layerwright back office' AND to_addresses LIKE '%new.planner@%' LIMIT 1");
      if (!html) await new Promise((r) => setTimeout(r, 200));
    }
    const link = /href="([^"]*\/invite\/accept\?token=[A-Za-z0-9_-]{43})"/.exec(html)?.[1];
    expect(link, "accept link in the invitation e-mail").toBeTruthy();
    const sent = new URL(link!);
    const acceptUrl = `${stack.baseUrl}${sent.pathname}${sent.search}`;

    const { page: phone } = await newPage(browser, PHONE);
    await phone.goto(acceptUrl);
    await phone.getByRole("heading", { name: "Join the back office" }).waitFor();
    await shot(phone, "auth-e2e-invite-accept-phone");
    await phone.context().close();

    const { page } = await newPage(browser);
    await page.goto(acceptUrl);
    await shot(page, "auth-e2e-invite-accept-desktop");
    await page.getByLabel("Your name").fill("Ansel Brook");
    await page.getByLabel("Password", { exact: true }).fill("cell-planner-2031");
    await page.getByLabel("Password again").fill("cell-planner-2031");
    await page.getByRole("button", { name: "Accept and set password" }).click();
    await page.waitForURL(/\/invite\/done$/);
    await signIn(page, stack.baseUrl, "new.planner@ostrevane.example", "cell-planner-2031");
    // Staff set up an authenticator app before anything else: the back office sends them there.
    await page.getByRole("heading", { name: "Set up two-factor sign-in" }).waitFor();
    await page.goto(`${stack.baseUrl}/admin/production`);
    await page.getByRole("heading", { name: "Set up two-factor sign-in" }).waitFor();
    await shot(page, "auth-e2e-two-factor-enrol-desktop");
    const key = (await page.locator("code").first().innerText()).replace(/\s+/g, "");
    const now = totpStepAt(Date.now());
    await page.getByLabel("Code from the app").fill(totpCodeForStep(key, now));
    await page.getByRole("button", { name: "Turn on two-factor sign-in" }).click();
    await page.getByTestId("recovery-codes").locator("li").nth(9).waitFor();
    expect(await page.getByTestId("recovery-codes").locator("li").count()).toBe(10);
    const recovery = await page.getByTestId("recovery-codes").locator("li").first().innerText();
    await shot(page, "auth-e2e-two-factor-recovery-desktop");
    await page.getByRole("link", { name: /continue/ }).click();
    await page.waitForURL((url) => url.pathname.startsWith("/admin"));
    expect(await sqlValue("SELECT count(*) FROM audit_log WHERE action = 'two_factor.enrolled'")).toBe("1");

    // The next sign-in asks for a code; a recovery code works once.
    await page.context().clearCookies();
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByLabel("E-mail", { exact: true }).fill("new.planner@ostrevane.example");
    await page.getByLabel("Password").fill("cell-planner-2031");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByLabel("Code", { exact: true }).fill("000000");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByText("Wrong, expired or already used").waitFor();
    await shot(page, "auth-e2e-two-factor-wrong-code-desktop");
    await page.getByLabel("Code", { exact: true }).fill(recovery);
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.waitForURL((url) => url.pathname.startsWith("/admin"));
    await page.goto(acceptUrl);
    await page.getByRole("heading", { name: "This invitation no longer works" }).waitFor();
    await shot(page, "auth-e2e-invite-used-desktop");
    await page.context().close();
  }, 240_000);
});
