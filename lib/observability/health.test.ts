import { describe, expect, it } from "vitest";
import { BACKLOG_DEGRADED_AFTER_S, healthStatus } from "./health";

describe("healthStatus", () => {
  it.each([
    [{ databaseOk: false, oldestQueuedAgeS: null }, "down"],
    [{ databaseOk: false, oldestQueuedAgeS: 10 }, "down"],
    [{ databaseOk: true, oldestQueuedAgeS: null }, "ok"],
    [{ databaseOk: true, oldestQueuedAgeS: BACKLOG_DEGRADED_AFTER_S }, "ok"],
    [{ databaseOk: true, oldestQueuedAgeS: BACKLOG_DEGRADED_AFTER_S + 1 }, "degraded"],
  ] as const)("%o → %s", (input, expected) => {
    expect(healthStatus(input)).toBe(expected);
  });
});
