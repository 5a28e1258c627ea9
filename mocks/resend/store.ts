import { createClient, type Client } from "@libsql/client";
import { mkdirSync } from "node:fs";
import path from "node:path";
import type { FakeEmail } from "./server";

/**
 * The e-mail fake's mailbox: its own SQLite file (`<dataDir>/mail-fake.db`), never the app's
 * database, so the fake's writes never wait on (or stall) the app's.
 */
export interface MailStore {
  store: (m: FakeEmail) => Promise<void>;
  /** Messages to an address, newest first (what a mailbox would show). */
  listTo: (address: string) => Promise<FakeEmail[]>;
  close: () => void;
}

export async function openMailStore(dataDir: string): Promise<MailStore> {
  mkdirSync(dataDir, { recursive: true });
  const client: Client = createClient({ url: `file:${path.join(path.resolve(dataDir), "mail-fake.db")}`, timeout: 10_000 });
  await client.execute("PRAGMA journal_mode = WAL");
  await client.execute(`CREATE TABLE IF NOT EXISTS messages (
    id TEXT PRIMARY KEY, body TEXT NOT NULL, created_at INTEGER NOT NULL)`);
  await client.execute(`CREATE TABLE IF NOT EXISTS recipients (
    message_id TEXT NOT NULL REFERENCES messages(id), address TEXT NOT NULL COLLATE NOCASE)`);
  await client.execute("CREATE INDEX IF NOT EXISTS recipients_address_idx ON recipients(address)");
  return {
    async store(m) {
      await client.batch(
        [
          { sql: "INSERT INTO messages (id, body, created_at) VALUES (?, ?, ?)", args: [m.id, JSON.stringify(m), m.createdAt.getTime()] },
          ...[...m.to, ...m.cc, ...m.bcc].map((address) => ({ sql: "INSERT INTO recipients (message_id, address) VALUES (?, ?)", args: [m.id, address] })),
        ],
        "write",
      );
    },
    async listTo(address) {
      const r = await client.execute({
        sql: "SELECT m.body FROM messages m JOIN recipients r ON r.message_id = m.id WHERE r.address = ? ORDER BY m.created_at DESC, m.rowid DESC",
        args: [address],
      });
      return r.rows.map((row) => {
        const m = JSON.parse(String(row.body)) as FakeEmail & { createdAt: string };
        return { ...m, createdAt: new Date(m.createdAt) };
      });
    },
    close: () => client.close(),
  };
}
