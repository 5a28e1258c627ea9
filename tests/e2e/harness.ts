/**
 * Browser-test harness: a fresh data folder and database (migrated and seeded with the demo),
 * the local fakes and `next start` on free loopback ports, and Debian's chromium driven by
 * playwright-core.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { openDb } from "../../db/client";
import { seed } from "../../db/seed";
import { demoSignInCode } from "../../lib/scripts/demo-code";
import { freePort } from "../../lib/scripts/free-port";
import { migrateDatabase } from "../../lib/scripts/migrate";
import { startStack as startProcesses, type RunningStack } from "../../lib/scripts/stack";
import { E2E_DIST_DIR } from "./global-setup";

export interface TestStack extends RunningStack {
  dataDir: string;
  ports: { app: number; stripe: number; resend: number; uploads: number };
  dbUrl: string;
}

export async function startStack(): Promise<TestStack> {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), "layerwright-e2e-"));
  const ports = { app: await freePort(), stripe: await freePort(), resend: await freePort(), uploads: await freePort() };
  const dbUrl = `file:${path.join(dataDir, "layerwright.db")}`;
  await migrateDatabase(dbUrl);
  const { db, client } = openDb(dbUrl);
  await seed(db, { dataDir, fileBaseUrl: `http://localhost:${ports.uploads}/f`, quiet: true });
  client.close();
  const stack = await startProcesses({ ports, dataDir, distDir: E2E_DIST_DIR, quiet: !process.env.E2E_VERBOSE });
  return {
    ...stack,
    dataDir,
    ports,
    dbUrl,
    stop: async () => {
      await stack.stop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export const CHROMIUM_ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: CHROMIUM_ARGS });
}

export const DESKTOP = { width: 1280, height: 860 };
export const PHONE = { width: 390, height: 844 };

export async function newPage(browser: Browser, viewport = DESKTOP): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  return { context, page };
}

/** Sign in through the real form; demo staff then type the code their authenticator app would show. */
export async function signIn(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel("E-mail", { exact: true }).fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  const code = await demoSignInCode(email);
  if (code) {
    await page.getByLabel("Code", { exact: true }).fill(code);
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
  }
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 });
}

/** Save a screenshot under screenshots/ (gitignored) for people to look at. */
export async function shot(page: Page, name: string) {
  const dir = path.resolve(import.meta.dirname, "../../screenshots");
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}
