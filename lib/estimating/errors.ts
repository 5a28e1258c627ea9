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
  /**
   * Most object instances a file's component graph may expand to (3MF components and build
   * items; STEP assembly occurrences and mapped items), counted before anything is tessellated.
   * Nested instancing multiplies: ten components ten deep is ten billion instances from a file of
   * about a kilobyte. Our own bound, not a standard: well above a large-format build plate or an
   * assembly sent for quoting (hundreds of parts), far below what would hold a worker for minutes.
   */
  maxComponentInstances: 10_000,
} as const;
