/**
 * Start the local fakes of the hosted services in one process (`npm run mocks`):
 * payments API on 4010, e-mail API on 4020 (messages land in the app's outbox table), upload
 * service on 4030. Prints one `mocks ready` line when all three listen; stops on SIGINT/SIGTERM.
 */
import { createOutboxMessage } from "../db/queries/outbox";
import { getDb } from "../db/client";
import { LOCAL_UPLOADTHING_TOKEN } from "../lib/uploads/token";
import { startResendFake } from "./resend/server";
import { startStripeFake, stripeFakeOptionsFromEnv } from "./stripe/server";
import { startUploadthingFake } from "./uploadthing/server";

const env = process.env;
const dataDir = env.DATA_DIR ?? "./data";

const stripe = await startStripeFake(stripeFakeOptionsFromEnv(env));
const resend = await startResendFake({
  port: Number(env.RESEND_FAKE_PORT ?? 4020),
  host: env.RESEND_FAKE_HOST ?? "127.0.0.1",
  store: async (m) => {
    await createOutboxMessage(getDb(), {
      providerId: m.id,
      fromAddress: m.from,
      toAddresses: [...m.to, ...m.cc, ...m.bcc],
      subject: m.subject,
      html: m.html,
      text: m.text,
      tags: m.tags,
    });
  },
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
  process.exit(0);
}
process.on("SIGINT", () => void stop("SIGINT"));
process.on("SIGTERM", () => void stop("SIGTERM"));
