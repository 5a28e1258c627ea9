import { createHash, randomUUID } from "node:crypto";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { pathToFileURL } from "node:url";

/** One accepted message, as the fake hands it to `store`. */
export interface FakeEmail {
  id: string;
  from: string;
  to: string[];
  cc: string[];
  bcc: string[];
  replyTo: string[];
  subject: string;
  html: string | null;
  text: string | null;
  tags: { name: string; value: string }[];
  headers: Record<string, string>;
  /** Attachments as received (base64 content decoded to count and hash it). */
  attachments?: FakeAttachment[];
  createdAt: Date;
}

export interface FakeAttachment {
  filename: string;
  contentType: string | null;
  sizeBytes: number;
  sha256: string;
}

export interface ResendFakeOptions {
  port?: number;
  host?: string;
  /** Where accepted messages go (the app's outbox table in `npm run mocks`). */
  store: (message: FakeEmail) => void | Promise<void>;
  log?: (line: string) => void;
}

export interface ResendFake {
  url: string;
  port: number;
  close: () => Promise<void>;
}

/** Resend's error body: `{ statusCode, name, message }` (names as Resend uses them, from memory). */
class ResendError extends Error {
  constructor(
    readonly statusCode: number,
    override readonly name: string,
    message: string,
  ) {
    super(message);
  }
  toJSON() {
    return { statusCode: this.statusCode, name: this.name, message: this.message };
  }
}

const MAX_BODY_BYTES = 10_000_000; // attachments ride inline as base64
const MAX_RECIPIENTS = 50;
const MAX_BATCH = 100;
const ADDRESS = /^[^\s@<>]+@[^\s@<>]+\.[^\s@<>]+$/;
const FROM = /^(?:[^<>]*<\s*[^\s@<>]+@[^\s@<>]+\.[^\s@<>]+\s*>|[^\s@<>]+@[^\s@<>]+\.[^\s@<>]+)$/;
const TAG = /^[A-Za-z0-9_-]{1,256}$/;

function list(value: unknown, field: string): string[] {
  if (value === undefined || value === null) return [];
  const arr = Array.isArray(value) ? value : [value];
  if (!arr.every((v): v is string => typeof v === "string")) {
    throw new ResendError(422, "validation_error", `The \`${field}\` field must be a string or an array of strings.`);
  }
  return arr.map((v) => v.trim());
}

/** Validate one send request the way the hosted API does and normalise it. */
export function validateEmail(body: unknown): Omit<FakeEmail, "id" | "createdAt"> {
  if (!body || typeof body !== "object" || Array.isArray(body)) {
    throw new ResendError(422, "validation_error", "The request body must be a JSON object.");
  }
  const b = body as Record<string, unknown>;
  for (const field of ["from", "to", "subject"] as const) {
    if (b[field] === undefined || b[field] === null || b[field] === "") {
      throw new ResendError(422, "missing_required_field", `Missing \`${field}\` field.`);
    }
  }
  if (typeof b.from !== "string" || !FROM.test(b.from.trim())) {
    throw new ResendError(422, "validation_error", "Invalid `from` field. The email address needs to follow the `email@example.com` or `Name <email@example.com>` format.");
  }
  const to = list(b.to, "to");
  const cc = list(b.cc, "cc");
  const bcc = list(b.bcc, "bcc");
  const replyTo = list(b.reply_to, "reply_to");
  if (to.length === 0) throw new ResendError(422, "missing_required_field", "Missing `to` field.");
  for (const [field, addrs] of [["to", to], ["cc", cc], ["bcc", bcc], ["reply_to", replyTo]] as const) {
    const bad = addrs.find((a) => !ADDRESS.test(a));
    if (bad !== undefined) {
      throw new ResendError(422, "validation_error", `Invalid \`${field}\` field. The email address needs to follow the \`email@example.com\` or \`Name <email@example.com>\` format.`);
    }
  }
  if (to.length > MAX_RECIPIENTS) throw new ResendError(422, "validation_error", `Too many recipients in \`to\`: at most ${MAX_RECIPIENTS}.`);
  if (typeof b.subject !== "string") throw new ResendError(422, "validation_error", "The `subject` field must be a string.");
  const html = typeof b.html === "string" ? b.html : null;
  const text = typeof b.text === "string" ? b.text : null;
  if (html === null && text === null) throw new ResendError(422, "missing_required_field", "Missing `html` or `text` field.");
  const tagsRaw = b.tags ?? [];
  if (!Array.isArray(tagsRaw)) throw new ResendError(422, "validation_error", "The `tags` field must be an array.");
  const tags = tagsRaw.map((t: unknown) => {
    const tag = t as { name?: unknown; value?: unknown };
    if (typeof tag?.name !== "string" || typeof tag?.value !== "string" || !TAG.test(tag.name) || !TAG.test(tag.value)) {
      throw new ResendError(422, "validation_error", "Tags should only contain ASCII letters, numbers, underscores, or dashes.");
    }
    return { name: tag.name, value: tag.value };
  });
  const headers: Record<string, string> = {};
  if (b.headers && typeof b.headers === "object") {
    for (const [k, v] of Object.entries(b.headers)) if (typeof v === "string") headers[k] = v;
  }
  const attachmentsRaw = b.attachments ?? [];
  if (!Array.isArray(attachmentsRaw)) throw new ResendError(422, "validation_error", "The `attachments` field must be an array.");
  const attachments = attachmentsRaw.map((a: unknown): FakeAttachment => {
    const att = a as { filename?: unknown; content?: unknown; content_type?: unknown };
    if (typeof att?.filename !== "string" || att.filename === "") throw new ResendError(422, "validation_error", "Each attachment needs a `filename`.");
    if (typeof att.content !== "string" || !/^[A-Za-z0-9+/]*={0,2}$/.test(att.content)) {
      throw new ResendError(422, "validation_error", "Attachment `content` must be base64 (a `path` to fetch is not supported by the local fake).");
    }
    const bytes = Buffer.from(att.content, "base64");
    return { filename: att.filename, contentType: typeof att.content_type === "string" ? att.content_type : null, sizeBytes: bytes.length, sha256: createHash("sha256").update(bytes).digest("hex") };
  });
  return { from: b.from.trim(), to, cc, bcc, replyTo, subject: b.subject, html, text, tags, headers, attachments };
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > MAX_BODY_BYTES) throw new ResendError(413, "validation_error", "Request body too large.");
    chunks.push(chunk as Buffer);
  }
  try {
    return JSON.parse(Buffer.concat(chunks).toString("utf8"));
  } catch {
    throw new ResendError(422, "validation_error", "The request body is not valid JSON.");
  }
}

function send(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { "content-type": "application/json" });
  res.end(JSON.stringify(body));
}

/** Start the e-mail API fake: `POST /emails`, `POST /emails/batch`, `GET /emails/:id`. */
export async function startResendFake(options: ResendFakeOptions): Promise<ResendFake> {
  const log = options.log ?? ((line: string) => console.log(`[resend-fake] ${line}`));
  const recent = new Map<string, FakeEmail>();
  const remember = (m: FakeEmail) => {
    recent.set(m.id, m);
    if (recent.size > 1000) recent.delete(recent.keys().next().value!);
  };

  const server = createServer((req, res) => {
    handle(req, res).catch((e: unknown) => {
      if (e instanceof ResendError) return send(res, e.statusCode, e.toJSON());
      log(`store failed: ${(e as Error).stack ?? String(e)}`);
      send(res, 500, { statusCode: 500, name: "application_error", message: "The local e-mail fake could not store the message." });
    });
  });
  // Node closes an idle kept-alive socket after 5 s, and fetch may reuse it at that very moment
  // (a send after a slow PDF render): "other side closed". Hosted APIs keep them far longer.
  server.keepAliveTimeout = 0;

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const path = new URL(req.url ?? "/", "http://fake.local").pathname.replace(/\/$/, "");
    if (req.method === "GET" && (path === "" || path === "/health")) return send(res, 200, { ok: true, service: "resend-fake" });
    const auth = req.headers.authorization ?? "";
    if (!/^Bearer \S+/.test(auth)) {
      throw new ResendError(401, "missing_api_key", "Missing API key in the authorization header. Include the following header in the request: Authorization: Bearer YOUR_API_KEY");
    }
    if (req.method === "POST" && path === "/emails") {
      const m: FakeEmail = { ...validateEmail(await readJson(req)), id: randomUUID(), createdAt: new Date() };
      await options.store(m);
      remember(m);
      return send(res, 200, { id: m.id });
    }
    if (req.method === "POST" && path === "/emails/batch") {
      const body = await readJson(req);
      if (!Array.isArray(body)) throw new ResendError(422, "validation_error", "The batch body must be an array of e-mails.");
      if (body.length === 0 || body.length > MAX_BATCH) throw new ResendError(422, "validation_error", `A batch holds 1 to ${MAX_BATCH} e-mails.`);
      // Strict batch validation (the SDK's default): one bad message refuses the whole batch.
      const messages = body.map((b, i) => {
        try {
          return { ...validateEmail(b), id: randomUUID(), createdAt: new Date() };
        } catch (e) {
          if (e instanceof ResendError) throw new ResendError(e.statusCode, e.name, `emails[${i}]: ${e.message}`);
          throw e;
        }
      });
      for (const m of messages) {
        await options.store(m);
        remember(m);
      }
      return send(res, 200, { data: messages.map((m) => ({ id: m.id })) });
    }
    const one = path.match(/^\/emails\/([0-9a-f-]{36})$/);
    if (req.method === "GET" && one) {
      const m = recent.get(one[1]!);
      if (!m) throw new ResendError(404, "not_found", "Email not found");
      return send(res, 200, { object: "email", id: m.id, from: m.from, to: m.to, subject: m.subject, html: m.html, text: m.text, created_at: m.createdAt.toISOString(), last_event: "delivered" });
    }
    throw new ResendError(404, "not_found", `The requested endpoint does not exist: ${req.method} ${path}`);
  }

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 4020, options.host ?? "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${options.host ?? "127.0.0.1"}:${port}`,
    port,
    close: async () => {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const fake = await startResendFake({
    port: Number(process.env.RESEND_FAKE_PORT ?? 4020),
    store: (m) => console.log(`[resend-fake] ${m.id} to ${m.to.join(", ")}: ${m.subject}`),
  });
  console.log(`[resend-fake] listening on ${fake.url} (messages are only logged; use npm run mocks for the outbox)`);
}
