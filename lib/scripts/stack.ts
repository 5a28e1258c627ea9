/**
 * Start the whole product on this machine: the local fakes (mocks/start.ts) and `next start`
 * (clustered by lib/scripts/serve.mjs),
 * with every SDK pointed at the fakes. Used by `npm run demo` and by the browser tests.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, readFileSync, renameSync } from "node:fs";
import path from "node:path";
import { processorObjectsFor, type SeedProcessorRecord } from "@/lib/seed/processor";
import { demoSecrets } from "./demo-secrets";
import { waitForHttp } from "./free-port";

export const root = path.resolve(import.meta.dirname, "../..");

export interface StackPorts {
  app: number;
  stripe: number;
  resend: number;
  uploads: number;
}

/**
 * The demo's ports. `DEMO_PORT_BASE=N` moves the whole stack (app on N, fakes on N+10, N+20, N+30)
 * so two checkouts can run their demos side by side.
 */
export const DEMO_PORTS: StackPorts = demoPorts(process.env.DEMO_PORT_BASE);

function demoPorts(base: string | undefined): StackPorts {
  const n = base ? Number(base) : NaN;
  if (!Number.isInteger(n) || n < 1024 || n > 65000) return { app: 3000, stripe: 4010, resend: 4020, uploads: 4030 };
  return { app: n, stripe: n + 10, resend: n + 20, uploads: n + 30 };
}

/**
 * Environment that points every service at the local fakes, with the data folder's own random
 * secrets (demo-secrets.ts): the app runs in production mode and would refuse published ones.
 */
export function stackEnv(ports: StackPorts, dataDir: string, extra: Record<string, string> = {}, host = "localhost"): Record<string, string> {
  const appUrl = `http://${host}:${ports.app}`;
  const secrets = demoSecrets(dataDir, appUrl);
  return {
    NODE_ENV: "production",
    APP_URL: appUrl,
    // Auth.js builds its links from this, never from a request's Host header.
    AUTH_URL: appUrl,
    AUTH_TRUST_HOST: "true",
    AUTH_SECRET: secrets.AUTH_SECRET,
    DATA_DIR: dataDir,
    DATABASE_URL: `file:${path.join(dataDir, "layerwright.db")}`,
    STRIPE_SECRET_KEY: secrets.STRIPE_SECRET_KEY,
    STRIPE_WEBHOOK_SECRET: secrets.STRIPE_WEBHOOK_SECRET,
    STRIPE_API_HOST: "127.0.0.1",
    STRIPE_API_PORT: String(ports.stripe),
    STRIPE_API_PROTOCOL: "http",
    STRIPE_FAKE_PORT: String(ports.stripe),
    STRIPE_FAKE_WEBHOOK_URL: `${appUrl}/api/webhooks/stripe`,
    RESEND_API_KEY: secrets.RESEND_API_KEY,
    RESEND_BASE_URL: `http://127.0.0.1:${ports.resend}`,
    RESEND_FAKE_PORT: String(ports.resend),
    UPLOADTHING_TOKEN: secrets.UPLOADTHING_TOKEN,
    UPLOADTHING_API_URL: `http://127.0.0.1:${ports.uploads}`,
    UPLOADTHING_INGEST_URL: `http://127.0.0.1:${ports.uploads}`,
    UPLOADTHING_CALLBACK_URL: `${appUrl}/api/uploadthing`,
    // "localhost" in the file host makes the SDK build http URLs to the fake.
    UPLOADTHING_UFS_HOST: `localhost:${ports.uploads}`,
    UPLOADTHING_UFS_APP_ID_LOCATION: "path",
    UPLOADTHING_FAKE_PORT: String(ports.uploads),
    UPLOADTHING_FILE_BASE_URL: `http://localhost:${ports.uploads}/f`,
    ...extra,
  };
}

/**
 * The app server's command line: `next start` in one process per core (lib/scripts/serve.mjs,
 * WEB_CONCURRENCY to choose), as `npm start` runs it.
 */
export function appArgs(port: number, host: string): string[] {
  return [path.join(root, "lib/scripts/serve.mjs"), "-p", String(port), "-H", host];
}

export interface RunningStack {
  baseUrl: string;
  env: Record<string, string>;
  processes: ChildProcess[];
  stop: () => Promise<void>;
}

/** A log line that reports SQLite's write lock as an error. */
export const BUSY_LINE = /SQLITE_BUSY|database is locked/i;

/** Lines of a quiet stack process's output that reported a locked database (see `run`). */
export function busyLines(child: ChildProcess): string[] {
  return (child as ChildProcess & { busy?: string[] }).busy ?? [];
}

function run(cmd: string, args: string[], env: Record<string, string>, label: string, quiet: boolean): ChildProcess {
  const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env }, stdio: quiet ? ["ignore", "pipe", "pipe"] : "inherit" });
  if (quiet) {
    // Keep the last lines for error reports without flooding the test output.
    const tail: string[] = [];
    // Every line that reports a locked database, kept whole (tests assert there is none).
    const busy: string[] = [];
    const keep = (chunk: Buffer) => {
      const lines = chunk.toString().split("\n");
      tail.push(...lines);
      if (tail.length > 80) tail.splice(0, tail.length - 80);
      for (const line of lines) if (BUSY_LINE.test(line)) busy.push(line);
    };
    child.stdout?.on("data", keep);
    child.stderr?.on("data", keep);
    Object.assign(child, { tail, busy });
  }
  child.on("exit", (code, signal) => {
    // 143 = stopped by our own SIGTERM.
    if (code && code !== 0 && code !== 143) console.error(`${label} exited with ${code ?? signal}`);
  });
  return child;
}

/** Start the fakes and the built app (`next build` must have run into `distDir`). */
export async function startStack(opts: {
  ports: StackPorts;
  dataDir: string;
  distDir?: string;
  quiet?: boolean;
  extraEnv?: Record<string, string>;
  /**
   * Host name of the app's own links. Auth.js answers with the host `next start` reports
   * (localhost), so the browser must use the same name or its cookies go astray.
   */
  host?: string;
}): Promise<RunningStack> {
  const host = opts.host ?? "localhost";
  const env = stackEnv(opts.ports, opts.dataDir, { NEXT_DIST_DIR: opts.distDir ?? ".next", ...(opts.extraEnv ?? {}) }, host);
  const quiet = opts.quiet ?? false;
  const fakes = run(path.join(root, "node_modules/.bin/tsx"), ["mocks/start.ts"], env, "local fakes", quiet);
  const app = run(process.execPath, appArgs(opts.ports.app, host), env, "next start", quiet);
  const processes = [fakes, app];
  const stop = async () => {
    for (const p of processes) if (p.exitCode === null) p.kill("SIGTERM");
    await Promise.all(processes.map((p) => (p.exitCode === null ? new Promise((r) => p.once("exit", r)) : Promise.resolve())));
  };
  try {
    await waitForHttp(`http://127.0.0.1:${opts.ports.stripe}/health`, 60_000);
    await waitForHttp(`http://127.0.0.1:${opts.ports.uploads}/health`, 30_000);
    await waitForHttp(`http://${host}:${opts.ports.app}/sign-in`, 90_000);
    await loadSeedProcessorRecords(opts.dataDir, opts.ports.stripe);
  } catch (e) {
    const tails = processes.map((p) => ((p as ChildProcess & { tail?: string[] }).tail ?? []).join("\n")).join("\n---\n");
    await stop();
    throw new Error(`${e instanceof Error ? e.message : String(e)}\n${tails}`);
  }
  return { baseUrl: env.APP_URL!, env, processes, stop };
}

/** Give the payment fake the processor's side of freshly seeded payments, once per seed. */
async function loadSeedProcessorRecords(dataDir: string, stripePort: number) {
  const file = path.join(dataDir, "seed-processor-records.json");
  if (!existsSync(file)) return;
  const records = JSON.parse(readFileSync(file, "utf8")) as SeedProcessorRecord[];
  await fetch(`http://127.0.0.1:${stripePort}/_fake/reset`, { method: "POST" });
  const res = await fetch(`http://127.0.0.1:${stripePort}/_fake/objects`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(processorObjectsFor(records)),
  });
  if (!res.ok) throw new Error(`loading the seeded processor records failed: ${res.status} ${await res.text()}`);
  renameSync(file, `${file}.loaded`);
}
