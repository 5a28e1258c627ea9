/**
 * A throwaway copy of the product for hardening runs (faults, load, hostile input): a fresh data
 * folder, migrated and seeded (optionally grown), the local fakes and `next start` on free
 * loopback ports, with the app server killable and restartable on its own.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDb } from "../../db/client";
import { seed } from "@/lib/seed/seed";
import { freePort, waitForHttp } from "./free-port";
import { migrateDatabase } from "./migrate";
import { appArgs, root, startStack, type RunningStack, type StackPorts } from "./stack";

export interface HardStack {
  baseUrl: string;
  dataDir: string;
  dbUrl: string;
  ports: StackPorts;
  env: Record<string, string>;
  distDir: string;
  /** Server processes answering (the cluster's workers; 1 when the app runs unclustered). */
  readonly processes: number;
  /** The app server's process (changes on restart). */
  app: () => ChildProcess;
  /** The local fakes' process (payment, e-mail, uploads). */
  fakes: ChildProcess;
  /** SIGKILL the app server (no shutdown hooks run) and wait for it to be gone. */
  killApp: () => Promise<void>;
  /** Start `next start` again on the same port and data. */
  restartApp: () => Promise<void>;
  stop: () => Promise<void>;
}

/** A process's state letter and parent from /proc/PID/stat (Linux), or null once it is gone. */
function procStat(pid: number | string): { state: string; ppid: number } | null {
  try {
    // "pid (comm) state ppid …"; comm may hold spaces, so read after the last ")".
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    const [state = "", ppid] = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    return { state, ppid: Number(ppid) };
  } catch {
    return null;
  }
}

/** Direct children of a process: the app server's cluster workers. */
export function childPids(parent: number): number[] {
  return readdirSync("/proc").filter((name) => /^\d+$/.test(name) && procStat(name)?.ppid === parent).map(Number);
}

/** Until each process is gone or a zombie (a killed child of a killed parent waits for init to reap it). */
async function waitUntilGone(pids: number[], timeoutMs = 10_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (const pid of pids) {
    for (let s = procStat(pid); s && s.state !== "Z" && Date.now() < until; s = procStat(pid)) await new Promise((r) => setTimeout(r, 20));
  }
}

export function ensureBuilt(distDir: string): void {
  if (!existsSync(path.join(root, distDir, "BUILD_ID"))) {
    throw new Error(`No production build in ${distDir}: run \`NEXT_DIST_DIR=${distDir} npm run build\` first.`);
  }
}

export async function startHardStack(opts: {
  distDir: string;
  extraEnv?: Record<string, string>;
  /** Runs on the seeded database before the servers start (e.g. growing it). */
  prepare?: (dbUrl: string, dataDir: string) => Promise<void>;
  quiet?: boolean;
}): Promise<HardStack> {
  ensureBuilt(opts.distDir);
  const dataDir = mkdtempSync(path.join(os.tmpdir(), "layerwright-hard-"));
  // HARD_PORT_BASE=N keeps the run on N…N+3 (app, payment, e-mail, uploads) where free ports must stay in a range
  const base = Number(process.env.HARD_PORT_BASE);
  const ports: StackPorts = Number.isInteger(base) && base > 0
    ? { app: base, stripe: base + 1, resend: base + 2, uploads: base + 3 }
    : { app: await freePort(), stripe: await freePort(), resend: await freePort(), uploads: await freePort() };
  const dbUrl = `file:${path.join(dataDir, "layerwright.db")}`;
  await migrateDatabase(dbUrl);
  const { db, client } = openDb(dbUrl);
  await seed(db, { dataDir, fileBaseUrl: `http://localhost:${ports.uploads}/f`, quiet: true });
  client.close();
  if (opts.prepare) await opts.prepare(dbUrl, dataDir);
  const stack: RunningStack = await startStack({ ports, dataDir, distDir: opts.distDir, quiet: opts.quiet ?? true, extraEnv: opts.extraEnv });
  let app = stack.processes[1]!;
  const fakes = stack.processes[0]!;

  const killApp = async () => {
    if (app.exitCode !== null || app.signalCode) return;
    const gone = new Promise((r) => app.once("exit", r));
    // The cluster's workers first, so none of them gets to shut down cleanly, then the primary.
    const workers = childPids(app.pid!);
    for (const pid of workers) process.kill(pid, "SIGKILL");
    app.kill("SIGKILL");
    await gone;
    await waitUntilGone(workers);
  };
  const restartApp = async () => {
    app = spawn(process.execPath, appArgs(ports.app, "localhost"), {
      cwd: root,
      env: { ...process.env, ...stack.env },
      stdio: opts.quiet === false ? "inherit" : "ignore",
    });
    await waitForHttp(`${stack.baseUrl}/sign-in`, 90_000);
  };
  return {
    baseUrl: stack.baseUrl,
    dataDir,
    dbUrl,
    ports,
    env: stack.env,
    distDir: opts.distDir,
    get processes() {
      return Math.max(1, childPids(app.pid!).length);
    },
    app: () => app,
    fakes,
    killApp,
    restartApp,
    stop: async () => {
      for (const p of [app, fakes]) if (p.exitCode === null && !p.signalCode) p.kill("SIGTERM");
      await Promise.all([app, fakes].map((p) => (p.exitCode === null && !p.signalCode ? new Promise((r) => p.once("exit", r)) : Promise.resolve())));
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
