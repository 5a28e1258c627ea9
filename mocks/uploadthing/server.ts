import { createHash } from "node:crypto";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { pathToFileURL } from "node:url";
import { decodeToken, FILE_KEY, sign, utParam, verifySignedUrl, type UploadthingToken } from "./protocol";
import { FileStore, type StoredFile } from "./store";
import type { Registration, UploadthingFake, UploadthingFakeOptions } from "./types";
import { cors, DEFAULT_MAX, HttpError, json, readBody, readJson } from "./http";
import { handleV6 } from "./v6";
import { deliverCallback } from "./callback";

export type { UploadthingFake, UploadthingFakeOptions } from "./types";

/**
 * Start the upload-service fake: the ingest (presigned PUT/HEAD, `/route-metadata`,
 * `/callback-result`, the signed callback to the app), the file host (`/f/<key>`), and the
 * `/v6/*` API calls `UTApi` makes (deleteFiles, listFiles).
 */
export async function startUploadthingFake(options: UploadthingFakeOptions): Promise<UploadthingFake> {
  const log = options.log ?? ((line: string) => console.log(`[uploadthing-fake] ${line}`));
  const token: UploadthingToken = decodeToken(options.token);
  const maxFileBytes = options.maxFileBytes ?? DEFAULT_MAX;
  const files = new FileStore(options.dataDir);
  const registrations = new Map<string, Registration>();
  const callbackWaiters = new Map<string, (result: { callbackData?: unknown; error?: string }) => void>();
  let origin = options.publicUrl ?? "";

  const server = createServer((req, res) => {
    cors(req, res);
    handle(req, res).catch((e: unknown) => {
      if (res.headersSent) return void res.end();
      if (e instanceof HttpError) return json(res, e.status, { error: e.message });
      log(`internal error: ${(e as Error).stack ?? String(e)}`);
      json(res, 500, { error: `The upload fake could not store the file: ${(e as Error).message}` });
    });
  });

  function requireApiKey(req: IncomingMessage): void {
    if (req.headers["x-uploadthing-api-key"] !== token.apiKey) throw new HttpError(401, "Invalid or missing x-uploadthing-api-key");
  }

  function publicFile(f: StoredFile) {
    const url = `${origin}/f/${f.key}`;
    return { key: f.key, name: f.name, size: f.size, type: f.type, customId: f.customId, lastModified: f.lastModified, url, appUrl: url, ufsUrl: url, fileHash: f.fileHash };
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const method = req.method ?? "GET";
    const host = req.headers.host ?? "127.0.0.1";
    const fullUrl = `http://${host}${req.url ?? "/"}`;
    const url = new URL(fullUrl);
    const path = url.pathname;

    if (method === "OPTIONS") {
      res.writeHead(204);
      return void res.end();
    }
    if (method === "GET" && (path === "/" || path === "/health")) return json(res, 200, { ok: true, service: "uploadthing-fake" });

    if (method === "POST" && path === "/route-metadata") {
      requireApiKey(req);
      const body = await readJson(req);
      const keys = Array.isArray(body.fileKeys) ? body.fileKeys.filter((k): k is string => typeof k === "string") : [];
      if (keys.length === 0 || !keys.every((k) => FILE_KEY.test(k))) throw new HttpError(400, "fileKeys must be a non-empty list of file keys");
      if (typeof body.callbackUrl !== "string" || !/^https?:\/\//.test(body.callbackUrl)) throw new HttpError(400, "callbackUrl must be an absolute URL");
      const reg: Registration = {
        metadata: body.metadata ?? {},
        isDev: body.isDev === true,
        callbackUrl: body.callbackUrl,
        callbackSlug: typeof body.callbackSlug === "string" ? body.callbackSlug : "",
        awaitServerData: body.awaitServerData !== false,
        stream: null,
        pendingKeys: new Set(keys),
      };
      for (const k of keys) registrations.set(k, reg);
      if (!reg.isDev) return json(res, 200, { ok: true });
      // Dev mode: the SDK keeps this response open and forwards each callback line to the app.
      res.writeHead(200, { "content-type": "application/x-ndjson", "cache-control": "no-store" });
      res.flushHeaders();
      reg.stream = res;
      const t = setTimeout(() => res.end(), 60 * 60 * 1000);
      res.on("close", () => clearTimeout(t));
      return;
    }

    if (method === "POST" && path === "/callback-result") {
      requireApiKey(req);
      const body = await readJson(req);
      const key = typeof body.fileKey === "string" ? body.fileKey : "";
      const waiter = callbackWaiters.get(key);
      if (waiter) waiter({ callbackData: body.callbackData, error: typeof body.error === "string" ? body.error : undefined });
      return json(res, 200, { ok: true });
    }

    if (method === "POST" && path.startsWith("/v6/")) {
      requireApiKey(req);
      const body = await readJson(req);
      return handleV6(res, path, body, files);
    }

    const served = path.match(/^\/(?:f|a\/[^/]+)\/([^/]+)$/);
    if ((method === "GET" || method === "HEAD") && served) {
      const key = decodeURIComponent(served[1]!);
      if (!FILE_KEY.test(key)) throw new HttpError(400, "Invalid file key");
      const meta = files.meta(key);
      if (!meta) throw new HttpError(404, "File not found");
      // Private files, like on the hosted service, need a signed URL (UTApi.generateSignedURL).
      if (meta.acl === "private" || url.searchParams.has("signature")) {
        const check = verifySignedUrl(fullUrl, token.apiKey);
        if (!check.ok) throw new HttpError(403, `Access denied: ${check.reason}`);
      }
      const disposition = meta.contentDisposition === "attachment" ? "attachment" : "inline";
      res.writeHead(200, {
        "content-type": meta.type || "application/octet-stream",
        "content-length": String(meta.size),
        "content-disposition": `${disposition}; filename*=UTF-8''${encodeURIComponent(meta.name)}`,
        "x-content-type-options": "nosniff",
        "cache-control": "private, max-age=0",
      });
      if (method === "HEAD") return void res.end();
      return void files.stream(key).pipe(res);
    }

    const ingest = path.match(/^\/([^/]+)$/);
    if ((method === "PUT" || method === "HEAD") && ingest) {
      const key = decodeURIComponent(ingest[1]!);
      if (!FILE_KEY.test(key)) throw new HttpError(400, "Invalid file key");
      const check = verifySignedUrl(fullUrl, token.apiKey);
      if (!check.ok) throw new HttpError(403, `Presigned URL refused: ${check.reason}`);
      if (utParam(check.params, "x-ut-identifier") !== token.appId) throw new HttpError(403, "Presigned URL is for another app");
      if (method === "HEAD") {
        // No partial uploads are kept, so every upload (re)starts at byte 0.
        res.writeHead(200, { "x-ut-range-start": "0" });
        return void res.end();
      }
      return handlePut(req, res, key, check.params);
    }

    throw new HttpError(404, `Not found: ${method} ${path}`);
  }

  async function handlePut(req: IncomingMessage, res: ServerResponse, key: string, params: URLSearchParams): Promise<void> {
    if (files.meta(key)) throw new HttpError(409, "This file key was already uploaded");
    const declared = Number(utParam(params, "x-ut-file-size"));
    if (!Number.isFinite(declared) || declared < 0) throw new HttpError(400, "Missing x-ut-file-size");
    if (declared > maxFileBytes) throw new HttpError(413, `Upload too large: ${declared} bytes; the limit is ${maxFileBytes} bytes`);
    const range = String(req.headers.range ?? "bytes=0-");
    if (range !== "bytes=0-") throw new HttpError(416, "Resuming a partial upload is not supported by the fake; start again");
    const contentType = String(req.headers["content-type"] ?? "");
    // Multipart framing adds a little over the declared size.
    const raw = await readBody(req, declared + 64 * 1024);
    let bytes: Buffer;
    if (contentType.startsWith("multipart/form-data")) {
      const form = await new Response(new Uint8Array(raw), { headers: { "content-type": contentType } }).formData().catch(() => {
        throw new HttpError(400, "Malformed multipart body");
      });
      const part = form.get("file");
      if (!part || typeof part === "string") throw new HttpError(400, "Expected a `file` part");
      bytes = Buffer.from(await part.arrayBuffer());
    } else {
      bytes = raw;
    }
    if (bytes.length !== declared) throw new HttpError(400, `Received ${bytes.length} bytes but the presigned URL declared ${declared}`);

    const stored = files.save(key, bytes, {
      name: utParam(params, "x-ut-file-name") ?? key,
      type: utParam(params, "x-ut-file-type") ?? "application/octet-stream",
      customId: utParam(params, "x-ut-custom-id") ?? null,
      contentDisposition: utParam(params, "x-ut-content-disposition") ?? "inline",
      acl: utParam(params, "x-ut-acl") ?? "public-read",
      fileHash: createHash("md5").update(bytes).digest("hex"),
    });
    const file = publicFile(stored);
    const reg = registrations.get(key);
    registrations.delete(key);
    if (!reg) return json(res, 200, file); // a server-side UTApi upload: no route, no callback

    const result = await runCallback(reg, key, file);
    reg.pendingKeys.delete(key);
    if (reg.stream && reg.pendingKeys.size === 0) reg.stream.end();
    if (result.error) return json(res, 200, { ...file, error: result.error });
    return json(res, 200, { ...file, serverData: result.callbackData ?? null });
  }

  /** Tell the app the file arrived (signed), then wait for its `/callback-result`. */
  async function runCallback(reg: Registration, key: string, file: ReturnType<typeof publicFile>): Promise<{ callbackData?: unknown; error?: string }> {
    const payload = JSON.stringify({ status: "uploaded", file, origin, metadata: reg.metadata });
    const signature = sign(payload, token.apiKey);
    const result = new Promise<{ callbackData?: unknown; error?: string }>((resolve) => {
      const t = setTimeout(() => resolve({ error: "The app did not confirm the upload in time" }), options.callbackTimeoutMs ?? 30_000);
      callbackWaiters.set(key, (r) => {
        clearTimeout(t);
        resolve(r);
      });
    });
    try {
      if (reg.isDev && reg.stream) {
        reg.stream.write(`${JSON.stringify({ payload, signature, hook: "callback" })}\n`);
      } else {
        const lastError = await deliverCallback(reg, payload, signature);
        if (lastError) {
          log(`callback for ${key} failed: ${lastError}`);
          return { error: `The app did not accept the upload: ${lastError}` };
        }
      }
      if (!reg.awaitServerData) return {};
      return await result;
    } finally {
      callbackWaiters.delete(key);
    }
  }

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 4030, options.host ?? "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${options.host ?? "127.0.0.1"}:${port}`;
  if (!origin) origin = url;
  return {
    url,
    port,
    close: async () => {
      for (const reg of registrations.values()) reg.stream?.end();
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { LOCAL_UPLOADTHING_TOKEN } = await import("../../lib/uploads/token");
  const fake = await startUploadthingFake({
    port: Number(process.env.UPLOADTHING_FAKE_PORT ?? 4030),
    token: process.env.UPLOADTHING_TOKEN ?? LOCAL_UPLOADTHING_TOKEN,
    dataDir: process.env.DATA_DIR ?? "./data",
    maxFileBytes: process.env.UPLOADTHING_FAKE_MAX_BYTES ? Number(process.env.UPLOADTHING_FAKE_MAX_BYTES) : undefined,
    publicUrl: process.env.UPLOADTHING_FAKE_PUBLIC_URL,
  });
  console.log(`[uploadthing-fake] listening on ${fake.url}`);
}
