import { z } from "zod";

/**
 * Validated environment. Every default points at the local fakes (mocks/), so a fresh machine
 * runs the demo with no configuration; setting the variables switches to the hosted services.
 */
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  APP_URL: z.string().url().default("http://localhost:3000"),
  DATA_DIR: z.string().default("./data"),
  DATABASE_URL: z.string().default("file:./data/layerwright.db"),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  AUTH_SECRET: z.string().min(16).default("layerwright-local-demo-secret-change-me"),

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

let cached: Env | undefined;

/** Parse process.env once; throws a readable error naming each bad variable. */
export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join("\n")}`);
  }
  cached = parsed.data;
  return cached;
}

/** For tests that change process.env between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}
