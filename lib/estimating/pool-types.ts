import path from "node:path";
import { Worker } from "node:worker_threads";
import { EstimateInputError } from "./errors";
import type { AnalyseInput, ProgressFn } from "./analyse";
import type { EstimateResult, LengthUnit, MeshFormat } from "./types";

/** The estimate pool's errors and the shapes of its jobs (the pool itself is pool.ts). */

/** The queue is full: the caller should answer 503 with `retryAfterS`. */
export class QueueFullError extends Error {
  readonly retryAfterS: number;
  constructor(retryAfterS: number) {
    super("The estimator is busy; try again shortly.");
    this.name = "QueueFullError";
    this.retryAfterS = retryAfterS;
  }
}

/**
 * This owner (a user) already has their share of jobs in the pool, whichever route started them
 * (an estimate, an analysis, a mesh preview): the caller should answer 429 with `retryAfterS`,
 * or, for work that waits anyway, try again then.
 */
export class OwnerBusyError extends Error {
  readonly retryAfterS: number;
  constructor(retryAfterS: number) {
    super("You already have estimates running; wait for one to finish.");
    this.name = "OwnerBusyError";
    this.retryAfterS = retryAfterS;
  }
}

/**
 * A job ran past its time limit (its worker was terminated), its worker died (e.g. out of
 * memory), or the worker could not fetch the file from storage.
 */
export class EstimateJobError extends Error {
  readonly code: "timeout" | "worker-failed" | "storage";
  constructor(code: "timeout" | "worker-failed" | "storage", message: string) {
    super(message);
    this.name = "EstimateJobError";
    this.code = code;
  }
}

export interface PoolOptions {
  /** Worker threads (default 1: the machines have 2 cores shared with the web server). */
  size?: number;
  /** Jobs that may wait for a worker before new ones are refused. */
  maxQueue?: number;
  /** Per-job wall-clock limit, ms. */
  timeLimitMs?: number;
  /** Worker heap limit, MB (resourceLimits.maxOldGenerationSizeMb). */
  maxOldGenerationSizeMb?: number;
  /** Bundled worker file; default $ESTIMATE_WORKER_PATH or <cwd>/.worker/estimate-worker.mjs. */
  workerPath?: string;
  /**
   * Jobs one owner (a user) may have reserved, waiting or running at once (default 2), counted
   * over every kind of job: reservations (`tryReserve`), `run` and `read` given an owner.
   */
  maxPerOwner?: number;
  /**
   * Jobs one lane (a client firm) may have reserved, waiting or running at once (default: half
   * the pool's room, so another firm always finds a place).
   */
  maxPerLane?: number;
}

/** Where a waiting job stands: jobs before it in the fair order, and a guess at the wait (s). */
export interface QueuePlace {
  ahead: number;
  waitS: number;
}
export type PlaceFn = (place: QueuePlace) => void;

/**
 * A read-only job: the model's triangles in millimetres, for the 3D preview. The file comes in
 * hand (`bytes`) or is fetched by the worker (`remote`). With `maxTriangles`, a larger mesh is
 * thinned in the worker to every k-th triangle (the preview only).
 */
export type ReadJob = ({ bytes: Uint8Array } | { remote: RemoteFile }) & {
  fileName: string;
  options: { units?: LengthUnit; toleranceMm?: number; bodies?: number[]; maxTriangles?: number };
};

export interface ReadJobResult {
  positions: Float32Array;
  /** Triangles in the model (before any thinning). */
  triangles: number;
  format: MeshFormat;
  units: LengthUnit;
}

/**
 * A stored file the worker fetches itself (a short-lived signed URL), so the request thread never
 * holds or copies the model's bytes; the worker runs the upload content check on what it fetched.
 */
export interface RemoteFile {
  url: string;
  maxBytes: number;
  timeoutMs?: number;
}

/** The analysis input with the file either in hand (`bytes`) or still in storage (`remote`). */
export type JobInput = AnalyseInput | (Omit<AnalyseInput, "bytes"> & { remote: RemoteFile });

/**
 * Room in the pool held for one caller while it prepares its job (signs a URL, loads the
 * catalogue), so that two callers can't both see room and both be let in. `run` uses it up;
 * `release` gives it back unused. Either may be called once; further calls do nothing.
 */
export interface Reservation {
  run(input: JobInput, onProgress?: ProgressFn, onPlace?: PlaceFn): Promise<EstimateResult>;
  release(): void;
}

/**
 * Why `tryReserve` said no: the whole pool is busy, this owner already has its share, or this
 * firm already has its share (`lane`); with how many jobs are in line and a guess at the wait.
 */
export type Refusal = { reason: "full" | "owner" | "lane"; retryAfterS: number; queued: number };

/** A worker's error message as the error the caller sees: a file the engine refused, storage, or a failed worker. */
export function workerError(e: { name: string; code: string; message: string }): Error {
  if (e.name === "EstimateInputError") return new EstimateInputError(e.code, e.message);
  if (e.name === "ModelFetchError") return new EstimateJobError("storage", e.message);
  return new EstimateJobError("worker-failed", e.message);
}

/** A job in the pool (internal to pool.ts). */
export interface Job {
  id: number;
  input?: JobInput;
  /** Counted against this owner's in-flight limit until the job settles. */
  owner?: string;
  /** The firm it is for: waiting jobs are served one lane at a time, in turn. */
  lane?: string;
  onPlace?: PlaceFn;
  /** When a worker took it (performance.now()), for the mean job time. */
  started: { t: number };
  read?: ReadJob;
  onProgress?: ProgressFn;
  resolve: (r: unknown) => void;
  reject: (e: Error) => void;
}

/** A worker and the job it runs (internal to pool.ts). */
export interface Slot { worker: Worker; job: Job | null; timer: NodeJS.Timeout | null }

/** How many jobs each owner (or lane) holds; an absent key is none. */
export class Counts {
  private readonly n = new Map<string, number>();
  of(key: string): number {
    return this.n.get(key) ?? 0;
  }
  add(key: string | undefined): void {
    if (key !== undefined) this.n.set(key, this.of(key) + 1);
  }
  remove(key: string | undefined): void {
    if (key === undefined) return;
    const left = this.of(key) - 1;
    if (left <= 0) this.n.delete(key);
    else this.n.set(key, left);
  }
}

/** What a worker posts: progress, or the job's result or error (and whether it should be replaced). */
export interface WorkerMessage { id: number; type: string; fraction?: number; stage?: string; result?: unknown; error?: { name: string; code: string; message: string }; retire?: boolean }

/** Start one worker thread with its heap limit, unreferenced while idle; `dead` hears its error or exit. */
export function startWorker(workerPath: string, heapMb: number, on: { message: (msg: WorkerMessage) => void; dead: (err: Error | number) => void }): Slot {
  const worker = new Worker(workerPath, { resourceLimits: { maxOldGenerationSizeMb: heapMb } });
  worker.unref();
  worker.on("message", on.message);
  worker.on("error", on.dead);
  worker.on("exit", on.dead);
  return { worker, job: null, timer: null };
}

export function defaultWorkerPath(): string {
  return process.env.ESTIMATE_WORKER_PATH ?? path.join(process.cwd(), ".worker", "estimate-worker.mjs");
}

/** The pool's options with their defaults, bounded. */
export type PoolSettings = Required<PoolOptions>;
export function poolSettings(opts: PoolOptions): PoolSettings {
  const size = Math.max(1, Math.min(8, opts.size ?? 1));
  const maxQueue = Math.max(0, opts.maxQueue ?? 8);
  return {
    size,
    maxQueue,
    timeLimitMs: opts.timeLimitMs ?? 60_000,
    maxOldGenerationSizeMb: opts.maxOldGenerationSizeMb ?? 1024,
    workerPath: opts.workerPath ?? defaultWorkerPath(),
    maxPerOwner: Math.max(1, opts.maxPerOwner ?? 2),
    maxPerLane: Math.max(1, opts.maxPerLane ?? Math.ceil((size + maxQueue) / 2)),
  };
}

