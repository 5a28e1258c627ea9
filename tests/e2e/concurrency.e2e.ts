/**
 * Four serving processes on one SQLite file, writing at once: sign-ins, e-mailed sign-in links,
 * webhook payments and messages. No answer may be a server error, no process may log a locked
 * database, and every write must be found afterwards.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { concurrentWrites } from "../../lib/scripts/faults-concurrency";
import { prepareFaultData } from "../../lib/scripts/faults-core";
import { startHardStack, type HardStack } from "../../lib/scripts/hard-stack";
import { E2E_DIST_DIR } from "./global-setup";

let stack: HardStack;

beforeAll(async () => {
  stack = await startHardStack({ distDir: E2E_DIST_DIR, extraEnv: { WEB_CONCURRENCY: "4" }, prepare: (url) => prepareFaultData(url, { stageOrders: 0, payOrders: 6 }) });
}, 240_000);
afterAll(async () => {
  await stack?.stop();
});

describe("four processes writing at once", () => {
  it("sign-ins, e-mailed links, webhooks and messages: no busy error, no server error, nothing lost", async () => {
    expect(stack.processes).toBe(4);
    const r = await concurrentWrites(stack, { wrongSignIns: 10, payments: 6, messages: 20 });
    expect(r.busy).toEqual([]);
    expect(r.serverErrors).toEqual({});
    expect(r.signIns.rightOk).toBe(r.signIns.right);
    expect(r.signIns.wrongRefused).toBe(r.signIns.wrong);
    expect(r.links.mailed).toBe(r.links.asked);
    expect(r.payments.recorded).toBe(r.payments.paid);
    expect(r.payments.paid).toBe(6);
    expect(r.messages.stored).toBe(r.messages.posted);
    expect(r.check.integrity).toBe("ok");
    expect(r.check.problems).toEqual([]);
  }, 180_000);
});
