/**
 * Security headers and the pages working under them (no CSP violation while the 3D viewer, the
 * charts, an upload to the upload service's origin and the outbox's sandboxed e-mail frame run),
 * session cookie flags, sign-in throttling by HTTP, the password reset journey, and `npm start`
 * refusing to serve in production with a demo secret.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { createClient, type Client } from "@libsql/client";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Session } from "../../lib/scripts/http-client";
import { freePort } from "../../lib/scripts/free-port";
import { E2E_DIST_DIR } from "./global-setup";
import { launchBrowser, newPage, signIn, startStack, type TestStack } from "./harness";
import { addPartWithFile, fillProject, MOLD_STL, waitForEstimate } from "./portal-journey";

let stack: TestStack;
let browser: Browser;
let db: Client;

beforeAll(async () => {
  stack = await startStack();
  browser = await launchBrowser();
  db = createClient({ url: stack.dbUrl, timeout: 10_000 });
}, 240_000);

afterAll(async () => {
  db?.close();
  await browser?.close();
  await stack?.stop();
});

/** Collect CSP violations from the console and from the DOM event, per page. */
async function watchCsp(page: Page): Promise<() => Promise<string[]>> {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to (load|connect|execute|apply|frame)/i.test(m.text())) seen.push(m.text());
  });
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      const w = window as unknown as { __csp?: string[] };
      (w.__csp ??= []).push(`${e.violatedDirective} ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}:${e.columnNumber} on ${location.pathname}`);
    });
  });
  // zod 4 probes once whether eval is allowed (`Function("")` in a try) and, refused, parses
  // without it: that refusal is the policy working, not a broken page.
  const benign = (v: string) => /^script-src eval /.test(v) || /unsafe-eval/.test(v);
  return async () => [...seen, ...((await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []).catch(() => [])) as string[])].filter((v) => !benign(v));
}

async function latestEmailTo(address: string, subject: RegExp): Promise<string> {
  for (let i = 0; i < 60; i++) {
    const r = await db.execute({ sql: "SELECT subject, html FROM email_outbox WHERE to_addresses LIKE ? ORDER BY created_at DESC", args: [`%${address}%`] });
    const row = r.rows.find((x) => subject.test(String(x.subject)));
    if (row) return String(row.html);
    await new Promise((res) => setTimeout(res, 250));
  }
  throw new Error(`no e-mail to ${address} matching ${subject}`);
}

describe("security headers", () => {
  it("every answer carries the CSP, frame-ancestors 'none', nosniff, a referrer and a permissions policy", async () => {
    for (const p of ["/", "/sign-in", "/api/auth/csrf", "/portal"]) {
      const res = await fetch(stack.baseUrl + p, { redirect: "manual" });
      await res.arrayBuffer();
      const csp = res.headers.get("content-security-policy") ?? "";
      expect(csp, p).toMatch(/default-src 'self'/);
      expect(csp, p).toMatch(/frame-ancestors 'none'/);
      expect(csp, p).toMatch(/object-src 'none'/);
      expect(csp, p).toMatch(/connect-src 'self' [^;]*http:\/\/127\.0\.0\.1:\*/);
      expect(res.headers.get("x-content-type-options"), p).toBe("nosniff");
      expect(res.headers.get("referrer-policy"), p).toBe("strict-origin-when-cross-origin");
      expect(res.headers.get("permissions-policy"), p).toMatch(/camera=\(\)/);
      expect(res.headers.get("x-powered-by"), p).toBeNull();
    }
  });

  it("client pages work with no CSP violation: list, 3D viewer and layer chart, a new request with an upload to the upload service", async () => {
    const { context, page } = await newPage(browser);
    const violations = await watchCsp(page);
    await page.goto(stack.baseUrl);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await signIn(page, stack.baseUrl, "lead@caldrith.example", "demo-lead-2026");
    await page.getByRole("table").first().waitFor({ timeout: 30_000 });
    const seeded = await db.execute("SELECT r.id FROM requests r JOIN organisations o ON o.id = r.org_id WHERE o.name LIKE 'Caldrith%' ORDER BY r.stage = 'quoted' DESC LIMIT 1");
    await page.goto(`${stack.baseUrl}/portal/requests/${String(seeded.rows[0]!.id)}`);
    // Pages now poll (analysis progress, the queue's place), so the network never idles: let each settle.
    await settle(page);

    await page.goto(`${stack.baseUrl}/portal/requests/new`);
    await fillProject(page, { name: "Header check tool", neededBy: "2027-06-30", cureC: 120 });
    await page.getByRole("button", { name: "Continue" }).click();
    await addPartWithFile(page, 0, MOLD_STL.file);
    await waitForEstimate(page, 0);
    await page.getByLabel(/Confirm millimetres|Units confirmed/).check();
    await page.getByRole("button", { name: "Continue" }).click();
    // The part review draws the 3D preview (three.js, WebGL) and the layer-time chart (recharts).
    await page
      .locator('[data-testid="part-viewer"] canvas')
      .first()
      .waitFor({ state: "attached", timeout: 60_000 })
      .catch(async (e: Error) => {
        await page.screenshot({ path: "screenshots/hardening-viewer-failure.png", fullPage: true });
        throw new Error(`${e.message}\nCSP violations: ${JSON.stringify(await violations())}\nviewer: ${await page.getByTestId("part-review").first().innerText().catch(() => "(no part review)")}`);
      });
    await expect(page.getByTestId("part-viewer").first().getByRole("alert").count()).resolves.toBe(0);
    await page.locator(".recharts-surface").first().waitFor({ state: "attached", timeout: 30_000 });
    expect(await violations()).toEqual([]);
    await context.close();
  });

  it("staff pages work with no CSP violation: board, ledger, reports and an e-mail in the outbox's sandboxed frame", async () => {
    const { context, page } = await newPage(browser);
    const violations = await watchCsp(page);
    await signIn(page, stack.baseUrl, "admin@ostrevane.example", "demo-admin-2026");
    // An e-mail with styles and an image tag, as the e-mail fake stores it, for the outbox frame.
    await db.execute({
      sql: "INSERT INTO email_outbox (id, provider_id, from_address, to_addresses, subject, html, text, created_at) VALUES (?, 'hdr', 'orders@ostrevane.example', '[\"lead@caldrith.example\"]', 'Header check', ?, 'Header check', ?)",
      args: ["hdr-check-mail", '<html><body style="color:#333"><h1 style="font-size:20px">Quote ready</h1><img src="data:image/gif;base64,R0lGODlhAQABAAAAACw=" alt=""></body></html>', Date.now()],
    });
    const mail = { rows: [{ id: "hdr-check-mail" }] };
    for (const p of ["/admin", "/admin/production", "/admin/accounts", "/admin/production/report", "/admin/sales", "/admin/audit", `/admin/outbox/${String(mail.rows[0]?.id ?? "")}`]) {
      const res = await page.goto(stack.baseUrl + p);
      expect(res?.status(), p).toBeLessThan(400);
      await settle(page);
    }
    const frame = page.locator('iframe[title="Rendered e-mail"]');
    await frame.waitFor();
    expect(await frame.getAttribute("sandbox")).toBe("");
    expect(await violations()).toEqual([]);
    await context.close();
  });
});

describe("sessions and sign-in throttling by HTTP", () => {
  it("the session cookie is HttpOnly, SameSite=Lax, path / (and not Secure over plain http)", async () => {
    const s = new Session(stack.baseUrl);
    const r = await s.signIn("sales@ostrevane.example", "demo-sales-2026");
    expect(r.ok).toBe(true);
    const cookie = r.setCookies.find((c) => c.startsWith("authjs.session-token="))!;
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).toMatch(/;\s*Path=\//i);
    expect(cookie).not.toMatch(/;\s*Secure/i);
  });

  it("five wrong passwords lock the e-mail: the right one is then refused too, and says so", async () => {
    const s = new Session(stack.baseUrl);
    const addr = { "x-forwarded-for": "198.51.100.77" };
    for (let i = 0; i < 5; i++) {
      const r = await s.signIn("lab@tarnavel.example", `wrong-password-${i}`, addr);
      expect(r.ok).toBe(false);
      expect(r.location).toMatch(/error=CredentialsSignin/);
    }
    const locked = await s.signIn("lab@tarnavel.example", "demo-lead-2026", addr);
    expect(locked.ok).toBe(false);
    expect(locked.location).toMatch(/code=locked/);
    const row = await db.execute("SELECT failures, locked_until FROM sign_in_attempts WHERE key = 'email:lab@tarnavel.example'");
    expect(Number(row.rows[0]!.failures)).toBe(5);
    expect(Number(row.rows[0]!.locked_until)).toBeGreaterThan(Date.now());
  });
});

describe("password reset in the browser", () => {
  it("from the sign-in form: link by e-mail, new password, sign in with it; the link then no longer works", async () => {
    const { context, page } = await newPage(browser);
    const violations = await watchCsp(page);
    await page.goto(`${stack.baseUrl}/sign-in`);
    await page.getByRole("link", { name: "Forgot your password?" }).click();
    await page.waitForURL(/\/reset$/);
    await page.getByLabel("E-mail").fill("buyer@bramblewake.example");
    await page.getByRole("button", { name: "E-mail me a reset link" }).click();
    await page.waitForURL(/\/reset\/sent/);
    const html = await latestEmailTo("buyer@bramblewake.example", /Reset your Layerwright password/);
    const link = html.match(/href="([^"]*\/reset\/new\?token=[^"]*)"/)?.[1]?.replaceAll("&amp;", "&");
    expect(link).toBeTruthy();
    const token = new URL(link!).searchParams.get("token")!;
    const stored = await db.execute({ sql: "SELECT count(*) AS n FROM password_reset_tokens WHERE token_hash = ?", args: [token] });
    expect(Number(stored.rows[0]!.n)).toBe(0);

    await page.goto(link!);
    await page.getByLabel("New password", { exact: true }).fill("short");
    await page.getByLabel("New password again").fill("short");
    await page.getByRole("button", { name: "Set new password" }).click();
    await expect(page.getByText("Use at least 10 characters.").waitFor()).resolves.toBeUndefined();
    await page.getByLabel("New password", { exact: true }).fill("hull-plugs-2027");
    await page.getByLabel("New password again").fill("hull-plugs-2027");
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.waitForURL(/\/reset\/done/);
    await signIn(page, stack.baseUrl, "buyer@bramblewake.example", "hull-plugs-2027");
    expect(new URL(page.url()).pathname).toBe("/portal");

    await page.goto(link!);
    await expect(page.getByText(/expired or has already been used/).waitFor()).resolves.toBeUndefined();
    expect(await violations()).toEqual([]);
    await context.close();
  });

  it("an unknown e-mail gets the same page and no message", async () => {
    const { context, page } = await newPage(browser);
    const before = await db.execute("SELECT count(*) AS n FROM email_outbox");
    await page.goto(`${stack.baseUrl}/reset`);
    await page.getByLabel("E-mail").fill("nobody@nowhere.example");
    await page.getByRole("button", { name: "E-mail me a reset link" }).click();
    await page.waitForURL(/\/reset\/sent/);
    await new Promise((r) => setTimeout(r, 1000));
    const after = await db.execute("SELECT count(*) AS n FROM email_outbox");
    expect(Number(after.rows[0]!.n)).toBe(Number(before.rows[0]!.n));
    await context.close();
  });
});

describe("production refuses to start with a demo or missing secret", () => {
  /** `npm start` with this environment; resolves with its exit code and what it printed (or "running" if it served). */
  async function npmStart(env: Record<string, string>): Promise<{ code: number | "running"; output: string }> {
    const port = await freePort();
    // A throwaway data folder, should the server start after all.
    const dataDir = mkdtempSync(path.join(os.tmpdir(), "layerwright-prod-"));
    const child: ChildProcess = spawn("npm", ["start", "--", "-p", String(port), "-H", "127.0.0.1"], {
      cwd: path.resolve(import.meta.dirname, "../.."),
      env: {
        PATH: process.env.PATH ?? "",
        HOME: process.env.HOME ?? "",
        NEXT_DIST_DIR: E2E_DIST_DIR,
        NEXT_TELEMETRY_DISABLED: "1",
        WEB_CONCURRENCY: "2",
        NODE_ENV: "production",
        DATA_DIR: dataDir,
        DATABASE_URL: `file:${path.join(dataDir, "layerwright.db")}`,
        ...env,
      },
      stdio: ["ignore", "pipe", "pipe"],
      detached: true,
    });
    let output = "";
    let exitCode: number | null = null;
    child.stdout?.on("data", (d) => (output += d));
    child.stderr?.on("data", (d) => (output += d));
    const exited = new Promise<number>((resolve) => child.once("exit", (code) => resolve((exitCode = code ?? -1))));
    const served = async (): Promise<number | "running"> => {
      for (let i = 0; i < 240 && exitCode === null; i++) {
        if (await fetch(`http://127.0.0.1:${port}/api/health`).then(() => true, () => false)) return "running";
        await new Promise((r) => setTimeout(r, 500));
      }
      return exited;
    };
    const code = await Promise.race<number | "running">([exited, served()]);
    if (exitCode === null) {
      process.kill(-(child.pid ?? 0), "SIGTERM");
      await exited;
    }
    rmSync(dataDir, { recursive: true, force: true });
    return { code, output };
  }

  const good = {
    NODE_ENV: "production",
    APP_URL: "https://portal.ostrevane.example",
    AUTH_SECRET: "a-deployment-secret-of-at-least-32-characters",
    STRIPE_SECRET_KEY: "sk_live_placeholder_for_the_test",
    STRIPE_WEBHOOK_SECRET: "whsec_placeholder_for_the_test",
    RESEND_API_KEY: "re_placeholder_for_the_test",
    UPLOADTHING_TOKEN: "placeholder-upload-token",
  };

  it("the published demo sign-in and webhook secrets: exit 78, naming each variable and never its value", async () => {
    const r = await npmStart({ ...good, AUTH_SECRET: "layerwright-local-demo-secret-change-me", STRIPE_WEBHOOK_SECRET: "whsec_layerwright_local" });
    expect(r.code, r.output.slice(-2000)).toBe(78);
    expect(r.output).toMatch(/will not start/);
    expect(r.output).toMatch(/AUTH_SECRET is the published demo value/);
    expect(r.output).toMatch(/STRIPE_WEBHOOK_SECRET is the published demo value/);
    expect(r.output).not.toMatch(/layerwright-local-demo-secret-change-me|whsec_layerwright_local/);
  }, 180_000);

  it("missing secrets and app URL: exit 78, each one named", async () => {
    const r = await npmStart({});
    expect(r.code, r.output.slice(-2000)).toBe(78);
    for (const name of ["APP_URL", "AUTH_SECRET", "STRIPE_SECRET_KEY", "STRIPE_WEBHOOK_SECRET", "RESEND_API_KEY", "UPLOADTHING_TOKEN"]) expect(r.output).toMatch(new RegExp(`${name} is not set`));
  }, 180_000);
});

/** Loaded, then a moment for late scripts and fetches to run and any CSP violation to be reported. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("load");
  await page.waitForTimeout(2000);
}
