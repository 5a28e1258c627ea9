import type { ServerResponse } from "node:http";
import { HttpError, json } from "./http";
import { FILE_KEY } from "./protocol";
import type { FileStore } from "./store";

/** The `/v6/*` calls the server SDK (UTApi) makes: deleteFiles and listFiles. */
export function handleV6(res: ServerResponse, path: string, body: Record<string, unknown>, files: FileStore): void {
  if (path === "/v6/deleteFiles") {
    const keys = Array.isArray(body.fileKeys) ? body.fileKeys : null;
    const customIds = Array.isArray(body.customIds) ? body.customIds : null;
    if (!keys && !customIds) throw new HttpError(400, "Provide fileKeys or customIds");
    const targets = keys
      ? keys.filter((k): k is string => typeof k === "string" && FILE_KEY.test(k))
      : files.list().filter((f) => f.customId !== null && customIds!.includes(f.customId)).map((f) => f.key);
    let deleted = 0;
    for (const k of targets) if (files.remove(k)) deleted += 1;
    return json(res, 200, { success: true, deletedCount: deleted });
  }
  if (path === "/v6/listFiles") {
    const all = files.list();
    const offset = Number(body.offset ?? 0) || 0;
    const limit = Number(body.limit ?? 500) || 500;
    const page = all.slice(offset, offset + limit);
    return json(res, 200, {
      hasMore: offset + limit < all.length,
      files: page.map((f) => ({ id: f.key, key: f.key, name: f.name, size: f.size, customId: f.customId, status: "Uploaded", uploadedAt: f.uploadedAt })),
    });
  }
  throw new HttpError(404, `The upload fake does not implement ${path}`);
}
