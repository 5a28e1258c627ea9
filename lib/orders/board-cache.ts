import "server-only";
/**
 * The production board's answers, kept per process while the database's "board" change counter
 * (db/schema/change-counters.ts, raised by triggers) stays the same. Screens on the shop floor
 * reload the board often and it changes seldom; an unchanged counter means the same answer, so
 * nothing stale is ever served. The version must be read before the answer is built: a change
 * that lands meanwhile raises the counter and the next request builds afresh.
 */
export class VersionedCache<V> {
  private readonly entries = new Map<string, { version: number; value: V }>();

  constructor(private readonly maxEntries = 64) {}

  get(key: string, version: number): V | undefined {
    const hit = this.entries.get(key);
    return hit && hit.version === version ? hit.value : undefined;
  }

  set(key: string, version: number, value: V): void {
    this.entries.delete(key);
    if (this.entries.size >= this.maxEntries) this.entries.delete(this.entries.keys().next().value!);
    this.entries.set(key, { version, value });
  }
}
