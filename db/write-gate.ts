import type { Client, InStatement, Transaction, TransactionMode } from "@libsql/client";

/**
 * One writer at a time inside a process.
 *
 * libSQL waits for a lock (its `timeout` option) by sleeping on the calling thread. Between
 * processes that is what we want: the other process finishes its write and lets go. Inside one
 * process it deadlocks: a second write transaction (or write statement) on another pooled
 * connection puts the thread to sleep while the first transaction, which needs that same thread
 * to reach its COMMIT, can never finish; after the timeout the second one fails with SQLITE_BUSY.
 * So writes within a process queue here, asynchronously, and only one holds SQLite's write lock
 * at a time; reads never queue (WAL lets them run beside a writer).
 */
export class WriteGate {
  private held = false;
  private readonly waiters: { grant: () => void; timer: NodeJS.Timeout }[] = [];

  constructor(private readonly waitLimitMs: number) {}

  get isHeld(): boolean {
    return this.held;
  }

  get queued(): number {
    return this.waiters.length;
  }

  /** Resolves with a release function once this caller may write. */
  acquire(): Promise<() => void> {
    if (!this.held) {
      this.held = true;
      return Promise.resolve(this.releaser());
    }
    return new Promise((resolve, reject) => {
      const waiter = {
        grant: () => {
          clearTimeout(waiter.timer);
          resolve(this.releaser());
        },
        timer: setTimeout(() => {
          const i = this.waiters.indexOf(waiter);
          if (i >= 0) this.waiters.splice(i, 1);
          // Most often a write through the process-wide handle inside an open transaction.
          reject(new Error(`database: a write waited ${this.waitLimitMs} ms for this process's open write transaction (a write outside the transaction's handle inside it?)`));
        }, this.waitLimitMs),
      };
      this.waiters.push(waiter);
    });
  }

  private releaser(): () => void {
    let done = false;
    return () => {
      if (done) return;
      done = true;
      const next = this.waiters.shift();
      if (next) next.grant();
      else this.held = false;
    };
  }
}

const READ_ONLY = /^\s*(?:select|explain)\b|^\s*pragma\s+[\w.]+\s*(?:\([^)]*\))?\s*;?\s*$/i;

/** Whether a statement only reads (SELECT, EXPLAIN, a PRAGMA that sets nothing). `WITH …` counts as a write. */
export function isReadOnlyStatement(stmt: InStatement | string): boolean {
  const sql = typeof stmt === "string" ? stmt : stmt.sql;
  return READ_ONLY.test(sql);
}

function gatedTransaction(tx: Transaction, release: () => void): Transaction {
  const settle = <A extends unknown[], R>(fn: (...args: A) => R) =>
    (...args: A): R => {
      try {
        const r = fn(...args);
        if (r instanceof Promise) return r.finally(release) as R;
        release();
        return r;
      } catch (e) {
        release();
        throw e;
      }
    };
  return new Proxy(tx, {
    get(target, prop, receiver) {
      if (prop === "commit") return settle(() => target.commit());
      if (prop === "rollback") return settle(() => target.rollback());
      if (prop === "close") return settle(() => target.close());
      const value: unknown = Reflect.get(target, prop, receiver);
      return typeof value === "function" ? value.bind(target) : value;
    },
  });
}

/** The client with every write (transactions, write statements, batches, migrations) passed through `gate`. */
export function gateWrites(client: Client, gate: WriteGate): Client {
  const held = async <R>(fn: () => Promise<R>): Promise<R> => {
    const release = await gate.acquire();
    try {
      return await fn();
    } finally {
      release();
    }
  };
  const gated: Partial<Client> = {
    execute: ((stmt: InStatement | string, args?: unknown) => {
      const run = () => (args === undefined ? client.execute(stmt) : client.execute(stmt as string, args as never));
      return isReadOnlyStatement(stmt) ? run() : held(run);
    }),
    batch: ((stmts, mode?: TransactionMode) => (mode === "read" ? client.batch(stmts, mode) : held(() => client.batch(stmts, mode)))),
    migrate: ((stmts) => held(() => client.migrate(stmts))),
    executeMultiple: ((sql) => held(() => client.executeMultiple(sql))),
    transaction: (async (mode?: TransactionMode) => {
      if (mode === "read") return client.transaction(mode);
      const release = await gate.acquire();
      try {
        return gatedTransaction(await client.transaction(mode), release);
      } catch (e) {
        release();
        throw e;
      }
    }),
  };
  return new Proxy(client, {
    get(target, prop, receiver) {
      if (typeof prop === "string" && prop in gated) return gated[prop as keyof Client];
      const value: unknown = Reflect.get(target, prop, receiver);
      return typeof value === "function" ? value.bind(target) : value;
    },
  });
}
