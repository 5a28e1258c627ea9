import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type * as DbClient from "../../db/client";
import { createTestDb, type TestDb } from "../helpers/test-db";

let t: TestDb;

beforeAll(async () => {
  t = await createTestDb();
});
afterAll(() => t?.close());

describe("hot reads (readRows) on the process's prepared read connection", () => {
  it("are found from every copy of the database module (the build bundles one copy per server chunk)", async () => {
    const execute = vi.spyOn((t.db as unknown as { $client: { execute: (...a: unknown[]) => unknown } }).$client, "execute");
    // A second, separately loaded copy of db/client.ts, as another route's chunk holds.
    vi.resetModules();
    const copy = (await import("../../db/client")) as typeof DbClient;
    const rows = await copy.readRows<{ n: number }>(t.db, "select count(*) as n from change_counters where name = ?", ["board"]);
    expect(rows).toEqual([{ n: 1 }]);
    // the read went through the prepared connection, not the async client
    expect(execute).not.toHaveBeenCalled();
    execute.mockRestore();
  });
});
