/**
 * `npm start`: `next start` in several processes sharing one port (Node's cluster module; the
 * primary accepts connections and hands them round-robin to the workers). One Node process
 * renders on one core; this lets the app use every core of the machine. Plain JavaScript so that
 * production needs no TypeScript runner.
 *
 *   node lib/scripts/serve.mjs [next start options…]     e.g. -p 3000 -H localhost
 *
 * Every process first loads peer-address.mjs (the connection's address appended to
 * x-forwarded-for, for throttles and the audit log).
 *
 * WEB_CONCURRENCY: how many processes (default: the cores, at most 4; 1 runs `next start` alone).
 * A worker that dies unexpectedly is replaced; more than 5 deaths within a minute stop the whole
 * server. A worker that exits with 78 (instrumentation.ts refused the environment) stops it at
 * once with that code: a restart would be refused the same way. SIGTERM / SIGINT stop the workers (each finishes through `next start`'s own shutdown)
 * and then the primary. If the primary itself is killed, the workers exit with it (cluster
 * workers leave when their channel to the primary closes).
 */
import cluster from "node:cluster";
import { createRequire } from "node:module";
import os from "node:os";

const require = createRequire(import.meta.url);
const nextBin = require.resolve("next/dist/bin/next");
const CONFIG_REFUSED = 78;
const peerAddress = new URL("./peer-address.mjs", import.meta.url).href;
const args = ["start", ...process.argv.slice(2)];
const wanted = Number(process.env.WEB_CONCURRENCY ?? Math.min(os.availableParallelism(), 4));
const count = Number.isInteger(wanted) && wanted > 0 ? wanted : 1;

if (count === 1) {
  process.argv = [process.argv[0], nextBin, ...args];
  await import(peerAddress);
  await import(nextBin);
} else {
  cluster.setupPrimary({ exec: nextBin, args, execArgv: [...process.execArgv, "--import", peerAddress] });
  let stopping = false;
  const deaths = [];

  const fork = () => cluster.fork();
  for (let i = 0; i < count; i++) fork();
  console.log(`serve: next start in ${count} processes (WEB_CONCURRENCY=${count})`);

  cluster.on("exit", (worker, code, signal) => {
    if (stopping) {
      // The last worker gone: leave with the code stop() was given (1 after a crash loop).
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(process.exitCode ?? 0);
      return;
    }
    if (code === CONFIG_REFUSED) {
      console.error("serve: the environment was refused (see above); not starting");
      stop(CONFIG_REFUSED);
      return;
    }
    const now = Date.now();
    deaths.push(now);
    while (deaths.length && deaths[0] < now - 60_000) deaths.shift();
    console.error(`serve: worker ${worker.process.pid} exited (${signal ?? code}); ${deaths.length} in the last minute`);
    if (deaths.length > 5) {
      console.error("serve: workers keep dying; stopping");
      stop(1);
      return;
    }
    setTimeout(fork, 500);
  });

  const stop = (exitCode = 0) => {
    if (stopping) return;
    stopping = true;
    process.exitCode = exitCode;
    const workers = Object.values(cluster.workers ?? {});
    if (workers.length === 0) process.exit(exitCode);
    for (const w of workers) w?.process.kill("SIGTERM");
    // A worker that does not finish its shutdown in 10 s is killed.
    setTimeout(() => {
      for (const w of Object.values(cluster.workers ?? {})) w?.process.kill("SIGKILL");
      process.exit(exitCode);
    }, 10_000).unref();
  };
  process.on("SIGTERM", () => stop(0));
  process.on("SIGINT", () => stop(0));
}
