/**
 * Browser-test harness: a fresh data folder and database (migrated and seeded with the demo),
 * the local fakes and `next start` on free loopback ports, and Debian's chromium driven by
 * playwright-core.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import AxeBuilder from "@axe-core/playwright";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { openDb } from "../../db/client";
import { seed } from "@/lib/seed/seed";
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
  // E2E_PORT_BASE=N keeps the run on N…N+3 (app, payment, e-mail, uploads)
  const base = Number(process.env.E2E_PORT_BASE);
  const ports = Number.isInteger(base) && base > 0
    ? { app: base, stripe: base + 1, resend: base + 2, uploads: base + 3 }
    : { app: await freePort(), stripe: await freePort(), resend: await freePort(), uploads: await freePort() };
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

/**
 * The page's serious and critical accessibility violations (axe-core's WCAG 2.1 A and AA rules),
 * one line each: the rule, its help text and the first few elements at fault.
 */
export async function accessibilityProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(" ")).join(", ")}${v.nodes.length > 3 ? ` and ${v.nodes.length - 3} more` : ""}`);
}

/**
 * On a phone-wide page, whether the page itself scrolls sideways (a table may, inside its own
 * scroller): one line naming the widest element that sticks out, or nothing.
 */
export async function sidewaysScroll(page: Page): Promise<string[]> {
  const width = page.viewportSize()?.width ?? 0;
  if (width > 400) return [];
  const out = await page.evaluate(() => {
    const doc = document.documentElement;
    if (doc.scrollWidth <= window.innerWidth + 1) return null;
    let worst: { tag: string; right: number } | null = null;
    for (const el of Array.from(document.body.querySelectorAll("*"))) {
      const r = el.getBoundingClientRect();
      if (r.right > window.innerWidth + 1 && (!worst || r.right > worst.right)) {
        const cls = typeof el.className === "string" ? el.className.split(" ").slice(0, 3).join(".") : "";
        worst = { tag: `${el.tagName.toLowerCase()}${cls ? `.${cls}` : ""}`, right: Math.round(r.right) };
      }
    }
    return { scrollWidth: doc.scrollWidth, innerWidth: window.innerWidth, worst };
  });
  return out ? [`sideways scroll (layout): the page is ${out.scrollWidth} px wide in a ${out.innerWidth} px window${out.worst ? `; widest: ${out.worst.tag} to ${out.worst.right} px` : ""}`] : [];
}

/**
 * Save a screenshot under screenshots/ (gitignored) for people to look at, after checking the page
 * as it is then with axe, and at phone width for a page that scrolls sideways: every page a journey
 * shows people is a page that must pass, so a serious or critical violation, or a phone page wider
 * than the phone, fails the journey, naming the page (E2E_AXE=report only lists them).
 */
export async function shot(page: Page, name: string) {
  const dir = path.resolve(import.meta.dirname, "../../screenshots");
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
  const problems = [...(await accessibilityProblems(page)), ...(await sidewaysScroll(page))];
  // E2E_AXE=report lists every page's violations and lets the journeys go on (to see them all at once).
  if (problems.length && process.env.E2E_AXE === "report") console.log(`accessibility: ${name}\n${problems.join("\n")}`);
  else if (problems.length) throw new Error(`accessibility: ${name} (${page.url()}) has ${problems.length} accessibility or layout problems:\n${problems.join("\n")}`);
}
