import { createClient } from "@libsql/client";
import { drizzle } from "drizzle-orm/libsql";
import { migrate } from "drizzle-orm/libsql/migrator";
import { mkdirSync } from "node:fs";
import path from "node:path";

/** Apply the committed migrations to a database URL (non-interactive). */
export async function migrateDatabase(url: string, authToken?: string): Promise<void> {
  if (url.startsWith("file:")) mkdirSync(path.dirname(path.resolve(url.slice(5))), { recursive: true });
  const client = createClient({ url, authToken });
  try {
    await client.execute("PRAGMA journal_mode = WAL");
    await migrate(drizzle(client), { migrationsFolder: path.resolve(import.meta.dirname, "../../db/migrations") });
  } finally {
    client.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL ?? "file:./data/layerwright.db";
  migrateDatabase(url, process.env.DATABASE_AUTH_TOKEN)
    .then(() => console.log(`migrated ${url}`))
    .catch((e) => {
      console.error(`migration failed: ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    });
}
