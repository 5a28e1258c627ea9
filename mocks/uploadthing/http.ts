import type { IncomingMessage, ServerResponse } from "node:http";

/** The upload fake's HTTP plumbing: errors with a status, bodies with a size limit, CORS and JSON answers. */

export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

export const DEFAULT_MAX = 256 * 1024 * 1024;

export async function readBody(req: IncomingMessage, limit: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > limit) throw new HttpError(413, `Upload too large: the limit is ${limit} bytes`);
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks);
}

export function cors(req: IncomingMessage, res: ServerResponse): void {
  res.setHeader("access-control-allow-origin", req.headers.origin ?? "*");
  res.setHeader("vary", "origin");
  res.setHeader("access-control-allow-methods", "GET, HEAD, PUT, POST, OPTIONS");
  res.setHeader("access-control-allow-headers", req.headers["access-control-request-headers"] ?? "*");
  res.setHeader("access-control-expose-headers", "x-ut-range-start");
  res.setHeader("access-control-max-age", "600");
}

export function json(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { "content-type": "application/json" });
  res.end(JSON.stringify(body));
}

/** A JSON object body (at most 5 MB), or 400. */
export async function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  const buf = await readBody(req, 5_000_000);
  try {
    const v: unknown = JSON.parse(buf.toString("utf8"));
    if (v && typeof v === "object" && !Array.isArray(v)) return v as Record<string, unknown>;
  } catch {
    /* below */
  }
  throw new HttpError(400, "Expected a JSON object body");
}
