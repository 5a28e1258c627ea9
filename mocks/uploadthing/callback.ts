import type { Registration } from "./types";

/** POST the signed callback to the app's upload route, three tries; "" when it was taken, else the last error. */
export async function deliverCallback(reg: Pick<Registration, "callbackUrl" | "callbackSlug">, payload: string, signature: string): Promise<string> {
  const target = new URL(reg.callbackUrl);
  if (reg.callbackSlug && !target.searchParams.has("slug")) target.searchParams.set("slug", reg.callbackSlug);
  let lastError = "";
  for (let attempt = 1; attempt <= 3; attempt += 1) {
    try {
      const res = await fetch(target, {
        method: "POST",
        headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": signature },
        body: payload,
        signal: AbortSignal.timeout(15_000),
      });
      await res.text().catch(() => "");
      if (res.ok) {
        lastError = "";
        break;
      }
      lastError = `callback answered ${res.status}`;
    } catch (e) {
      lastError = (e as Error).message;
    }
    await new Promise((r) => setTimeout(r, 200 * attempt));
  }
  return lastError;
}
