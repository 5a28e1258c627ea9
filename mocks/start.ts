/**
 * Start the local fakes of the hosted services in one process (`npm run mocks`):
 * payments API on 4010, e-mail API on 4020 (messages kept in `DATA_DIR/mail-fake.db`, the fake's
 * own file; the app writes its own outbox), upload service on 4030. Prints one `mocks ready` line when all three listen; stops on SIGINT/SIGTERM.
 */
import { LOCAL_UPLOADTHING_TOKEN } from "../lib/uploads/token";
import { startResendFake } from "./resend/server";
import { openMailStore } from "./resend/store";
import { startStripeFake, stripeFakeOptionsFromEnv } from "./stripe/server";
import { startUploadthingFake } from "./uploadthing/server";

const env = process.env;
const dataDir = env.DATA_DIR ?? "./data";

const mailbox = await openMailStore(dataDir);
const stripe = await startStripeFake(stripeFakeOptionsFromEnv(env));
const resend = await startResendFake({
  port: Number(env.RESEND_FAKE_PORT ?? 4020),
  host: env.RESEND_FAKE_HOST ?? "127.0.0.1",
  store: (m) => mailbox.store(m),
});
const uploads = await startUploadthingFake({
  port: Number(env.UPLOADTHING_FAKE_PORT ?? 4030),
  host: env.UPLOADTHING_FAKE_HOST ?? "127.0.0.1",
  token: env.UPLOADTHING_TOKEN ?? LOCAL_UPLOADTHING_TOKEN,
  dataDir,
  maxFileBytes: env.UPLOADTHING_FAKE_MAX_BYTES ? Number(env.UPLOADTHING_FAKE_MAX_BYTES) : undefined,
  publicUrl: env.UPLOADTHING_FAKE_PUBLIC_URL,
});

console.log(`[mocks] payments ${stripe.url} · e-mail ${resend.url} · uploads ${uploads.url} · data ${dataDir}`);
console.log("mocks ready");

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[mocks] ${signal}: stopping`);
  await Promise.allSettled([stripe.close(), resend.close(), uploads.close()]);
  mailbox.close();
  process.exit(0);
}
process.on("SIGINT", () => void stop("SIGINT"));
process.on("SIGTERM", () => void stop("SIGTERM"));
