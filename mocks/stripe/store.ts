import { randomBytes } from "node:crypto";
import { closeSync, fsyncSync, mkdirSync, openSync, readFileSync, renameSync, writeSync } from "node:fs";
import path from "node:path";

/** A Stripe object as JSON (ids, `object` name and snake_case fields as Stripe sends them). */
export type StripeObject = { id: string; object: string; created: number; [key: string]: unknown };

export type Collection =
  | "checkout_sessions"
  | "payment_intents"
  | "charges"
  | "balance_transactions"
  | "refunds"
  | "events"
  | "customers"
  | "cash_balance_transactions";

export interface Delivery {
  eventId: string;
  attempts: number;
  nextAttemptAt: number; // ms since epoch
  deliveredAt: number | null;
  lastStatus: number | null;
  lastError: string | null;
}

export interface IdempotentResponse {
  key: string;
  route: string;
  paramsHash: string;
  status: number;
  body: unknown;
}

export interface FakeState {
  version: 1;
  seq: number;
  objects: Record<Collection, StripeObject[]>;
  deliveries: Delivery[];
  idempotency: IdempotentResponse[];
}

const PREFIX: Record<Collection, string> = {
  checkout_sessions: "cs_test_",
  payment_intents: "pi_",
  charges: "ch_",
  balance_transactions: "txn_",
  refunds: "re_",
  events: "evt_",
  customers: "cus_",
  cash_balance_transactions: "ccsbtxn_",
};

export function emptyState(): FakeState {
  return {
    version: 1,
    seq: 0,
    objects: {
      checkout_sessions: [],
      payment_intents: [],
      charges: [],
      balance_transactions: [],
      refunds: [],
      events: [],
      customers: [],
      cash_balance_transactions: [],
    },
    deliveries: [],
    idempotency: [],
  };
}

/** Ids look like Stripe's: a type prefix and 24 random base-62 characters. */
export function newId(collection: Collection | "secret"): string {
  const alphabet = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789";
  const bytes = randomBytes(collection === "checkout_sessions" ? 58 : 24);
  let body = "";
  for (const b of bytes) body += alphabet[b % alphabet.length];
  return collection === "secret" ? body : PREFIX[collection] + body;
}

export function collectionForId(id: string): Collection | undefined {
  for (const [collection, prefix] of Object.entries(PREFIX) as [Collection, string][]) {
    if (id.startsWith(prefix)) return collection;
  }
  return undefined;
}

/**
 * The fake's state, kept in memory and written to one JSON file after every change. Writes go to
 * a temp file, are fsynced, then renamed over the old file, so a kill mid-write leaves either the
 * old or the new state, never half of one.
 */
export class Store {
  state: FakeState;
  private readonly file: string | null;

  constructor(dataDir: string | null) {
    this.file = dataDir ? path.join(dataDir, "stripe-fake.json") : null;
    this.state = this.load();
  }

  private load(): FakeState {
    if (!this.file) return emptyState();
    mkdirSync(path.dirname(this.file), { recursive: true });
    try {
      const parsed = JSON.parse(readFileSync(this.file, "utf8")) as FakeState;
      if (parsed.version !== 1) return emptyState();
      return { ...emptyState(), ...parsed, objects: { ...emptyState().objects, ...parsed.objects } };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === "ENOENT") return emptyState();
      throw new Error(`stripe fake: cannot read ${this.file}: ${(e as Error).message}`);
    }
  }

  save(): void {
    if (!this.file) return;
    const tmp = `${this.file}.${process.pid}.tmp`;
    const fd = openSync(tmp, "w");
    try {
      writeSync(fd, JSON.stringify(this.state));
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    renameSync(tmp, this.file);
  }

  reset(): void {
    this.state = emptyState();
    this.save();
  }

  /** Insertion order is the tie-breaker for objects created in the same second. */
  insert(collection: Collection, object: StripeObject): StripeObject {
    this.state.seq += 1;
    this.state.objects[collection].push(object);
    return object;
  }

  get(collection: Collection, id: string): StripeObject | undefined {
    return this.state.objects[collection].find((o) => o.id === id);
  }

  find(id: string): StripeObject | undefined {
    const collection = collectionForId(id);
    return collection ? this.get(collection, id) : undefined;
  }
}
