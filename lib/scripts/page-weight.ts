import { readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

/**
 * The JavaScript a page makes a browser download, measured from the running build: the page's
 * HTML is fetched, each `<script src>` is read from the build's `static/` folder, and inline
 * scripts are taken as they are; sizes gzipped (zlib's default level, as served). Scripts marked
 * `nomodule` (the legacy polyfills) are counted apart: current browsers skip them.
 *
 *   tsx lib/scripts/page-weight.ts http://localhost:5700 .next / /sign-in
 */
export interface PageWeight {
  path: string;
  scripts: number;
  gzipBytes: number;
  rawBytes: number;
  /** Scripts only old browsers load (`nomodule`), gzipped. */
  legacyGzipBytes: number;
}

export async function pageWeight(baseUrl: string, distDir: string, pagePath: string): Promise<PageWeight> {
  const res = await fetch(baseUrl + pagePath, { redirect: "manual" });
  if (res.status !== 200) throw new Error(`${pagePath} answered ${res.status}`);
  const html = await res.text();
  let scripts = 0, gzipBytes = 0, rawBytes = 0, legacyGzipBytes = 0;
  for (const m of html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)) {
    const attrs = m[1] ?? "", body = m[2] ?? "";
    if (/type="application\/(ld\+)?json"/i.test(attrs)) continue; // data, not code
    const src = attrs.match(/\bsrc="([^"]+)"/)?.[1];
    let code: Buffer;
    if (src) {
      const rel = decodeURIComponent(new URL(src, baseUrl).pathname).replace(/^\/_next\//, "");
      code = readFileSync(path.join(distDir, rel));
    } else {
      if (body.trim() === "") continue;
      code = Buffer.from(body);
    }
    const gz = gzipSync(code).length;
    if (/\bnomodule\b/i.test(attrs)) { legacyGzipBytes += gz; continue; }
    scripts++;
    gzipBytes += gz;
    rawBytes += code.length;
  }
  return { path: pagePath, scripts, gzipBytes, rawBytes, legacyGzipBytes };
}

export function describeWeight(w: PageWeight): string {
  const kb = (b: number) => (b / 1000).toFixed(1);
  return `${w.path}: ${w.scripts} script(s), ${kb(w.gzipBytes)} kB of JavaScript gzipped (${kb(w.rawBytes)} kB raw)${w.legacyGzipBytes ? `; legacy polyfills for old browsers only: ${kb(w.legacyGzipBytes)} kB more` : ""}`;
}

if (import.meta.filename === process.argv[1]) {
  const [baseUrl, distDir, ...paths] = process.argv.slice(2);
  if (!baseUrl || !distDir || paths.length === 0) {
    console.error("usage: tsx lib/scripts/page-weight.ts BASE_URL DIST_DIR PATH…");
    process.exit(2);
  }
  for (const p of paths) console.log(describeWeight(await pageWeight(baseUrl, distDir, p)));
}
