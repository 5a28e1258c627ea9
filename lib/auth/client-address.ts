import "server-only";
/**
 * The client's network address for throttles and the audit log.
 *
 * `npm start` (lib/scripts/serve.mjs) appends the connection's peer address to
 * `x-forwarded-for` before Next.js sees the request, as one more proxy would; each trusted proxy
 * in front of it appends the address it was reached from. So the client is the entry
 * `TRUSTED_PROXY_HOPS` places from the right (0: the peer itself). Entries further left were
 * written by the client and are never used. Null when there is no such entry; callers then skip
 * the per-address rule rather than share one key among everyone.
 */
export function clientAddressFrom(forwardedFor: string | null | undefined, trustedHops: number): string | null {
  if (!forwardedFor) return null;
  const entries = forwardedFor
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const hops = Number.isInteger(trustedHops) && trustedHops >= 0 ? trustedHops : 0;
  const entry = entries[entries.length - 1 - hops];
  if (!entry || entry.length > 64 || !/^[0-9A-Fa-f:.[\]]+$/.test(entry)) return null;
  return entry.replace(/^::ffff:(?=\d+\.\d+\.\d+\.\d+$)/, "");
}

/** The same from a request's headers, with the deployment's `TRUSTED_PROXY_HOPS` (default 0). */
export function clientAddress(headers: Pick<Headers, "get"> | undefined): string | null {
  return clientAddressFrom(headers?.get("x-forwarded-for"), Number(process.env.TRUSTED_PROXY_HOPS ?? 0));
}
