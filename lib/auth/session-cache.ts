/**
 * A short-lived, bounded memory of session tokens already verified by Auth.js in this process.
 *
 * Verifying a session costs Auth.js a CSRF hash, two key derivations, a decryption and a fresh
 * encryption (it re-issues the cookie): about a millisecond of CPU per request, most of the
 * request's cost on the list APIs. A token seen valid in the last `ttlMs` is trusted for that
 * long without asking again. What this may change, on purpose and bounded: a token is honoured up
 * to `ttlMs` past its own expiry if it was verified just before; the user is still reloaded from
 * the database on every request by the guard, so a disabled account or a new role apply at once,
 * and the cached session version is compared with the user's current one there, so a session
 * ended (sign-out, reset, role change, removal) in any process is refused at once in every other.
 */
export interface SessionCacheOptions {
  ttlMs: number;
  maxEntries: number;
}

interface Entry<V> {
  value: V;
  untilMs: number;
}

/** `V`: what Auth.js said of the token (`null` for no session). */
export class SessionCache<V = string | null> {
  private readonly entries = new Map<string, Entry<V>>();

  constructor(private readonly opts: SessionCacheOptions) {}

  get size(): number {
    return this.entries.size;
  }

  /** What was verified for this token, `undefined` if unknown or stale. */
  get(token: string, nowMs: number): V | undefined {
    const entry = this.entries.get(token);
    if (!entry) return undefined;
    if (entry.untilMs <= nowMs) {
      this.entries.delete(token);
      return undefined;
    }
    return entry.value;
  }

  set(token: string, value: V, nowMs: number): void {
    this.entries.delete(token);
    if (this.entries.size >= this.opts.maxEntries) {
      // Oldest first: a Map iterates in insertion order.
      for (const [key, entry] of this.entries) {
        if (this.entries.size < this.opts.maxEntries && entry.untilMs > nowMs) break;
        this.entries.delete(key);
      }
    }
    this.entries.set(token, { value, untilMs: nowMs + this.opts.ttlMs });
  }

  clear(): void {
    this.entries.clear();
  }
}

/** Auth.js session cookie names (plain and `__Secure-`), including its chunked `.0`, `.1` parts. */
export function sessionTokenFrom(cookies: { name: string; value: string }[]): string | null {
  const parts = cookies
    .filter((c) => /^(__Secure-)?authjs\.session-token(\.\d+)?$/.test(c.name) && c.value)
    .sort((a, b) => a.name.localeCompare(b.name, "en", { numeric: true }));
  return parts.length ? parts.map((c) => `${c.name}=${c.value}`).join(";") : null;
}
