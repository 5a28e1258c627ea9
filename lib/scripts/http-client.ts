/**
 * A small HTTP client for scripts and tests that talk to the running app as a browser would:
 * a cookie jar, credentials sign-in through Auth.js, and server-action calls by their id from the
 * build's server-reference manifest.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { demoSignInCode } from "./demo-code";

export class Session {
  private readonly jar = new Map<string, string>();

  constructor(readonly baseUrl: string) {}

  get cookieHeader(): string {
    return [...this.jar].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  /** Raw Set-Cookie lines of the last response, for checking flags. */
  lastSetCookies: string[] = [];

  async fetch(pathOrUrl: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.jar.size) headers.set("cookie", this.cookieHeader);
    const res = await fetch(new URL(pathOrUrl, this.baseUrl), { ...init, headers, redirect: "manual" });
    this.lastSetCookies = res.headers.getSetCookie();
    for (const line of this.lastSetCookies) {
      const [pair] = line.split(";");
      const eq = pair!.indexOf("=");
      const name = pair!.slice(0, eq).trim();
      const value = pair!.slice(eq + 1).trim();
      if (!value || /max-age=0/i.test(line) || /expires=thu, 01 jan 1970/i.test(line)) this.jar.delete(name);
      else this.jar.set(name, value);
    }
    return res;
  }

  /** Another client holding copies of this one's cookies (as a copied or stolen cookie is used). */
  clone(): Session {
    const copy = new Session(this.baseUrl);
    for (const [k, v] of this.jar) copy.jar.set(k, v);
    return copy;
  }

  hasCookie(name: string): boolean {
    return this.jar.has(name);
  }

  /**
   * Credentials sign-in as the form does (csrf token, then the callback). Demo staff accounts also
   * send the code their authenticator app would show (lib/seed/data.ts). Returns the callback's answer.
   */
  async signIn(email: string, password: string, headers: Record<string, string> = {}): Promise<{ ok: boolean; location: string; setCookies: string[] }> {
    const csrfRes = await this.fetch("/api/auth/csrf", { headers });
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    const code = await demoSignInCode(email);
    const res = await this.fetch("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded", ...headers },
      body: new URLSearchParams({ csrfToken, email, password, ...(code ? { code } : {}), callbackUrl: `${this.baseUrl}/after-sign-in` }),
    });
    await res.arrayBuffer();
    const location = res.headers.get("location") ?? "";
    const setCookies = this.lastSetCookies;
    return { ok: this.hasCookie("authjs.session-token") && !location.includes("error="), location, setCookies };
  }

  /**
   * Call a server action by HTTP, as React's client does for plain (JSON-serialisable) arguments:
   * POST to a page that uses it, `Next-Action: <id>`, body the JSON array of arguments.
   */
  async callAction(action: ActionRef, args: unknown[] | string, extraHeaders: Record<string, string> = {}): Promise<{ status: number; text: string; result: unknown }> {
    const res = await this.fetch(action.pagePath, {
      method: "POST",
      headers: { "next-action": action.id, "content-type": "text/plain;charset=UTF-8", accept: "text/x-component", origin: this.baseUrl, ...extraHeaders },
      body: typeof args === "string" ? args : JSON.stringify(args),
    });
    const text = await res.text();
    return { status: res.status, text, result: actionResultOf(text) };
  }
}

/** The action's return value in an RSC answer (the row that holds `ok`), if any. */
export function actionResultOf(text: string): unknown {
  for (const line of text.split("\n")) {
    const m = line.match(/^[0-9a-f]+:(\{.*\})$/);
    if (!m) continue;
    try {
      const v = JSON.parse(m[1]!) as Record<string, unknown>;
      if ("ok" in v) return v;
      if (v.a && typeof v.a === "object" && "ok" in (v.a)) return v.a;
    } catch {
      /* not JSON */
    }
  }
  return null;
}

export interface ActionRef {
  id: string;
  name: string;
  file: string;
  /** A page path (URL) whose bundle includes the action. */
  pagePath: string;
}

/** App route folder → a URL: route groups dropped, `[id]` filled with `fill`. */
export function urlOfPage(worker: string, fill = "00000000-0000-0000-0000-000000000000"): string {
  const p = worker
    .replace(/^app/, "")
    .replace(/\/page$/, "")
    .split("/")
    .filter((s) => !/^\(.*\)$/.test(s))
    .map((s) => (/^\[.*\]$/.test(s) ? fill : s))
    .join("/");
  return p || "/";
}

/** Every server action of a build, with a page that serves it. */
export function listActions(distDir: string, root = path.resolve(import.meta.dirname, "../..")): ActionRef[] {
  const manifest = JSON.parse(readFileSync(path.join(root, distDir, "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { workers: Record<string, unknown>; filename: string; exportedName: string }>;
  };
  return Object.entries(manifest.node).map(([id, v]) => {
    const workers = Object.keys(v.workers);
    // Prefer a page without dynamic segments.
    const worker = workers.find((w) => !w.includes("[")) ?? workers[0]!;
    return { id, name: v.exportedName, file: v.filename, pagePath: urlOfPage(worker) };
  });
}
