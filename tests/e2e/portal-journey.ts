/**
 * Page steps of the client journey (sign up → request → upload → preview and estimate → submit;
 * accept a quote → pay on the fake checkout → back at deposit_paid). Used by portal.e2e.ts.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { binaryStl, layupMold } from "../../mocks/fixtures/meshes";

export const MOLD_STL = (() => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "lw-portal-e2e-"));
  const file = path.join(dir, "wing-rib-tool.stl");
  writeFileSync(file, binaryStl(layupMold()));
  const bad = path.join(dir, "drawing.stl");
  writeFileSync(bad, "%PDF-1.7\n% not a mesh\n");
  return { file, bad };
})();

export async function signUp(page: Page, baseUrl: string, who: { name: string; firm: string; email: string; password: string }) {
  await page.goto(`${baseUrl}/sign-up`);
  await page.getByLabel("Your name").fill(who.name);
  await page.getByLabel("Firm").fill(who.firm);
  await page.getByLabel("Work e-mail").fill(who.email);
  await page.getByLabel("Password").fill(who.password);
  await page.getByLabel("Street address").fill("14 Quarry Lane");
  await page.getByLabel("Town or city").fill("Fennick Cross");
  await page.getByLabel("State").selectOption("KS");
  await page.getByLabel("Postal code").fill("66002");
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL((u) => u.pathname === "/portal", { timeout: 60_000 });
}

export async function fillProject(page: Page, p: { name: string; neededBy: string; cureC: number }) {
  await page.getByLabel("Project name").fill(p.name);
  await page.getByLabel("Needed by").fill(p.neededBy);
  await page.getByLabel("Cure process").selectOption("autoclave");
  await page.getByLabel("Cure temperature", { exact: true }).fill(String(p.cureC));
}

/** Add a part and upload a file to it; waits for the upload to be checked. */
export async function addPartWithFile(page: Page, index: number, file: string) {
  await page.getByRole("button", { name: "+ Add a part" }).click();
  await page.locator(`[id="parts.${index}.file"]`).setInputFiles(file);
}

export async function waitForEstimate(page: Page, index: number, timeout = 120_000) {
  await page.getByTestId(`part-card-${index}`).getByTestId("part-summary").waitFor({ timeout });
}

/** Pay on the fake checkout page with a test card; returns the page's alert text on decline. */
export async function payOnFakeCheckout(page: Page, card: string) {
  await page.getByLabel("Test card number").fill(card);
  await page.getByRole("button", { name: /^Pay / }).click();
}
