import type { ServerResponse } from "node:http";

/** The upload fake's options, its handle, and one upload route registration. */

export interface UploadthingFakeOptions {
  port?: number;
  host?: string;
  /** The same token the app uses (base64 JSON { apiKey, appId, regions }). */
  token: string;
  /** Files go to `<dataDir>/uploads/<fileKey>`. */
  dataDir: string;
  /** Largest single upload in bytes (default 256 MiB). */
  maxFileBytes?: number;
  /** Base URL apps and browsers use for this fake (default: the listening address). */
  publicUrl?: string;
  /** How long a PUT waits for the app's `/callback-result` before answering (ms). */
  callbackTimeoutMs?: number;
  log?: (line: string) => void;
}

export interface UploadthingFake {
  url: string;
  port: number;
  close: () => Promise<void>;
}

export interface Registration {
  metadata: unknown;
  isDev: boolean;
  callbackUrl: string;
  callbackSlug: string;
  awaitServerData: boolean;
  /** Dev mode: the open `/route-metadata` response the SDK reads callbacks from. */
  stream: ServerResponse | null;
  pendingKeys: Set<string>;
}
