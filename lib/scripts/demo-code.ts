import { DEMO_TOTP_SECRETS } from "@/lib/seed/data";
import { totpCodeForStep, totpStepAt } from "../auth/two-factor";

const used = new Map<string, number>();

/**
 * A sign-in code for a demo staff account, as its authenticator app would show it, or null for
 * an account without one. A code signs in once, so successive calls for one account within 30 s
 * give the next step's code (the server accepts one step ahead); a third within the same step
 * waits for the clock.
 */
export async function demoSignInCode(email: string, nowMs: () => number = Date.now): Promise<string | null> {
  const secret = DEMO_TOTP_SECRETS[email.toLowerCase()];
  if (!secret) return null;
  for (;;) {
    const now = totpStepAt(nowMs());
    const step = Math.max(now, (used.get(email) ?? -Infinity) + 1);
    if (step <= now + 1) {
      used.set(email, step);
      return totpCodeForStep(secret, step);
    }
    await new Promise((r) => setTimeout(r, 1000));
  }
}

// `npm run demo:code -- EMAIL`: the current code for a demo staff account.
if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split("/").pop() ?? "")) {
  const email = process.argv[2];
  const secret = email ? DEMO_TOTP_SECRETS[email.toLowerCase()] : undefined;
  if (!email || !secret) {
    console.error(`usage: npm run demo:code -- EMAIL (one of: ${Object.keys(DEMO_TOTP_SECRETS).join(", ")})`);
    process.exit(2);
  }
  const step = totpStepAt(Date.now());
  const left = 30 - Math.floor((Date.now() / 1000) % 30);
  console.log(`${totpCodeForStep(secret, step)}  (valid ${left} s more, then the next: ${totpCodeForStep(secret, step + 1)})`);
}
