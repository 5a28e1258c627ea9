/**
 * One lean round of each fault (the longer run with figures is `npm run faults`): the app server
 * SIGKILLed during stage moves, webhook payments and uploads, then restarted and checked; the
 * upload store full and read-only during an upload (a small tmpfs over it: needs root, skipped
 * where mounting is not allowed).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { prepareFaultData } from "../../lib/scripts/faults-core";
import { stageChangeFault, webhookFault } from "../../lib/scripts/faults-kill";
import { diskFault, mountSmallStore, uploadFault } from "../../lib/scripts/faults-storage";
import { startHardStack, type HardStack } from "../../lib/scripts/hard-stack";
import { E2E_DIST_DIR } from "./global-setup";

let stack: HardStack;

beforeAll(async () => {
  stack = await startHardStack({ distDir: E2E_DIST_DIR, prepare: (url) => prepareFaultData(url, { stageOrders: 8, payOrders: 6 }) });
}, 240_000);
afterAll(async () => {
  await stack?.stop();
});

describe("the server killed in the middle of writes", () => {
  it("stage moves: the database opens clean, every order's stage matches its history and audit", async () => {
    const r = await stageChangeFault(stack, { killAfterMs: 1500 });
    expect(r.check.integrity).toBe("ok");
    expect(r.check.problems).toEqual([]);
    expect(r.check.counts.stageMoves).toBeGreaterThan(0);
  });

  it("webhook payments: unacknowledged events are resent and applied exactly once; a full replay changes nothing", async () => {
    const r = await webhookFault(stack, { killAfterMs: 300 });
    expect(r.check.integrity).toBe("ok");
    expect(r.check.problems).toEqual([]);
    expect(r.paidOnce).toBe(true);
    expect(r.processed).toBeGreaterThanOrEqual(r.payments);
  });

  it("uploads: no upload row without its stored file", async () => {
    const r = await uploadFault(stack, { uploads: 6, killAfterMs: 600 });
    expect(r.check.integrity).toBe("ok");
    expect(r.check.problems).toEqual([]);
  });
});

describe("the upload store full or read-only", () => {
  it("answers with a clear error, records nothing, and takes the next upload once it has room", async (ctx) => {
    const { readdirSync, statSync } = await import("node:fs");
    const dir = `${stack.dataDir}/uploads`;
    const usedKb = readdirSync(dir).reduce((kb, f) => kb + statSync(`${dir}/${f}`).size / 1024 + 4, 0);
    const store = mountSmallStore(stack.dataDir, 512 + Math.ceil(usedKb));
    if (!store) return ctx.skip();
    try {
      const full = await diskFault(stack, "full", store);
      expect(full.status).toBeGreaterThanOrEqual(400);
      expect(full.message).toMatch(/could not store the file: ENOSPC/);
      expect(full.rowsAdded).toBe(0);
      expect(full.recoveredStatus).toBe(200);
      expect(full.check.problems).toEqual([]);
      const ro = await diskFault(stack, "read-only", store);
      expect(ro.message).toMatch(/could not store the file: EROFS/);
      expect(ro.rowsAdded).toBe(0);
      expect(ro.recoveredStatus).toBe(200);
      expect(ro.check.problems).toEqual([]);
    } finally {
      store.unmount();
    }
  });
});
