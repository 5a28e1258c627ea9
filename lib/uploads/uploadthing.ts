import "server-only";
import { UTApi } from "uploadthing/server";
import { fetchModelBytes, ModelFetchError } from "../estimating/fetch-model";
import { env, type Env } from "../env";
import { LOCAL_UPLOADTHING_TOKEN, parseUploadthingToken } from "./token";

/**
 * The one place UploadThing is configured. With `UPLOADTHING_INGEST_URL` / `UPLOADTHING_API_URL`
 * set, the SDK talks to the local fake (mocks/uploadthing); unset, to the hosted service.
 */
export interface UploadthingSettings {
  token: string;
  apiUrl?: string;
  ingestUrl?: string;
  callbackUrl?: string;
  ufsHost?: string;
  ufsAppIdLocation?: "subdomain" | "path";
  isLocal: boolean;
}

/**
 * Derive the settings: an explicit `UPLOADTHING_TOKEN` wins; in local mode (an ingest URL set and
 * no token) the fake's built-in token is used, so the demo needs no secret.
 */
export function uploadthingSettings(e: Env = env()): UploadthingSettings {
  const isLocal = Boolean(e.UPLOADTHING_INGEST_URL);
  const token = e.UPLOADTHING_TOKEN ?? (isLocal ? LOCAL_UPLOADTHING_TOKEN : undefined);
  if (!token) {
    throw new Error("Uploads are not configured: set UPLOADTHING_TOKEN (hosted) or UPLOADTHING_INGEST_URL (the local fake)");
  }
  parseUploadthingToken(token);
  return {
    token,
    apiUrl: e.UPLOADTHING_API_URL ?? (isLocal ? e.UPLOADTHING_INGEST_URL : undefined),
    ingestUrl: e.UPLOADTHING_INGEST_URL,
    callbackUrl: e.UPLOADTHING_CALLBACK_URL,
    ufsHost: e.UPLOADTHING_UFS_HOST,
    ufsAppIdLocation: e.UPLOADTHING_UFS_APP_ID_LOCATION ?? (e.UPLOADTHING_UFS_HOST ? "path" : undefined),
    isLocal,
  };
}

const defined = <T extends object>(o: T): T => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;

/** `config` for `createRouteHandler({ router, config: uploadthingRouteConfig() })`. */
export function uploadthingRouteConfig(s: UploadthingSettings = uploadthingSettings()) {
  return defined({ token: s.token, ingestUrl: s.ingestUrl, callbackUrl: s.callbackUrl });
}

let utapi: UTApi | undefined;

/** The process-wide server SDK client (deleteFiles, uploadFiles, generateSignedURL). */
export function getUtApi(): UTApi {
  if (!utapi) {
    const s = uploadthingSettings();
    utapi = new UTApi(defined({ token: s.token, apiUrl: s.apiUrl, ingestUrl: s.ingestUrl, ufsHost: s.ufsHost, ufsAppIdLocation: s.ufsAppIdLocation }));
  }
  return utapi;
}

/** For tests that change the environment between cases. */
export function resetUtApi(): void {
  utapi = undefined;
}

export class UploadFetchError extends Error {
  constructor(
    message: string,
    readonly status: number | null,
  ) {
    super(message);
    this.name = "UploadFetchError";
  }
}

const KEY = /^[A-Za-z0-9_-]{1,128}$/;

/** Hosts a stored file may be read from: the hosted CDN, or the configured local fake. */
function isAllowedFileHost(url: URL, s: UploadthingSettings): boolean {
  const local = [s.ingestUrl, s.apiUrl, s.ufsHost ? `http://${s.ufsHost}` : undefined]
    .filter((u): u is string => Boolean(u))
    .map((u) => new URL(u).host);
  if (local.includes(url.host)) return true;
  return url.protocol === "https:" && (url.hostname === "utfs.io" || url.hostname.endsWith(".ufs.sh"));
}

/** The file key of a stored file's URL (`…/f/<key>` or `…/a/<appId>/<key>`), or a bare key. */
export function fileKeyOf(urlOrKey: string, s: UploadthingSettings = uploadthingSettings()): string {
  if (KEY.test(urlOrKey)) return urlOrKey;
  let url: URL;
  try {
    url = new URL(urlOrKey);
  } catch {
    throw new UploadFetchError("Not a file URL or key", null);
  }
  if (!isAllowedFileHost(url, s)) throw new UploadFetchError(`Refusing to read files from ${url.host}`, null);
  const m = url.pathname.match(/^\/(?:f|a\/[^/]+)\/([A-Za-z0-9_-]{1,128})$/);
  if (!m) throw new UploadFetchError("Not a stored-file URL", null);
  return m[1]!;
}

/**
 * A short-lived signed URL of a stored file, for server-side readers (the estimate worker fetches
 * by it). Only keys or URLs of our own storage are accepted; never given to browsers.
 */
export async function signedFileUrl(urlOrKey: string, opts: { expiresInS?: number; utApi?: UTApi } = {}): Promise<string> {
  const key = fileKeyOf(urlOrKey);
  const { ufsUrl } = await (opts.utApi ?? getUtApi()).generateSignedURL(key, { expiresIn: opts.expiresInS ?? 60 });
  return ufsUrl;
}

/**
 * Read a stored file's bytes on the server (for the analysis and the authorized download route;
 * browsers never get the storage URL). Reads through a short-lived signed URL, so private files
 * work too; refuses other hosts and anything over `maxBytes`.
 */
export async function fetchUploadedFile(urlOrKey: string, opts: { maxBytes?: number; utApi?: UTApi } = {}): Promise<Uint8Array> {
  const maxBytes = opts.maxBytes ?? 256 * 1024 * 1024;
  const ufsUrl = await signedFileUrl(urlOrKey, { utApi: opts.utApi });
  try {
    return await fetchModelBytes(ufsUrl, { maxBytes });
  } catch (e) {
    if (e instanceof ModelFetchError) throw new UploadFetchError(e.message, e.status);
    throw e;
  }
}

/** A stored file opened for reading: its body as a stream, and its length when storage says it. */
export interface OpenedFile {
  body: ReadableStream<Uint8Array>;
  sizeBytes: number | null;
}

/**
 * Open a stored file as a stream (the authorized download route pipes it to the browser), so a
 * large model never sits whole in the server's memory. Throws UploadFetchError when storage
 * refuses or is unreachable.
 */
export async function openUploadedFile(urlOrKey: string, opts: { utApi?: UTApi; timeoutMs?: number } = {}): Promise<OpenedFile> {
  const ufsUrl = await signedFileUrl(urlOrKey, { utApi: opts.utApi, expiresInS: 60 });
  const res = await fetch(ufsUrl, { signal: AbortSignal.timeout(opts.timeoutMs ?? 10 * 60_000) }).catch((e: unknown) => {
    throw new UploadFetchError(`File storage unreachable: ${(e as Error).message}`, null);
  });
  if (res.status === 404) throw new UploadFetchError("The stored file was not found.", 404);
  if (!res.ok || !res.body) throw new UploadFetchError(`File storage answered ${res.status}.`, res.status);
  const encoded = (res.headers.get("content-encoding") ?? "identity") !== "identity";
  const declared = Number(res.headers.get("content-length") ?? "");
  return { body: res.body, sizeBytes: !encoded && Number.isFinite(declared) && declared >= 0 && res.headers.has("content-length") ? declared : null };
}

/**
 * The first `maxBytes` of a stored file and its whole length, reading no further than needed
 * (the attach action sniffs the format from the head; the worker reads and hashes the whole).
 */
export async function readUploadedFileHead(urlOrKey: string, maxBytes: number, opts: { utApi?: UTApi } = {}): Promise<{ head: Uint8Array; sizeBytes: number | null }> {
  const file = await openUploadedFile(urlOrKey, { utApi: opts.utApi, timeoutMs: 60_000 });
  return { head: await readHead(file.body, maxBytes), sizeBytes: file.sizeBytes };
}

/** Read up to `maxBytes` from a stream, then cancel it (the rest is never fetched). */
export async function readHead(body: ReadableStream<Uint8Array>, maxBytes: number): Promise<Uint8Array> {
  const out = new Uint8Array(maxBytes);
  let size = 0;
  const reader = body.getReader();
  try {
    while (size < maxBytes) {
      const { done, value } = await reader.read();
      if (done) break;
      const take = Math.min(value.length, maxBytes - size);
      out.set(value.subarray(0, take), size);
      size += take;
    }
  } finally {
    await reader.cancel().catch(() => undefined);
  }
  return out.subarray(0, size);
}

/** Delete files from the upload store by key (retention); throws when the store refuses. */
export async function deleteStoredFiles(keys: string[], opts: { utApi?: UTApi } = {}): Promise<void> {
  if (keys.length === 0) return;
  const r = await (opts.utApi ?? getUtApi()).deleteFiles(keys);
  if (!r.success) throw new UploadFetchError("The upload store did not delete the files.", null);
}
