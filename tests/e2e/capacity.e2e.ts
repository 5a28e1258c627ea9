import { describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "@/lib/seed/data";
import { newPage, signIn } from "./harness";
import { journeySetup, WIDE } from "./journey";

/** The capacity view (production) and the delivery choice on the client's review step. */
const j = journeySetup();
const { requestId, both } = j;

describe("capacity and delivery", () => {
  it("production sees eight weeks per cell and the router, the demo's booked work and its maintenance blocks", async () => {
    const { context, page } = await newPage(j.browser, WIDE);
    await signIn(page, j.stack.baseUrl, "production@ostrevane.example", DEMO_PASSWORDS.production);
    await page.goto(`${j.stack.baseUrl}/admin/production`);
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
    const { context, page } = await newPage(j.browser, WIDE);
    await signIn(page, j.stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    await page.goto(`${j.stack.baseUrl}/portal/requests/${await requestId("Spar cap tool")}`);
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

  it("production delays the scheduled job by a week; the client's timeline shows the new date and sales sees the broken promise", async () => {
    const orderId = String((await j.db.execute("select o.id from orders o join requests r on r.id = o.request_id where r.stage = 'scheduled'")).rows[0]?.id);
    const print = Number((await j.db.execute({ sql: "select starts_at from schedule_blocks where order_id = ? and kind = 'print'", args: [orderId] })).rows[0]?.starts_at);
    const staff = await newPage(j.browser, WIDE);
    await signIn(staff.page, j.stack.baseUrl, "production@ostrevane.example", DEMO_PASSWORDS.production);
    await staff.page.goto(`${j.stack.baseUrl}/admin/production/orders/${orderId}`);
    await staff.page.getByText("Move the job and tell the clients affected").click();
    // a week later, as the plant's wall clock shows it in the form
    const later = new Date(print + 7 * 86_400_000);
    const local = new Intl.DateTimeFormat("sv-SE", { timeZone: "CST6CDT", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit" }).format(later).replace(" ", "T");
    await staff.page.getByLabel(/New print start/).fill(local);
    await staff.page.getByLabel(/Reason \(the client reads it/).first().fill("The resin lot failed its moisture check; a new lot arrives next week.");
    await staff.page.getByRole("button", { name: "Move the job" }).click();
    await expect(staff.page.getByText(/was e-mailed the new ship date/).textContent({ timeout: 30_000 })).resolves.toMatch(/Moved/);
    await staff.page.getByText("Ship-date changes").waitFor({ timeout: 30_000 });
    await both(staff.page, "move-job-order");
    await staff.context.close();

    const sales = await newPage(j.browser, WIDE);
    await signIn(sales.page, j.stack.baseUrl, "sales@ostrevane.example", DEMO_PASSWORDS.sales);
    await sales.page.goto(`${j.stack.baseUrl}/admin/sales`);
    await expect(sales.page.getByTestId("promised-dates").textContent({ timeout: 30_000 })).resolves.toMatch(/now planned/);
    await sales.page.getByTestId("promised-dates").scrollIntoViewIfNeeded();
    await both(sales.page, "promised-dates-sales");
    await sales.context.close();

    const client = await newPage(j.browser, WIDE);
    await signIn(client.page, j.stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    const requestIdOf = String((await j.db.execute({ sql: "select request_id from orders where id = ?", args: [orderId] })).rows[0]?.request_id);
    await client.page.goto(`${j.stack.baseUrl}/portal/requests/${requestIdOf}`);
    await client.page.getByText("Ship date changes").waitFor({ timeout: 30_000 });
    await expect(client.page.getByRole("list", { name: "Order timeline" }).textContent()).resolves.toMatch(/resin lot failed its moisture check/);
    await both(client.page, "ship-date-change-timeline");
    await client.context.close();
  });
});
