/**
 * Hostile input across the app, by HTTP against the production build: every route handler under
 * app/api and every server action (found in the build's server-reference manifest) is sent
 * missing auth, malformed bodies, wrong types, huge strings, unknown fields, another firm's ids
 * and path traversal. Each must answer 4xx (or an action's `{ ok: false }`) with a plain message,
 * never a stack trace, and nothing may be written. Then, as an attacker would: forged Host and
 * forwarded-for headers, an off-site redirect after sign-in, parallel password guessing, and a
 * copied session cookie after a sign-out and after a password reset.
 */
import { request as httpRequest } from "node:http";
import { createClient, type Client } from "@libsql/client";
import type { Browser } from "playwright-core";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { tableChecksums } from "../../lib/scripts/db-backup";
import { listActions, Session } from "../../lib/scripts/http-client";
import { E2E_DIST_DIR } from "./global-setup";
import { launchBrowser, newPage, startStack, type TestStack } from "./harness";

let stack: TestStack;
let db: Client;
let lead: Session; // Caldrith client_admin
let admin: Session;
let anon: Session;
let before: Awaited<ReturnType<typeof tableChecksums>>;
const other: Record<string, string> = {};

/**
 * Tables that legitimately change while we probe (sign-in counters, the download audit, the daily
 * retention job's once-a-day mark).
 */
const VOLATILE = new Set(["sign_in_attempts", "audit_log", "sessions", "verification_tokens", "email_outbox", "bureau_settings"]);
const STACK_TRACE = /\bat [\w.<>$]+ \(|node_modules|\/work\/|\.tsx?:\d+:\d+|webpack-internal|\bTypeError\b|\bReferenceError\b/;
const HUGE = "x".repeat(200_000);
const TRAVERSAL = ["../../etc/passwd", "..%2F..%2Fetc%2Fpasswd", "%2e%2e%2f%2e%2e%2fdata%2flayerwright.db", "....//....//etc/passwd"];

beforeAll(async () => {
  stack = await startStack();
  db = createClient({ url: stack.dbUrl, timeout: 10_000 });
  anon = new Session(stack.baseUrl);
  lead = new Session(stack.baseUrl);
  admin = new Session(stack.baseUrl);
  expect((await lead.signIn("lead@caldrith.example", "demo-lead-2026")).ok).toBe(true);
  expect((await admin.signIn("admin@ostrevane.example", "demo-admin-2026")).ok).toBe(true);
  // Another firm's records, for cross-firm probes by the Caldrith lead.
  const q = async (sql: string) => String((await db.execute(sql)).rows[0]?.id ?? "");
  const bramble = "(SELECT id FROM organisations WHERE name LIKE 'Bramblewake%')";
  other.requestId = await q(`SELECT id FROM requests WHERE org_id = ${bramble} LIMIT 1`);
  other.orderId = await q(`SELECT id FROM orders WHERE org_id = ${bramble} LIMIT 1`);
  other.quoteId = await q(`SELECT q.id FROM quotes q JOIN requests r ON r.id = q.request_id WHERE r.org_id = ${bramble} LIMIT 1`);
  other.partId = await q(`SELECT p.id FROM parts p JOIN requests r ON r.id = p.request_id WHERE r.org_id = ${bramble} LIMIT 1`);
  other.uploadId = await q(`SELECT id FROM uploads WHERE org_id = ${bramble} LIMIT 1`);
  other.revisionId = await q(`SELECT f.id FROM file_revisions f JOIN parts p ON p.id = f.part_id JOIN requests r ON r.id = p.request_id WHERE r.org_id = ${bramble} LIMIT 1`);
  other.analysisId = await q(`SELECT a.id FROM analyses a JOIN file_revisions f ON f.id = a.revision_id JOIN parts p ON p.id = f.part_id JOIN requests r ON r.id = p.request_id WHERE r.org_id = ${bramble} LIMIT 1`);
  other.userId = await q("SELECT id FROM users WHERE email = 'buyer@bramblewake.example'");
  other.paymentId = await q(`SELECT id FROM payments WHERE org_id = ${bramble} LIMIT 1`);
  for (const [k, v] of Object.entries(other)) expect(v, k).not.toBe("");
  before = await tableChecksums(db);
}, 240_000);

afterAll(async () => {
  db?.close();
  await stack?.stop();
});

interface Answer {
  label: string;
  status: number;
  text: string;
}

/** Plain 4xx with a message and no stack. */
function expectRefusal(a: Answer, statuses: number[] = [400, 401, 403, 404, 405, 413, 415, 422, 429]) {
  expect(statuses, `${a.label} → ${a.status}: ${a.text.slice(0, 200)}`).toContain(a.status);
  expect(a.text, `${a.label}: stack trace in the answer`).not.toMatch(STACK_TRACE);
}

async function call(s: Session, label: string, p: string, init: RequestInit = {}): Promise<Answer> {
  const res = await s.fetch(p, init);
  return { label, status: res.status, text: await res.text() };
}

const json = (body: unknown): RequestInit => ({ method: "POST", headers: { "content-type": "application/json" }, body: typeof body === "string" ? body : JSON.stringify(body) });

const PORTAL_GETS = ["/api/portal/me", "/api/portal/requests", "/api/portal/requests/ID", "/api/portal/requests/ID/documents", "/api/portal/analyses/ID", "/api/portal/revisions/ID/mesh", "/api/files/ID", "/api/documents/ID"];
const ADMIN_GETS = ["audit", "board", "calendar", "catalogue", "inbox", "ledger", "ledger/export", "quotes", "reconciliation", "reports/actuals", "staff"].map((p) => `/api/admin/${p}`);

describe("route handlers", () => {
  it("signed out: every private route answers 401 with a message", async () => {
    for (const p of [...PORTAL_GETS, ...ADMIN_GETS]) expectRefusal(await call(anon, `GET ${p}`, p.replace("ID", other.requestId!)), [401]);
    expectRefusal(await call(anon, "POST /api/estimate", "/api/estimate", json({ uploadId: other.uploadId })), [401]);
  });

  it("a client on the staff routes: 403 or 404, never data", async () => {
    for (const p of ADMIN_GETS) expectRefusal(await call(lead, `GET ${p}`, p), [403, 404]);
  });

  it("another firm's ids answer 404 on every client route", async () => {
    expectRefusal(await call(lead, "request", `/api/portal/requests/${other.requestId}`), [404]);
    expectRefusal(await call(lead, "documents", `/api/portal/requests/${other.requestId}/documents`), [404]);
    expectRefusal(await call(lead, "document", `/api/documents/${other.requestId}`), [404]);
    expectRefusal(await call(lead, "analysis", `/api/portal/analyses/${other.analysisId}`), [404]);
    expectRefusal(await call(lead, "mesh", `/api/portal/revisions/${other.revisionId}/mesh`), [404]);
    expectRefusal(await call(lead, "file", `/api/files/${other.uploadId}`), [404]);
    expectRefusal(await call(lead, "estimate", "/api/estimate", json({ uploadId: other.uploadId })), [404]);
  });

  it("path traversal, huge and odd ids: 4xx, no stack", async () => {
    for (const bad of [...TRAVERSAL, "x".repeat(5000), "%00", "'; DROP TABLE requests; --", "\u202e\u0000"]) {
      const id = bad.includes("%") ? bad : encodeURIComponent(bad);
      for (const p of ["/api/portal/requests/", "/api/portal/analyses/", "/api/files/"]) expectRefusal(await call(lead, `GET ${p}${bad.slice(0, 20)}`, `${p}${id}`));
      expectRefusal(await call(lead, `mesh ${bad.slice(0, 20)}`, `/api/portal/revisions/${id}/mesh`));
    }
  });

  it("list query parameters of the wrong type or range: 400 with the field named", async () => {
    for (const qs of ["limit=abc", "limit=-5", "limit=1000000", "offset=-1", "sort=drop_table", "dir=sideways", `q=${"x".repeat(5000)}`, "stage[]=a&stage[]=b"]) {
      const a = await call(lead, `list ?${qs.slice(0, 30)}`, `/api/portal/requests?${qs}`);
      if (a.status === 200) continue; // ignored harmlessly is also acceptable for unknown shapes
      expectRefusal(a, [400]);
    }
    for (const qs of ["from=yesterday", "from=2026-13-45", `cell=${"x".repeat(3000)}`]) {
      const a = await call(admin, `calendar ?${qs.slice(0, 30)}`, `/api/admin/calendar?${qs}`);
      if (a.status !== 200) expectRefusal(a, [400, 404]);
    }
  });

  it("the estimate API: malformed JSON, wrong types, unknown fields, huge strings → 400", async () => {
    const bodies: unknown[] = ["{not json", "", "[]", "null", { uploadId: 42 }, { uploadId: HUGE }, { uploadId: "u", options: { allowanceMm: "ten" } }, { uploadId: "u", options: { nope: true } }, { uploadId: "u", options: { quantity: 1e9 } }, { uploadId: "u", extra: { deep: [1, 2, 3] }, options: { orientation: "diagonal" } }];
    for (const b of bodies) expectRefusal(await call(lead, `estimate ${JSON.stringify(b).slice(0, 40)}`, "/api/estimate", json(b)), [400, 404, 413]);
    expectRefusal(await call(lead, "estimate as text/plain", "/api/estimate", { method: "POST", headers: { "content-type": "text/plain" }, body: "uploadId=1" }), [400, 415]);
  });

  it("the webhook refuses unsigned, forged and garbage events with 400", async () => {
    expectRefusal(await call(anon, "no signature", "/api/webhooks/stripe", json({ id: "evt_x", type: "checkout.session.completed" })), [400]);
    expectRefusal(await call(anon, "forged", "/api/webhooks/stripe", { method: "POST", headers: { "content-type": "application/json", "stripe-signature": "t=1,v1=deadbeef" }, body: "{}" }), [400]);
    expectRefusal(await call(anon, "garbage", "/api/webhooks/stripe", { method: "POST", headers: { "stripe-signature": "garbage" }, body: HUGE }), [400, 413]);
  });

  it("uploads: signed out, unknown slug, forged callback and traversal in the file name", async () => {
    const start = (s: Session, slug: string, name: string, size = 100) =>
      call(s, `upload ${slug} ${name.slice(0, 20)}`, `/api/uploadthing?actionType=upload&slug=${slug}`, {
        method: "POST",
        headers: { "content-type": "application/json", "x-uploadthing-package": "@uploadthing/react", "x-uploadthing-version": "7.7.4" },
        body: JSON.stringify({ files: [{ name, size, type: "model/stl", lastModified: 0 }], input: null }),
      });
    expectRefusal(await start(anon, "model", "part.stl"), [400, 401, 403]);
    expectRefusal(await start(lead, "nope", "part.stl"), [400, 404]);
    expectRefusal(await start(lead, "model", "huge.stl", 10 * 1024 ** 3), [400, 413]);
    const forged = await call(anon, "forged callback", "/api/uploadthing?slug=model", {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": "hmac-sha256=00" },
      body: JSON.stringify({ status: "uploaded", file: { key: "../../etc/passwd", name: "x", size: 1 }, metadata: { userId: other.userId } }),
    });
    expectRefusal(forged, [400, 401, 403]);
    // A traversal name is only a label: the presigned key is the service's own, in its own alphabet.
    for (const name of TRAVERSAL) {
      const a = await start(lead, "model", name);
      if (a.status === 200) {
        const [p] = JSON.parse(a.text) as { key: string; url: string }[];
        expect(p!.key).toMatch(/^[A-Za-z0-9_-]+$/);
      } else expectRefusal(a);
    }
  });
});

/** Arguments an action should refuse, by the shape it expects. */
function hostileArgs(isStaff: boolean): { label: string; args: unknown[] | string }[] {
  // Staff may open every firm's records, so they get ids that exist nowhere instead.
  const none = "7c1f0e2a-0000-4000-8000-000000000000";
  const ids = isStaff
    ? { requestId: none, orderId: none, quoteId: none, partId: none, uploadId: none, userId: none, paymentId: none }
    : { requestId: other.requestId, orderId: other.orderId, quoteId: other.quoteId, partId: other.partId, uploadId: other.uploadId, userId: other.userId, paymentId: other.paymentId };
  return [
    { label: "no arguments", args: [] },
    { label: "null", args: [null] },
    { label: "a string", args: ["hello"] },
    { label: "a number", args: [42] },
    { label: "an array", args: [[1, 2, 3]] },
    { label: "unknown fields only", args: [{ isAdmin: true, role: "admin", __proto__: { polluted: 1 } }] },
    { label: "wrong types", args: [{ requestId: 1, orderId: true, body: {}, email: [], amountCents: "lots", to: 5, role: null, params: "x" }] },
    { label: "huge strings", args: [{ requestId: HUGE, orderId: HUGE, body: HUGE, email: HUGE, name: HUGE, projectName: HUGE, reason: HUGE, key: HUGE }] },
    // Well-formed apart from the ids, which are another firm's (or, for staff, unknown shapes).
    { label: "another firm's ids", args: [{ ...ids, id: other.requestId, body: "hello", to: "closed", kind: "deposit", amountCents: 100, reason: "r", idempotencyKey: "k-hostile", parts: [] }] },
    { label: "traversal in names", args: [{ ...ids, fileName: "../../etc/passwd", name: "../../../data/layerwright.db", key: "../x", projectName: "..\\..\\boot.ini" }] },
  ];
}

describe("server actions", () => {
  const actions = listActions(E2E_DIST_DIR);
  const AUTH_FORMS = new Set(["signInWithPassword", "requestMagicLink", "signUp", "signOutAction", "requestPasswordResetAction", "resetPasswordAction"]);

  it("the build has the actions we expect to probe", () => {
    const names = actions.map((a) => a.name);
    for (const n of ["moveStage", "saveQuote", "refundPayment", "saveDraft", "acceptQuote", "postMessage", "inviteMember"]) expect(names).toContain(n);
  });

  it("signed out, every action refuses and writes nothing", async () => {
    for (const a of actions.filter((x) => !AUTH_FORMS.has(x.name))) {
      const r = await anon.callAction(a, [{ requestId: other.requestId, orderId: other.orderId, body: "x" }]);
      expect(r.text, `${a.name}: stack trace`).not.toMatch(STACK_TRACE);
      const result = r.result as { ok?: boolean; code?: string } | null;
      const refused = (result && result.ok === false) || (r.status >= 300 && r.status < 500);
      expect(refused, `${a.name} signed out → ${r.status} ${r.text.slice(0, 200)}`).toBe(true);
      if (result) expect(result.code, a.name).toMatch(/unauthenticated|forbidden|invalid_input|not_found/);
    }
  });

  it("signed in with the right role, hostile arguments get { ok: false } with a message, never a stack", async () => {
    const failures: string[] = [];
    for (const a of actions.filter((x) => !AUTH_FORMS.has(x.name))) {
      const isStaff = a.file.startsWith("app/admin");
      const s = isStaff ? admin : lead;
      for (const h of hostileArgs(isStaff)) {
        const r = await s.callAction(a, h.args);
        const label = `${a.name} (${h.label}) → ${r.status} ${r.text.replace(/\s+/g, " ").slice(0, 160)}`;
        const result = r.result as { ok?: boolean; code?: string; message?: string } | null;
        if (STACK_TRACE.test(r.text)) failures.push(`${label}: stack trace`);
        else if (result) {
          if (result.ok !== false || result.code === "internal" || !result.message) failures.push(label);
        } else if (!(r.status >= 400 && r.status < 500)) failures.push(label);
      }
    }
    expect(failures).toEqual([]);
  });

  it("a replayed or scripted hold or cancel without its confirmation is refused (the final pass checks nothing was written)", async () => {
    const moveStage = actions.find((a) => a.name === "moveStage" && a.file.includes("admin/production"))!;
    const orderId = String((await db.execute("SELECT o.id FROM orders o JOIN requests r ON r.id = o.request_id WHERE r.stage = 'scheduled' LIMIT 1")).rows[0]!.id);
    for (const args of [
      { orderId, to: "on_hold", note: "replayed" },
      { orderId, to: "cancelled", note: "replayed without the confirmation" },
      { orderId, to: "cancelled", note: "confirmation for another move", confirm: "on_hold" },
      { orderId, to: "cancelled", note: "confirmed but", confirm: "yes" },
    ]) {
      const r = await admin.callAction(moveStage, [args]);
      expect(r.result, JSON.stringify(args)).toMatchObject({ ok: false, code: "invalid_input:confirmation" });
      expect((r.result as { message: string }).message).toMatch(/Nothing was changed/);
    }
    const r = await admin.callAction(moveStage, [{ orderId, to: "cancelled", confirm: "cancelled" }]);
    expect(r.result).toMatchObject({ ok: false, code: "invalid_input", fieldErrors: { note: [expect.stringMatching(/reason/)] } });
  });

  it("the auth forms refuse garbage with a 4xx or { ok: false } and write nothing", async () => {
    const failures: string[] = [];
    for (const a of actions.filter((x) => AUTH_FORMS.has(x.name) && x.name !== "signOutAction")) {
      for (const h of [{ label: "no arguments", args: [] as unknown[] }, { label: "null", args: [null, null] }]) {
        const r = await anon.callAction(a, h.args);
        const label = `${a.name} (${h.label}) → ${r.status} ${r.text.replace(/\s+/g, " ").slice(0, 160)}`;
        const result = r.result as { ok?: boolean } | null;
        if (STACK_TRACE.test(r.text)) failures.push(`${label}: stack trace`);
        else if (!((result && result.ok === false) || (r.status >= 400 && r.status < 500))) failures.push(label);
      }
    }
    expect(failures).toEqual([]);
  });
});

describe("server actions: bodies the framework cannot decode", () => {
  it("answer without a stack trace and write nothing (Next.js answers 500 with an error digest, before our code runs)", async () => {
    for (const a of listActions(E2E_DIST_DIR)) {
      const r = await admin.callAction(a, "{[not json");
      expect(r.text, a.name).not.toMatch(STACK_TRACE);
      expect(r.status === 500 ? /"digest"/.test(r.text) : r.status >= 400 && r.status < 500, `${a.name} → ${r.status} ${r.text.slice(0, 200)}`).toBe(true);
    }
  });
});

describe("after the whole pass", () => {
  it("nothing was written outside the sign-in counters and the audit of refused downloads", async () => {
    const after = await tableChecksums(db);
    const changed = Object.keys(after).filter((t) => !VOLATILE.has(t) && JSON.stringify(after[t]) !== JSON.stringify(before[t]));
    expect(changed).toEqual([]);
    const integrity = await db.execute("PRAGMA integrity_check");
    expect(String(Object.values(integrity.rows[0]!)[0])).toBe("ok");
  });
});

/**
 * Probes that change sign-in state (after the write check above): forged Host and forwarded-for
 * headers, an off-site redirect after sign-in, parallel password guessing, and a session cookie
 * copied before a sign-out or a password reset.
 */
describe("probes from outside", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
  });
  // Each probe starts with no sign-in counters (they all come from this one address).
  afterEach(async () => {
    await db.execute("DELETE FROM sign_in_attempts");
  });

  async function latestEmailTo(address: string, subject: RegExp, after: number): Promise<string> {
    for (let i = 0; i < 80; i++) {
      const r = await db.execute({ sql: "SELECT subject, html, created_at FROM email_outbox WHERE to_addresses LIKE ? ORDER BY created_at DESC", args: [`%${address}%`] });
      const row = r.rows.find((x) => subject.test(String(x.subject)) && Number(x.created_at) >= after);
      if (row) return String(row.html);
      await new Promise((res) => setTimeout(res, 250));
    }
    throw new Error(`no e-mail to ${address} matching ${subject}`);
  }

  /** A request with any Host header (fetch would replace it with the URL's). */
  function rawPost(pathname: string, headers: Record<string, string>, body: string): Promise<{ status: number; location: string }> {
    const url = new URL(pathname, stack.baseUrl);
    return new Promise((resolve, reject) => {
      const req = httpRequest({ host: url.hostname, port: url.port, path: url.pathname, method: "POST", headers: { ...headers, "content-length": Buffer.byteLength(body) } }, (res) => {
        res.resume();
        res.on("end", () => resolve({ status: res.statusCode ?? 0, location: String(res.headers.location ?? "") }));
      });
      req.on("error", reject);
      req.end(body);
    });
  }

  it("a forged Host or X-Forwarded-Host never reaches the link in a sign-in e-mail", async () => {
    const forgeries: Record<string, string>[] = [{ host: "evil.example" }, { "x-forwarded-host": "evil.example", "x-forwarded-proto": "https" }];
    for (const forged of forgeries) {
      const since = Date.now() - 1000;
      const s = new Session(stack.baseUrl);
      const { csrfToken } = (await (await s.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
      const body = new URLSearchParams({ csrfToken, email: "engineer@caldrith.example", callbackUrl: "/after-sign-in" }).toString();
      const headers = { host: new URL(stack.baseUrl).host, "content-type": "application/x-www-form-urlencoded", cookie: s.cookieHeader, ...forged };
      const r = await rawPost("/api/auth/signin/email", headers, body);
      expect(r.status, JSON.stringify(forged)).toBeLessThan(400);
      expect(r.location).not.toMatch(/evil\.example/);
      const html = await latestEmailTo("engineer@caldrith.example", /sign-in link/, since);
      const link = html.match(/href="([^"]*\/api\/auth\/callback\/email[^"]*)"/)?.[1]?.replaceAll("&amp;", "&");
      expect(link, JSON.stringify(forged)).toBeTruthy();
      expect(new URL(link!).origin, JSON.stringify(forged)).toBe(new URL(stack.baseUrl).origin);
      expect(html).not.toMatch(/evil\.example/);
    }
  });

  it("a forged X-Forwarded-For neither dodges the per-address limit nor reaches the audit log", async () => {
    // 31 wrong passwords for 31 different (unknown) accounts, each claiming another address.
    for (let i = 0; i < 31; i += 8) {
      await Promise.all(
        Array.from({ length: Math.min(8, 31 - i) }, (_, k) => new Session(stack.baseUrl).signIn(`nobody${i + k}@nowhere.example`, "guess", { "x-forwarded-for": `203.0.113.${i + k + 1}` })),
      );
    }
    // The 32nd, the right password of a real account from yet another claimed address, is refused:
    // the limit counts the connection's own address.
    const r = await new Session(stack.baseUrl).signIn("engineer@caldrith.example", "demo-client-2026", { "x-forwarded-for": "203.0.113.200" });
    expect(r.ok).toBe(false);
    expect(r.location).toMatch(/code=locked/);
    const forgedKeys = await db.execute("SELECT key FROM sign_in_attempts WHERE key LIKE '%203.0.113.%'");
    expect(forgedKeys.rows).toEqual([]);

    // The audit log records the connection's address, not the claimed one.
    await db.execute("DELETE FROM sign_in_attempts");
    expectRefusal(await call(lead, "file", `/api/files/${other.uploadId}`, { headers: { "x-forwarded-for": "198.51.100.250" } }), [404]);
    const audit = await db.execute("SELECT ip FROM audit_log WHERE action = 'file.download_refused' ORDER BY rowid DESC LIMIT 1");
    expect(String(audit.rows[0]?.ip)).not.toMatch(/198\.51\.100\.250/);
    expect(String(audit.rows[0]?.ip)).toMatch(/^(127\.0\.0\.1|::1)$/);
  });

  it("a tab-slash callback (/%09/evil.example/pwned) never takes the browser off the site after sign-in", async () => {
    const { context, page } = await newPage(browser);
    const offSite: string[] = [];
    page.on("request", (req) => {
      if (new URL(req.url()).hostname.endsWith("evil.example")) offSite.push(req.url());
    });
    await page.route((url) => url.hostname.endsWith("evil.example"), (route) => route.abort());
    await page.goto(`${stack.baseUrl}/sign-in?callbackUrl=/%09/evil.example/pwned`);
    // The page does not carry the hostile destination into its form …
    expect(await page.locator('input[name="callbackUrl"]').inputValue()).toBe("");
    // … and the action refuses it when it is posted anyway.
    await page.locator('input[name="callbackUrl"]').evaluate((el) => ((el as HTMLInputElement).value = "/\t/evil.example/pwned"));
    await page.getByLabel("E-mail", { exact: true }).fill("engineer@caldrith.example");
    await page.getByLabel("Password").fill("demo-client-2026");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 }).catch(() => undefined);
    expect(offSite).toEqual([]);
    expect(new URL(page.url()).origin).toBe(new URL(stack.baseUrl).origin);
    expect(new URL(page.url()).pathname).toBe("/portal");
    await context.close();
  });

  it("40 parallel wrong passwords for one account: none gets in, the count is not lost, and the right password is then refused", async () => {
    const email = "engineer@caldrith.example";
    const answers = await Promise.all(Array.from({ length: 40 }, (_, i) => new Session(stack.baseUrl).signIn(email, `wrong-${i}`)));
    expect(answers.filter((a) => a.ok)).toEqual([]);
    const row = await db.execute({ sql: "SELECT failures, locked_until FROM sign_in_attempts WHERE key = ?", args: [`email:${email}`] });
    expect(Number(row.rows[0]?.failures)).toBeGreaterThanOrEqual(5);
    expect(Number(row.rows[0]?.locked_until)).toBeGreaterThan(Date.now());
    // The address's own count (40 from here) is set aside: the e-mail's lock alone refuses the right password.
    await db.execute("DELETE FROM sign_in_attempts WHERE key LIKE 'addr:%'");
    const right = await new Session(stack.baseUrl).signIn(email, "demo-client-2026");
    expect(right.ok).toBe(false);
    expect(right.location).toMatch(/code=locked/);
  });

  /** Sign in, and a second client holding a copy of the session cookie (as a stolen one would be used). */
  async function signedInTwice(email: string, password: string): Promise<[Session, Session]> {
    const original = new Session(stack.baseUrl);
    expect((await original.signIn(email, password)).ok).toBe(true);
    const copy = original.clone();
    expect((await copy.fetch("/api/portal/requests")).status).toBe(200);
    return [original, copy];
  }

  it("a copied session cookie stops working when its user signs out (Auth.js's own sign-out route)", async () => {
    const [original, copy] = await signedInTwice("engineer@caldrith.example", "demo-client-2026");
    const { csrfToken } = (await (await original.fetch("/api/auth/csrf")).json()) as { csrfToken: string };
    const out = await original.fetch("/api/auth/signout", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ csrfToken }) });
    expect(out.status).toBeLessThan(400);
    // Past the 30 s the session cache may keep a token in memory: the version is checked every time.
    expect((await copy.fetch("/api/portal/requests")).status).toBe(401);
    // Signing in again works.
    expect((await new Session(stack.baseUrl).signIn("engineer@caldrith.example", "demo-client-2026")).ok).toBe(true);
  });

  it("a copied session cookie stops working after a password reset", async () => {
    const [, copy] = await signedInTwice("buyer@bramblewake.example", "demo-lead-2026");
    const since = Date.now() - 1000;
    const { context, page } = await newPage(browser);
    await page.goto(`${stack.baseUrl}/reset`);
    await page.getByLabel("E-mail").fill("buyer@bramblewake.example");
    await page.getByRole("button", { name: "E-mail me a reset link" }).click();
    await page.waitForURL(/\/reset\/sent/);
    const html = await latestEmailTo("buyer@bramblewake.example", /Reset your Layerwright password/, since);
    const link = html.match(/href="([^"]*\/reset\/new\?token=[^"]*)"/)?.[1]?.replaceAll("&amp;", "&");
    await page.goto(link!);
    await page.getByLabel("New password", { exact: true }).fill("keel-moulds-2027");
    await page.getByLabel("New password again").fill("keel-moulds-2027");
    await page.getByRole("button", { name: "Set new password" }).click();
    await page.waitForURL(/\/reset\/done/);
    await context.close();
    expect((await copy.fetch("/api/portal/requests")).status).toBe(401);
    expect((await new Session(stack.baseUrl).signIn("buyer@bramblewake.example", "keel-moulds-2027")).ok).toBe(true);
  });
});
