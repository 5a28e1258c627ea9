/**
 * The demo's own secrets: random at the first run, then kept in `<dataDir>/demo-secrets.json`
 * (owner-only) with the app's URL, so sessions and signed links survive a restart and a
 * `--reseed`, and no published value ever signs anything. Real deployments set the variables.
 */
import { randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";

export interface DemoSecrets {
  AUTH_SECRET: string;
  STRIPE_SECRET_KEY: string;
  STRIPE_WEBHOOK_SECRET: string;
  RESEND_API_KEY: string;
  UPLOADTHING_TOKEN: string;
  APP_URL: string;
}

const FILE = "demo-secrets.json";

const random = (bytes: number) => randomBytes(bytes).toString("base64url");

function fresh(appUrl: string): DemoSecrets {
  return {
    AUTH_SECRET: random(32),
    STRIPE_SECRET_KEY: `sk_test_${random(24)}`,
    STRIPE_WEBHOOK_SECRET: `whsec_${random(24)}`,
    RESEND_API_KEY: `re_${random(18)}`,
    // The upload service's token format: base64 of { apiKey, appId, regions }.
    UPLOADTHING_TOKEN: Buffer.from(JSON.stringify({ apiKey: `sk_${random(24)}`, appId: `demo-${random(6)}`, regions: ["local"] })).toString("base64"),
    APP_URL: appUrl,
  };
}

/** Read the data folder's demo secrets, creating them on first use; the app URL is kept current. */
export function demoSecrets(dataDir: string, appUrl: string): DemoSecrets {
  mkdirSync(dataDir, { recursive: true });
  const file = path.join(dataDir, FILE);
  let secrets: DemoSecrets | null = null;
  if (existsSync(file)) {
    const stored = JSON.parse(readFileSync(file, "utf8")) as Partial<DemoSecrets>;
    const complete = (Object.keys(fresh(appUrl)) as (keyof DemoSecrets)[]).every((k) => typeof stored[k] === "string" && stored[k]);
    if (complete) secrets = stored as DemoSecrets;
  }
  const wanted = secrets ? { ...secrets, APP_URL: appUrl } : fresh(appUrl);
  if (!secrets || secrets.APP_URL !== appUrl) {
    const tmp = `${file}.${process.pid}.tmp`;
    writeFileSync(tmp, `${JSON.stringify(wanted, null, 2)}\n`, { mode: 0o600 });
    renameSync(tmp, file);
    chmodSync(file, 0o600);
  }
  return wanted;
}
