import { describe, expect, it } from "vitest";
import { DEMO_PASSWORDS } from "@/lib/seed/data";
import { newPage, signIn } from "./harness";
import { journeySetup, WIDE } from "./journey";

/** The estimate's build on the client's and the staff's screens: drying, vertical builds, pieces. */
const j = journeySetup();
const { requestId, both } = j;

describe("how the part is built, on the estimate screens", () => {
  it("the client's draft of a 12 m spar shows it priced as two pieces with the joining, and the drying before the first layer", async () => {
    const { context, page } = await newPage(j.browser, WIDE);
    await signIn(page, j.stack.baseUrl, "engineer@caldrith.example", DEMO_PASSWORDS.client);
    await page.goto(`${j.stack.baseUrl}/portal/requests/${await requestId("Spar cap tool")}`);
    await page.getByRole("button", { name: "Continue" }).click();
    // the seeded spar's units were guessed: the client confirms them before the review
    await page.getByLabel(/Confirm millimetres|Units confirmed/).first().check();
    await page.getByRole("button", { name: "3. Review & submit" }).click();
    const pieces = page.getByTestId("build-pieces");
    await expect(pieces.textContent({ timeout: 60_000 })).resolves.toMatch(/2 pieces/);
    await expect(pieces.textContent()).resolves.toMatch(/Joining/);
    await expect(page.getByTestId("build-drying").first().textContent()).resolves.toMatch(/dried 5 h at 165 °C before the first layer/);
    await pieces.scrollIntoViewIfNeeded();
    await both(page, "estimate-build-portal-spar");
    await context.close();
  });

  it("staff see the pieces, the drying and the dryer's cap on a PA/CF fixture", async () => {
    const { context, page } = await newPage(j.browser, WIDE);
    await signIn(page, j.stack.baseUrl, "sales@ostrevane.example", DEMO_PASSWORDS.sales);
    await page.goto(`${j.stack.baseUrl}/admin/sales/requests/${await requestId("Spar cap tool")}`);
    await expect(page.getByTestId("build-pieces").textContent({ timeout: 30_000 })).resolves.toMatch(/Long Axis/);
    await both(page, "estimate-build-staff-spar");
    await page.goto(`${j.stack.baseUrl}/admin/sales/requests/${await requestId("Sandwich panel press fixture")}`);
    await expect(page.getByTestId("build-drying").textContent({ timeout: 30_000 })).resolves.toMatch(/dried 8 h at 80 °C before the first layer.*dryer keeps/);
    await expect(page.getByTestId("build-machining").textContent()).resolves.toMatch(/left as printed/);
    await both(page, "estimate-build-staff-pa-cf");
    await context.close();
  });
});
