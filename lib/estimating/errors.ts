/**
 * A file or option the estimator cannot use. `message` is one plain sentence for the user;
 * `code` is stable for programs (e.g. "stl:truncated", "3mf:zip-bomb").
 */
export class EstimateInputError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = "EstimateInputError";
    this.code = code;
  }
}

export function isEstimateInputError(e: unknown): e is EstimateInputError {
  return e instanceof Error && e.name === "EstimateInputError" && typeof (e as EstimateInputError).code === "string";
}

/** Hard limits every reader keeps, so a hostile file costs bounded time and memory. */
export const LIMITS = {
  /** Largest triangle count accepted from any file (after 3MF instancing). */
  maxTriangles: 20_000_000,
  /** Largest uncompressed 3MF part, bytes. */
  maxUnzippedBytes: 512 * 1024 * 1024,
  /** Largest compression ratio of one 3MF entry before it is treated as a zip bomb. */
  maxZipRatio: 1000,
  /** Largest coordinate magnitude accepted, mm (100 km: anything beyond is a broken file). */
  maxCoordinate: 1e8,
} as const;
