/**
 * A short-lived, bounded memory of session tokens already verified by Auth.js in this process.
 *
 * Verifying a session costs Auth.js a CSRF hash, two key derivations, a decryption and a fresh
 * encryption (it re-issues the cookie): about a millisecond of CPU per request, most of the
 * request's cost on the list APIs. A token seen valid in the last `ttlMs` is trusted for that
 * long without asking again. What this may change, on purpose and bounded: a token is honoured up
 * to `ttlMs` past its own expiry if it was verified just before; the user is still reloaded from
 * the database on every request by the guard, so a disabled account or a new role apply at once.
 */
export interface SessionCacheOptions {
  ttlMs: number;
  maxEntries: number;
}

interface Entry {
  userId: string | null;
  untilMs: number;
}

export class SessionCache {
  private readonly entries = new Map<string, Entry>();

  constructor(private readonly opts: SessionCacheOptions) {}

  get size(): number {
    return this.entries.size;
  }

  /** The user id verified for this token, `null` for a token verified as no session, `undefined` if unknown or stale. */
  get(token: string, nowMs: number): string | null | undefined {
    const entry = this.entries.get(token);
    if (!entry) return undefined;
    if (entry.untilMs <= nowMs) {
      this.entries.delete(token);
      return undefined;
    }
    return entry.userId;
  }

  set(token: string, userId: string | null, nowMs: number): void {
    this.entries.delete(token);
    if (this.entries.size >= this.opts.maxEntries) {
      // Oldest first: a Map iterates in insertion order.
      for (const [key, entry] of this.entries) {
        if (this.entries.size < this.opts.maxEntries && entry.untilMs > nowMs) break;
        this.entries.delete(key);
      }
    }
    this.entries.set(token, { userId, untilMs: nowMs + this.opts.ttlMs });
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
