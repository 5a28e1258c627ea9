import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { AUDIT_ACTION_LABEL, DOCUMENT_KIND_LABEL, PAYMENT_STATE_LABEL, QUOTE_STATE_LABEL, REFUND_STATE_LABEL, STAGE_LABEL } from "@/lib/labels";

/**
 * Screens, e-mails and page metadata speak the trade's and accounting's words. The payment
 * processor's object names and id prefixes belong in lib/payments, the webhook route and the
 * accounts staff's "processor reference"; the stock phrase of online manufacturing marketplaces
 * belongs nowhere. Comments count: they are where the words creep back in from.
 */
const root = path.resolve(import.meta.dirname, "..");

/** Pages (the landing page is in pages/), layouts and components of every screen, the e-mail templates, and the web manifest. */
function screenSources(): string[] {
  const tracked = execFileSync("git", ["ls-files", "-co", "--exclude-standard", "app", "pages", "components", "emails", "public"], { cwd: root, encoding: "utf8" }).split("\n");
  return tracked.filter(
    (f) =>
      /\.(tsx?|webmanifest|txt|svg)$/.test(f) &&
      !/\.test\.tsx?$/.test(f) &&
      // Route handlers (the webhook, the processor's reconciliation feed) and server actions are doors to the SDKs, not screens.
      !f.startsWith("app/api/") &&
      !/(^|\/)actions\.ts$/.test(f),
  );
}

const FORBIDDEN: [string, RegExp][] = [
  ["payment intent", /payment[\s_-]?intents?/i],
  ["charge (the object)", /\bcharges?\b|charge_?ids?/i],
  ["balance transaction", /balance[\s_-]?transactions?/i],
  ["checkout session", /checkout[\s_-]?sessions?/i],
  ["succeeded (a processor status)", /succeeded/i],
  ["a processor id prefix", /\b(pi|ch|cs|re|txn|evt|py)_[A-Za-z0-9]/],
  ["the processor's brand", /stripe/i],
  ["the marketplace phrase", /instant(ly)?[\s-]+(estimates?|quot\w*|pric\w*)/i],
];

function hits(text: string): string[] {
  return FORBIDDEN.filter(([, re]) => re.test(text)).map(([name]) => name);
}

describe("words on screens and in e-mails", () => {
  const files = screenSources();

  it("finds the screens' sources", () => {
    expect(files.length).toBeGreaterThan(60);
    expect(files).toContain("pages/index.tsx");
    expect(files).toContain("emails/deposit-received.tsx");
    expect(files).toContain("public/manifest.webmanifest");
  });

  it.each([
    ["Our ledger against the processor's payment intents", ["payment intent"]],
    ["no succeeded charge for it", ["charge (the object)", "succeeded (a processor status)"]],
    ["ref pi_3Nx9 / cs_test_a1", ["a processor id prefix"]],
    ["Get an instant quote", ["the marketplace phrase"]],
    ["Check fit, cost and ship date · processor reference · Paid by card", []],
  ])("the check itself: %s", (text, expected) => {
    expect(hits(text)).toEqual(expected);
  });

  it("no screen, e-mail or manifest names a processor object or uses the marketplace phrase", () => {
    const found = files.flatMap((f) =>
      readFileSync(path.join(root, f), "utf8")
        .split("\n")
        .flatMap((line, i) => hits(line).map((h) => `${f}:${i + 1}: ${h}`)),
    );
    expect(found).toEqual([]);
  });

  it("the page metadata does neither (titles and descriptions of every page and layout)", () => {
    const blocks = files
      .filter((f) => /(page|layout)\.tsx$/.test(f))
      .flatMap((f) => [...readFileSync(path.join(root, f), "utf8").matchAll(/export const metadata[^=]*=\s*(\{[\s\S]*?\n?\});/g)].map((m) => ({ f, text: m[1]! })));
    expect(blocks.some((b) => b.f === "app/layout.tsx" && /description/.test(b.text))).toBe(true);
    expect(blocks.flatMap((b) => hits(b.text).map((h) => `${b.f}: ${h}`))).toEqual([]);
  });

  it("the product's words for stored values use none of them either", () => {
    const words = [STAGE_LABEL, PAYMENT_STATE_LABEL, REFUND_STATE_LABEL, QUOTE_STATE_LABEL, DOCUMENT_KIND_LABEL, AUDIT_ACTION_LABEL].flatMap((m) => Object.values(m));
    expect(words.flatMap(hits)).toEqual([]);
    // And none is a raw key: no underscores, no dotted event names.
    expect(words.filter((w) => /[_.]/.test(w))).toEqual([]);
  });
});
