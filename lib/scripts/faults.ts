/**
 * `npm run faults`: SIGKILL the app server in the middle of stage changes, webhook payments and
 * uploads (FAULT_ROUNDS rounds each, kill moments spread out), restart it, and check the
 * database; then fill up and write-protect the upload store during uploads (a small tmpfs mounted
 * over it; needs root); last, four serving processes take sign-ins, e-mailed links, webhooks and
 * messages at once. Prints what was killed and what was checked. FAULT_DIST_DIR (default
 * .next-hard; built when missing).
 */
import { readdirSync, statSync } from "node:fs";
import { buildIfMissingFor } from "./build-if-missing";
import { concurrentWrites } from "./faults-concurrency";
import { prepareFaultData, type CheckReport } from "./faults-core";
import { stageChangeFault, webhookFault } from "./faults-kill";
import { diskFault, mountSmallStore, uploadFault } from "./faults-storage";
import { startHardStack } from "./hard-stack";

const DIST = process.env.FAULT_DIST_DIR ?? ".next-hard";
const ROUNDS = Number(process.env.FAULT_ROUNDS ?? 3);

const verdict = (c: CheckReport) => (c.integrity === "ok" && c.problems.length === 0 ? "ok" : `PROBLEMS: integrity ${c.integrity}; ${c.problems.slice(0, 5).join("; ")}`);

async function main() {
  buildIfMissingFor(DIST);
  let failed = 0;
  const note = (ok: boolean) => (ok ? "" : (failed++, " ✗"));
  const stack = await startHardStack({ distDir: DIST, prepare: (url) => prepareFaultData(url, { stageOrders: 12 * ROUNDS, payOrders: 10 * ROUNDS }) });
  try {
    console.log(`faults: app ${stack.baseUrl}, data ${stack.dataDir}`);
    for (let i = 0; i < ROUNDS; i++) {
      const killAfterMs = 1500 + i * 700;
      const s = await stageChangeFault(stack, { killAfterMs, orders: 12 });
      console.log(`stage changes  #${i + 1}: ${s.orders} orders moving, SIGKILL after ${s.killedAfterMs} ms (${s.movesAnswered} moves answered, ${s.check.counts.stageMoves} recorded in all), restart ${s.restartMs} ms → ${verdict(s.check)}${note(verdict(s.check) === "ok")}`);
    }
    for (let i = 0; i < ROUNDS; i++) {
      const w = await webhookFault(stack, { killAfterMs: 300 + i * 150, payments: 10 });
      console.log(
        `webhooks       #${i + 1}: ${w.payments} deposits paid, SIGKILL when ${w.eventsBeforeKill} of their events were applied, the rest resent after the restart → all paid exactly once: ${w.paidOnce}; outcomes ${JSON.stringify(w.replayedOutcomes)} → ${verdict(w.check)}${note(w.paidOnce && verdict(w.check) === "ok")}`,
      );
    }
    for (let i = 0; i < ROUNDS; i++) {
      const u = await uploadFault(stack, { uploads: 8, killAfterMs: 600 + i * 300 });
      console.log(`uploads        #${i + 1}: ${u.started} uploads in flight, SIGKILL (${u.completedBeforeKill} done before), ${u.rowsAfter} rows after restart → ${verdict(u.check)}${note(verdict(u.check) === "ok")}`);
    }
    const store = mountSmallStore(stack.dataDir, 512 + Math.ceil(seededStoreKb(stack.dataDir)));
    if (!store) console.log("disk faults: skipped (mounting a tmpfs is not allowed here)");
    else {
      try {
        for (const mode of ["full", "read-only"] as const) {
          const d = await diskFault(stack, mode, store);
          const ok = d.status >= 400 && d.rowsAdded === 0 && d.recoveredStatus === 200 && verdict(d.check) === "ok";
          console.log(`upload store ${mode.padEnd(9)}: HTTP ${d.status} "${d.message.slice(0, 120)}", ${d.rowsAdded} rows added; next upload HTTP ${d.recoveredStatus} → ${verdict(d.check)}${note(ok)}`);
        }
      } finally {
        store.unmount();
      }
    }
  } finally {
    await stack.stop();
  }
  const four = await startHardStack({ distDir: DIST, extraEnv: { WEB_CONCURRENCY: "4" }, prepare: (url) => prepareFaultData(url, { stageOrders: 0, payOrders: 6 * ROUNDS }) });
  try {
    for (let i = 0; i < ROUNDS; i++) {
      const c = await concurrentWrites(four, { wrongSignIns: 10, payments: 6, messages: 20 });
      const ok = c.busy.length === 0 && Object.keys(c.serverErrors).length === 0 && c.signIns.rightOk === c.signIns.right && c.signIns.wrongRefused === c.signIns.wrong && c.links.mailed === c.links.asked && c.payments.recorded === c.payments.paid && c.messages.stored === c.messages.posted && verdict(c.check) === "ok";
      console.log(
        `${c.processes} processes  #${i + 1}: in ${c.ms} ms, sign-ins ${c.signIns.rightOk}/${c.signIns.right} right in, ${c.signIns.wrongRefused}/${c.signIns.wrong} wrong refused; links mailed ${c.links.mailed}/${c.links.asked}; deposits recorded ${c.payments.recorded}/${c.payments.paid}; messages stored ${c.messages.stored}/${c.messages.posted}; server errors ${JSON.stringify(c.serverErrors)}; busy log lines ${c.busy.length} → ${verdict(c.check)}${note(ok)}`,
      );
    }
  } finally {
    await four.stop();
  }
  console.log(failed ? `faults: ${failed} checks FAILED` : "faults: every check passed");
  process.exitCode = failed ? 1 : 0;
}

function seededStoreKb(dataDir: string): number {
  const dir = `${dataDir}/uploads`;
  return readdirSync(dir).reduce((kb, f) => kb + statSync(`${dir}/${f}`).size / 1024 + 4, 0);
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
