import { createClient, type Client } from "@libsql/client";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { launchBrowser, PHONE, shot, startStack, type TestStack } from "./harness";

export const WIDE = { width: 1440, height: 900 };

/**
 * A journey file's shared set-up: the stack and a browser started before its tests and stopped
 * after, a database client for looking rows up, and pictures at both widths. Call at the top of
 * the file; read `j.stack`, `j.browser`, `j.db` inside the tests.
 */
export function journeySetup() {
  const j = {} as { stack: TestStack; browser: Browser; db: Client };
  beforeAll(async () => {
    j.stack = await startStack();
    j.browser = await launchBrowser();
    j.db = createClient({ url: j.stack.dbUrl, timeout: 10_000 });
  }, 180_000);
  afterAll(async () => {
    j.db?.close();
    await j.browser?.close();
    await j.stack?.stop();
  });
  /** The id of the seeded request whose project name starts so. */
  const requestId = async (project: string) => String((await j.db.execute({ sql: "select id from requests where project_name like ?", args: [`${project}%`] })).rows[0]?.id);
  /** The page at 1440 and at 390 px wide (each through `shot`: accessibility and phone-width checks). */
  const both = async (page: Page, name: string) => {
    await page.mouse.move(0, 0);
    await shot(page, `${name}-1440`);
    await page.setViewportSize(PHONE);
    await shot(page, `${name}-390`);
    await page.setViewportSize(WIDE);
  };
  return Object.assign(j, { requestId, both });
}
