import { createHmac, timingSafeEqual } from "node:crypto";

/** The parsed UploadThing token: base64 of JSON `{ apiKey, appId, regions }`. */
export interface UploadthingToken {
  apiKey: string;
  appId: string;
  regions: string[];
}

export function encodeToken(t: UploadthingToken): string {
  return Buffer.from(JSON.stringify(t)).toString("base64");
}

export function decodeToken(token: string): UploadthingToken {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(token, "base64").toString("utf8"));
  } catch {
    throw new Error("UPLOADTHING_TOKEN is not base64-encoded JSON");
  }
  const t = parsed as Partial<UploadthingToken>;
  if (typeof t.apiKey !== "string" || !t.apiKey.startsWith("sk_") || typeof t.appId !== "string" || !Array.isArray(t.regions) || t.regions.length === 0) {
    throw new Error("UPLOADTHING_TOKEN must encode { apiKey: 'sk_…', appId, regions: [..] }");
  }
  return { apiKey: t.apiKey, appId: t.appId, regions: t.regions.map(String) };
}

/** `hmac-sha256=<hex>` over the exact text, keyed by the API key (as the SDK's signPayload). */
export function sign(payload: string, apiKey: string): string {
  return `hmac-sha256=${createHmac("sha256", apiKey).update(payload).digest("hex")}`;
}

export function verify(payload: string, signature: string | null | undefined, apiKey: string): boolean {
  if (!signature) return false;
  const expected = Buffer.from(sign(payload, apiKey));
  const got = Buffer.from(signature);
  return expected.length === got.length && timingSafeEqual(expected, got);
}

/**
 * Check a presigned URL as the SDK builds it (generateSignedURL): the signature covers the full
 * URL text up to `&signature=`, and `expires` (ms since epoch) must lie ahead.
 */
export function verifySignedUrl(fullUrl: string, apiKey: string, nowMs = Date.now()): { ok: true; params: URLSearchParams } | { ok: false; reason: string } {
  const at = fullUrl.lastIndexOf("&signature=");
  if (at === -1) return { ok: false, reason: "missing signature" };
  const unsigned = fullUrl.slice(0, at);
  const params = new URL(fullUrl).searchParams;
  const signature = params.get("signature");
  if (!verify(unsigned, signature, apiKey)) return { ok: false, reason: "invalid signature" };
  const expires = Number(params.get("expires"));
  if (!Number.isFinite(expires) || expires < nowMs) return { ok: false, reason: "URL expired" };
  return { ok: true, params };
}

/** The SDK URI-encodes each `x-ut-*` value before adding it as a search param. */
export function utParam(params: URLSearchParams, name: string): string | undefined {
  const raw = params.get(name);
  if (raw === null) return undefined;
  try {
    return decodeURIComponent(raw);
  } catch {
    return raw;
  }
}

/** File keys are the SDK's sqids (letters and digits); anything else could climb out of the folder. */
export const FILE_KEY = /^[A-Za-z0-9_-]{1,128}$/;
