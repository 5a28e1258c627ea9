/**
 * Keyset page cursors: where a list's next page starts, as the last row's sort value and id,
 * sent to clients as an opaque base64url string (`nextCursor`) and taken back as `after`.
 * Pure: the route decodes, the query uses the parts.
 */
export type CursorKey = string | number | null;

export interface ListCursor {
  /** The last row's value in the list's sort (a timestamp as stored, in ms; text; a number; null). */
  key: CursorKey;
  id: string;
}

export function encodeListCursor(c: ListCursor): string {
  return Buffer.from(JSON.stringify([c.key, c.id])).toString("base64url");
}

/** The cursor, or null when the string is not one `encodeListCursor` could have made. */
export function decodeListCursor(s: string): ListCursor | null {
  let v: unknown;
  try {
    v = JSON.parse(Buffer.from(s, "base64url").toString("utf8"));
  } catch {
    return null;
  }
  if (!Array.isArray(v) || v.length !== 2) return null;
  const [key, id] = v as unknown[];
  const keyOk = key === null || typeof key === "string" || (typeof key === "number" && Number.isFinite(key));
  if (!keyOk || typeof id !== "string" || id.length === 0 || id.length > 100) return null;
  return { key: key as CursorKey, id };
}
