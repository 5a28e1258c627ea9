import { describe, expect, it } from "vitest";
import { isReadOnlyStatement, WriteGate } from "./write-gate";

describe("isReadOnlyStatement", () => {
  it.each([
    ["select * from users", true],
    ["  SELECT 1", true],
    ["PRAGMA foreign_keys", true],
    ["pragma table_info(users)", true],
    ["PRAGMA journal_mode = WAL", false],
    ["insert into users values (1) returning id", false],
    ["WITH x AS (SELECT 1) DELETE FROM t", false],
    ["update t set a = 1", false],
  ])("%s → %s", (sql, readOnly) => {
    expect(isReadOnlyStatement(sql)).toBe(readOnly);
    expect(isReadOnlyStatement({ sql, args: [] })).toBe(readOnly);
  });
});

describe("WriteGate", () => {
  it("grants in arrival order, one at a time", async () => {
    const gate = new WriteGate(1000);
    const order: number[] = [];
    const first = await gate.acquire();
    const waiting = [1, 2, 3].map((n) => gate.acquire().then((release) => (order.push(n), release)));
    expect(gate.queued).toBe(3);
    first();
    for (const w of waiting) (await w)();
    expect(order).toEqual([1, 2, 3]);
    expect(gate.isHeld).toBe(false);
  });

  it("a release called twice frees the gate once", async () => {
    const gate = new WriteGate(1000);
    const a = await gate.acquire();
    const b = gate.acquire();
    a();
    a();
    const releaseB = await b;
    expect(gate.isHeld).toBe(true);
    releaseB();
    expect(gate.isHeld).toBe(false);
  });

  it("a waiter gives up after the limit with a message that names the likely cause", async () => {
    const gate = new WriteGate(30);
    await gate.acquire();
    await expect(gate.acquire()).rejects.toThrow(/open write transaction/);
    expect(gate.queued).toBe(0);
  });
});
