import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDb, type Db } from "../../db/client";
import { seed } from "@/lib/seed/seed";
import { migrateDatabase } from "../../lib/scripts/migrate";

export interface TestDb {
  db: Db;
  url: string;
  dataDir: string;
  close: () => void;
}

/** A throwaway SQLite file, migrated, optionally seeded with the demo scenario. */
export async function createTestDb({ seeded = false, now }: { seeded?: boolean; now?: Date } = {}): Promise<TestDb> {
  const dataDir = mkdtempSync(path.join(os.tmpdir(), "layerwright-test-"));
  const url = `file:${path.join(dataDir, "test.db")}`;
  await migrateDatabase(url);
  const { db, client } = openDb(url);
  if (seeded) await seed(db, { dataDir, quiet: true, now, fileBaseUrl: "http://127.0.0.1:1/f" });
  return {
    db,
    url,
    dataDir,
    close: () => {
      client.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
