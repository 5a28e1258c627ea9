import { z } from "zod";
import { LOCAL_UPLOADTHING_TOKEN } from "./uploads/token";

/**
 * Validated environment. In development and tests every default points at the local fakes
 * (mocks/), so a fresh machine runs with no configuration. In production (`NODE_ENV=production`,
 * at run time, not while `next build` runs) every secret and the app URL must be set, and the
 * published demo values are refused: `instrumentation.ts` checks this before the server serves.
 */
const DEMO_AUTH_SECRET = "layerwright-local-demo-secret-change-me";

const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  APP_URL: z.string().url().default("http://localhost:3000"),
  DATA_DIR: z.string().default("./data"),
  DATABASE_URL: z.string().default("file:./data/layerwright.db"),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  AUTH_SECRET: z.string().min(16).default(DEMO_AUTH_SECRET),
  // How many reverse proxies in front of `npm start` append to x-forwarded-for (0: none).
  TRUSTED_PROXY_HOPS: z.coerce.number().int().min(0).max(10).default(0),

  // Stripe: the SDK talks to api.stripe.com unless STRIPE_API_HOST is set (the local fake).
  STRIPE_SECRET_KEY: z.string().default("sk_test_layerwright_local"),
  STRIPE_WEBHOOK_SECRET: z.string().default("whsec_layerwright_local"),
  STRIPE_API_HOST: z.string().optional(),
  STRIPE_API_PORT: z.coerce.number().int().optional(),
  STRIPE_API_PROTOCOL: z.enum(["http", "https"]).optional(),

  // Resend: base URL of the e-mail API; the local fake listens on 4020.
  RESEND_API_KEY: z.string().default("re_layerwright_local"),
  RESEND_BASE_URL: z.string().optional(),
  EMAIL_FROM: z.string().default("Ostrevane Additive Works <orders@ostrevane.example>"),
  SALES_INBOX: z.string().default("sales@ostrevane.example"),

  // UploadThing: token and hosts; the local fake listens on 4030.
  UPLOADTHING_TOKEN: z.string().optional(),
  UPLOADTHING_API_URL: z.string().optional(),
  UPLOADTHING_INGEST_URL: z.string().optional(),
  // Where the ingest posts upload callbacks (the app's /api/uploadthing); detected when unset.
  UPLOADTHING_CALLBACK_URL: z.string().url().optional(),
  // File host for signed reads: "localhost:4030" with "path" for the local fake.
  UPLOADTHING_UFS_HOST: z.string().optional(),
  UPLOADTHING_UFS_APP_ID_LOCATION: z.enum(["subdomain", "path"]).optional(),
});

export type Env = z.infer<typeof schema>;

/** Values published in this repository: fine for a developer's machine, never for a deployment. */
export const DEMO_SECRET_VALUES: Readonly<Record<string, readonly string[]>> = {
  AUTH_SECRET: [DEMO_AUTH_SECRET],
  STRIPE_SECRET_KEY: ["sk_test_layerwright_local"],
  STRIPE_WEBHOOK_SECRET: ["whsec_layerwright_local"],
  RESEND_API_KEY: ["re_layerwright_local"],
  UPLOADTHING_TOKEN: [LOCAL_UPLOADTHING_TOKEN],
};

/** Required in production, with the shortest length accepted. */
const PRODUCTION_REQUIRED: Readonly<Record<string, number>> = {
  APP_URL: 1,
  AUTH_SECRET: 32,
  STRIPE_SECRET_KEY: 8,
  STRIPE_WEBHOOK_SECRET: 16,
  RESEND_API_KEY: 8,
  UPLOADTHING_TOKEN: 8,
};

/** Whether the production rules apply: a production server at run time (not `next build`). */
export function isProductionRuntime(source: Record<string, string | undefined> = process.env): boolean {
  return source.NODE_ENV === "production" && source.NEXT_PHASE !== "phase-production-build";
}

/**
 * What is wrong with the environment for a production server, one line per variable, naming
 * the variable and never its value. Empty when all is well.
 */
export function productionEnvProblems(source: Record<string, string | undefined>): string[] {
  const problems: string[] = [];
  for (const [name, minLength] of Object.entries(PRODUCTION_REQUIRED)) {
    const value = source[name]?.trim();
    if (!value) problems.push(`${name} is not set (required in production)`);
    else if (DEMO_SECRET_VALUES[name]?.includes(value)) problems.push(`${name} is the published demo value; set a secret of your own`);
    else if (value.length < minLength) problems.push(`${name} is too short (at least ${minLength} characters)`);
  }
  const appUrl = source.APP_URL?.trim();
  if (appUrl && !/^https?:\/\/[^/\s]+/.test(appUrl)) problems.push("APP_URL must be an absolute http(s) URL, e.g. https://portal.example");
  const hops = source.TRUSTED_PROXY_HOPS;
  if (hops !== undefined && !/^(?:10|[0-9])$/.test(hops.trim())) problems.push("TRUSTED_PROXY_HOPS must be a whole number from 0 to 10");
  return problems;
}

let cached: Env | undefined;

/** Parse process.env once; throws a readable error naming each bad variable. */
export function env(): Env {
  if (cached) return cached;
  const problems: string[] = [];
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) problems.push(...parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`));
  if (isProductionRuntime()) problems.push(...productionEnvProblems(process.env));
  if (problems.length || !parsed.success) throw new Error(`Invalid environment:\n${problems.join("\n")}`);
  cached = parsed.data;
  return cached;
}

/** For tests that change process.env between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}
