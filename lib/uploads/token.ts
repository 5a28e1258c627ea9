/**
 * The UploadThing token is base64 of JSON `{ apiKey, appId, regions }`. This one is for the
 * local fake only (mocks/uploadthing): it opens nothing on the hosted service.
 */
export const LOCAL_UPLOADTHING_TOKEN_FIELDS = {
  apiKey: "sk_layerwright_local_uploads",
  appId: "layerwright-local",
  regions: ["local"],
} as const;

export const LOCAL_UPLOADTHING_TOKEN = Buffer.from(JSON.stringify(LOCAL_UPLOADTHING_TOKEN_FIELDS)).toString("base64");

export interface ParsedUploadthingToken {
  apiKey: string;
  appId: string;
  regions: string[];
}

/** Decode a token, or throw a message that says what is wrong with it. */
export function parseUploadthingToken(token: string): ParsedUploadthingToken {
  let v: unknown;
  try {
    v = JSON.parse(Buffer.from(token, "base64").toString("utf8"));
  } catch {
    throw new Error("UPLOADTHING_TOKEN is not base64-encoded JSON");
  }
  const t = v as Partial<ParsedUploadthingToken>;
  if (typeof t.apiKey !== "string" || !t.apiKey.startsWith("sk_") || typeof t.appId !== "string" || !Array.isArray(t.regions) || t.regions.length === 0) {
    throw new Error("UPLOADTHING_TOKEN must encode { apiKey: 'sk_…', appId, regions: [...] }");
  }
  return { apiKey: t.apiKey, appId: t.appId, regions: t.regions.map(String) };
}
