import { createClient, type Client } from "@libsql/client";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "@/lib/seed/data";
import { DESKTOP, launchBrowser, newPage, PHONE, shot, signIn, startStack, type TestStack } from "./harness";
import { addPartWithFile, fillProject, MOLD_STL, payOnFakeCheckout, signUp, waitForEstimate } from "./portal-journey";

let stack: TestStack;
let browser: Browser;
let db: Client;

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

async function both(page: Page, name: string) {
  await page.mouse.move(0, 0);
  await shot(page, `portal-${name}-desktop`);
  await page.setViewportSize(PHONE);
  await shot(page, `portal-${name}-phone`);
  await page.setViewportSize(DESKTOP);
}

const stageOf = async (id: string) => String((await db.execute({ sql: "select stage from requests where id = ?", args: [id] })).rows[0]?.stage);

describe("client portal journey", () => {
  it("a new user signs up, drafts a request, uploads an STL, sees the 3D preview and the estimate, and submits", async () => {
    const { context, page } = await newPage(browser);
    const email = `tamsin.${Date.now()}@wrenfield.example`;
    await signUp(page, stack.baseUrl, { name: "Tamsin Oakridge", firm: "Wrenfield Composites", email, password: "layup-tools-2027" });
    await both(page, "home-empty");
    await page.goto(`${stack.baseUrl}/portal/requests/new`);
    await fillProject(page, { name: "Wing rib layup tool", neededBy: "2027-04-30", cureC: 177 });
    await both(page, "new-project");
    await page.getByRole("button", { name: "Continue" }).click();

    // A renamed PDF is refused on its part, with a clear message; the draft keeps going.
    await addPartWithFile(page, 0, MOLD_STL.bad);
    await expect(page.getByTestId("part-file-error").textContent({ timeout: 60_000 })).resolves.toMatch(/drawing\.stl/);
    await both(page, "new-bad-upload");
    // The real file as a new upload on the same part.
    await page.locator('[id="parts.0.file"]').setInputFiles(MOLD_STL.file);
    await waitForEstimate(page, 0);
    await page.getByLabel(/Confirm millimetres|Units confirmed/).check();
    // A material rated below a 177 °C cure gets a warning on the part (the default is a rated one).
    await page.getByLabel("Material").selectOption("abs-cf");
    await expect(page.getByTestId("material-warnings").textContent()).resolves.toMatch(/177 °C cure/);
    await page.getByLabel("Material").selectOption("pesu-cf");
    await both(page, "new-parts");

    // Nothing is lost on a reload: the draft comes back from the server.
    await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.textContent?.includes("Draft saved"), null, { timeout: 30_000 });
    await page.waitForTimeout(1500);
    const draftUrl = page.url();
    expect(draftUrl).toMatch(/\/portal\/requests\/[0-9a-f-]{36}$/);
    await page.reload();
    // The form's fields are filled when it hydrates.
    await page.waitForFunction(() => (document.getElementById("projectName") as HTMLInputElement | null)?.value === "Wing rib layup tool", null, { timeout: 30_000 });
    await page.getByRole("button", { name: "3. Review & submit" }).click();
    await page.getByRole("button", { name: "Continue" }).click().catch(() => {});
    await page.getByTestId("bounding-size").waitFor({ timeout: 90_000 });
    // The size as built follows the orientation the estimator chose by cost and date: any order of the part's three sides.
    const asBuilt = (await page.getByTestId("bounding-size").textContent()) ?? "";
    expect(asBuilt).toMatch(/mm/);
    expect((asBuilt.match(/\d[\d,]*/g) ?? []).map((n) => Number(n.replace(/,/g, ""))).sort((a, b) => a - b)).toEqual([400, 1200, 2400]);
    await expect(page.getByTestId("estimate-panel").textContent()).resolves.toContain("Automatic estimate");
    await expect(page.locator("canvas").count()).resolves.toBeGreaterThan(0);
    await both(page, "new-review");

    await page.getByRole("button", { name: "Submit to the bureau" }).click();
    await page.waitForURL((u) => u.searchParams.get("submitted") === "1", { timeout: 60_000 });
    const requestId = new URL(page.url()).pathname.split("/").pop()!;
    expect(await stageOf(requestId)).toBe("submitted");
    const mail = await db.execute("select subject, to_addresses from email_outbox where subject like 'New request %' or subject like 'Request % received'");
    expect(mail.rows.map((r) => String(r.to_addresses))).toEqual(expect.arrayContaining([expect.stringContaining("sales@ostrevane.example"), expect.stringContaining(email)]));
    await both(page, "request-submitted");
    await context.close();
  }, 300_000);

  it("accepts a seeded quote with a PO number, pays the deposit with 4242… and lands back at deposit_paid with the e-mail sent", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "buyer@bramblewake.example", DEMO_PASSWORDS.client_admin);
    await both(page, "home");
    const rid = String((await db.execute("select id from requests where stage = 'quoted' and project_name = 'Deck hatch plug'")).rows[0]?.id);
    await page.goto(`${stack.baseUrl}/portal/requests/${rid}`);
    await both(page, "request-quoted");
    await page.getByLabel("Your purchase order number").fill("BW-PO-2291");
    await page.getByLabel(/I accept the terms/).check();
    // A double click makes one order and one Checkout Session.
    await page.getByRole("button", { name: "Accept and pay the deposit" }).dblclick();
    await page.waitForURL((u) => u.pathname.startsWith("/checkout/"), { timeout: 60_000 });
    await shot(page, "portal-checkout-desktop");
    await payOnFakeCheckout(page, "4242 4242 4242 4242");
    await page.waitForURL((u) => u.pathname === `/portal/requests/${rid}`, { timeout: 60_000 });
    await page.locator('[data-testid="request-stage"][data-stage="deposit_paid"]').waitFor({ timeout: 60_000 });
    expect(await stageOf(rid)).toBe("deposit_paid");
    const pays = await db.execute({ sql: "select p.status from payments p join orders o on o.id = p.order_id where o.request_id = ?", args: [rid] });
    expect(pays.rows.map((r) => r.status)).toEqual(["paid"]);
    const ref = String((await db.execute({ sql: "select reference from requests where id = ?", args: [rid] })).rows[0]?.reference);
    // The notice is queued with the deposit invoice attached and sent a moment later.
    const mails = async () => Number((await db.execute({ sql: "select count(*) as n from email_outbox where subject = ?", args: [`Deposit received for ${ref}`] })).rows[0]?.n);
    await expect.poll(mails, { timeout: 60_000, interval: 500 }).toBe(1);
    await both(page, "request-paid");
    await page.goto(`${stack.baseUrl}/portal/payments`);
    await both(page, "payments");
    // The link to a receipt is its bureau receipt number.
    await page.getByRole("link", { name: /^RC-\d{4}-\d{5}$/ }).first().click();
    await expect(page.locator("body").textContent()).resolves.toMatch(/RC-\d{4}-\d{5}/);
    await both(page, "receipt");
    await page.goto(`${stack.baseUrl}/portal/firm`);
    await both(page, "firm");
    await context.close();
  }, 240_000);

  it("a declined card (4000 0000 0000 0002) leaves the order payable again", async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, stack.baseUrl, "lab@tarnavel.example", DEMO_PASSWORDS.client_admin);
    const rid = String((await db.execute("select id from requests where stage = 'accepted'")).rows[0]?.id);
    await page.goto(`${stack.baseUrl}/portal/requests/${rid}`);
    await page.getByRole("button", { name: /Pay the deposit/ }).click();
    await page.waitForURL((u) => u.pathname.startsWith("/checkout/"), { timeout: 60_000 });
    const firstSession = new URL(page.url()).pathname;
    await payOnFakeCheckout(page, "4000 0000 0000 0002");
    await expect(page.getByRole("alert").textContent()).resolves.toContain("declined");
    await shot(page, "portal-checkout-declined-phone");
    await page.locator("#cancel").click();
    await page.waitForURL((u) => u.pathname === `/portal/requests/${rid}`);
    await expect(page.getByText("The payment was not completed").isVisible()).resolves.toBe(true);
    await shot(page, "portal-request-cancelled-phone");
    expect(await stageOf(rid)).toBe("accepted");
    await page.getByRole("button", { name: /Pay the deposit/ }).click();
    await page.waitForURL((u) => u.pathname.startsWith("/checkout/"), { timeout: 60_000 });
    // The same open session is offered again.
    expect(new URL(page.url()).pathname).toBe(firstSession);
    await context.close();
  }, 180_000);

  it("another firm's request page and file answer 404", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    const other = await db.execute(
      "select r.id as rid, fr.id as fid from requests r join organisations o on o.id = r.org_id join parts p on p.request_id = r.id join file_revisions fr on fr.part_id = p.id where o.slug = 'bramblewake-boatworks' limit 1",
    );
    const { rid, fid } = other.rows[0] as unknown as { rid: string; fid: string };
    expect((await page.goto(`${stack.baseUrl}/portal/requests/${rid}`))?.status()).toBe(404);
    expect((await page.request.get(`${stack.baseUrl}/api/files/${fid}`)).status()).toBe(404);
    expect((await page.request.get(`${stack.baseUrl}/api/portal/revisions/${fid}/mesh`)).status()).toBe(404);
    await context.close();
  }, 120_000);

  it("a STEP assembly is tessellated, previewed, and the client prints only the bodies picked", async () => {
    const { context, page } = await newPage(browser);
    await signIn(page, stack.baseUrl, "lead@caldrith.example", DEMO_PASSWORDS.client_admin);
    await page.goto(`${stack.baseUrl}/portal/requests/new`);
    await fillProject(page, { name: "Fixture from an assembly", neededBy: "2027-05-31", cureC: 120 });
    await page.getByRole("button", { name: "Continue" }).click();
    // as1-oc-214.stp: CAx Implementor Forum assembly AS1, 18 bodies (mocks/fixtures/cad/README.md).
    await addPartWithFile(page, 0, path.resolve(import.meta.dirname, "../../mocks/fixtures/cad/as1-oc-214.stp"));
    await waitForEstimate(page, 0);
    // A STEP file declares its units: no confirmation is asked for.
    await expect.poll(() => page.getByTestId("part-card-0").textContent()).toContain("Units confirmed by the file: millimetres");
    const picker = page.getByTestId("body-picker-0");
    await expect(picker.getByRole("checkbox").count()).resolves.toBe(18);
    await expect(picker.textContent()).resolves.toContain("18 of 18 to print");
    await picker.getByRole("checkbox").nth(0).uncheck();
    await expect(picker.textContent()).resolves.toContain("17 of 18 to print");
    // The draft saves the choice (autosave, a moment after the change) and the estimate runs again.
    const requestId = new URL(page.url()).pathname.split("/").pop()!;
    let saved: number[] | null = null;
    for (let i = 0; i < 60 && !saved; i++) {
      const row = await db.execute({ sql: "select selected_bodies from parts where request_id = ?", args: [requestId] });
      const v = row.rows[0]?.selected_bodies;
      saved = v ? (JSON.parse(String(v)) as number[]) : null;
      if (!saved) await page.waitForTimeout(500);
    }
    expect(saved).toHaveLength(17);
    expect(saved).not.toContain(0);
    await waitForEstimate(page, 0);
    await page.getByTestId("body-picker-0").waitFor({ timeout: 120_000 });
    await expect(page.getByTestId("body-picker-0").textContent()).resolves.toContain("17 of 18 to print");
    await both(page, "new-step-bodies");
    await page.getByRole("button", { name: "3. Review & submit" }).click();
    await page.getByTestId("bounding-size").waitFor({ timeout: 90_000 });
    await expect(page.locator("canvas").count()).resolves.toBeGreaterThan(0);
    await both(page, "new-step-review");
    await context.close();
  }, 180_000);
});
