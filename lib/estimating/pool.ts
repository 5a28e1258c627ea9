import { Worker } from "node:worker_threads";
import path from "node:path";
import { EstimateInputError } from "./errors";
import type { AnalyseInput, ProgressFn } from "./analyse";
import type { EstimateResult, LengthUnit, MeshFormat } from "./types";

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
  /** Jobs one owner (e.g. a user) may have reserved, waiting or running at once (default 2). */
  maxPerOwner?: number;
}

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
  run(input: JobInput, onProgress?: ProgressFn): Promise<EstimateResult>;
  release(): void;
}

/** Why `tryReserve` said no: the whole pool is busy, or this owner already has its share. */
export type Refusal = { reason: "full" | "owner"; retryAfterS: number };

interface Job {
  id: number;
  input?: JobInput;
  /** Counted against this owner's in-flight limit until the job settles. */
  owner?: string;
  read?: ReadJob;
  onProgress?: ProgressFn;
  resolve: (r: unknown) => void;
  reject: (e: Error) => void;
}

interface Slot { worker: Worker; job: Job | null; timer: NodeJS.Timeout | null }

export function defaultWorkerPath(): string {
  return process.env.ESTIMATE_WORKER_PATH ?? path.join(process.cwd(), ".worker", "estimate-worker.mjs");
}

/**
 * Runs `analyse` off the request thread in a small pool of worker threads, with a bounded
 * queue, a per-job time limit and a memory limit; progress is relayed to the job's callback.
 */
export class EstimatePool {
  private readonly size: number;
  private readonly maxQueue: number;
  private readonly timeLimitMs: number;
  private readonly heapMb: number;
  private readonly workerPath: string;
  private readonly slots: Slot[] = [];
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  private started = 0;
  private reserved = 0;
  private readonly maxPerOwner: number;
  private readonly perOwner = new Map<string, number>();

  constructor(opts: PoolOptions = {}) {
    this.size = Math.max(1, Math.min(8, opts.size ?? 1));
    this.maxQueue = Math.max(0, opts.maxQueue ?? 8);
    this.timeLimitMs = opts.timeLimitMs ?? 60_000;
    this.heapMb = opts.maxOldGenerationSizeMb ?? 1024;
    this.workerPath = opts.workerPath ?? defaultWorkerPath();
    this.maxPerOwner = Math.max(1, opts.maxPerOwner ?? 2);
  }

  /** Workers started so far (a retired or crashed worker is replaced by a new one). */
  get workersStarted(): number {
    return this.started;
  }

  /**
   * True when a job run now would be refused: running, waiting and reserved jobs fill every
   * worker and the queue. Callers that prepare work first use `tryReserve`, which checks and holds
   * in one step.
   */
  get isFull(): boolean {
    return this.inFlight >= this.size + this.maxQueue;
  }

  /** Jobs running, waiting, and reserved by callers still preparing theirs. */
  private get inFlight(): number {
    return this.slots.filter((s) => s.job).length + this.queue.length + this.reserved;
  }

  /**
   * Hold room for one job, or say why not. Synchronous, so the check and the hold are one step:
   * a caller that gets a reservation will not be refused by `run` later.
   */
  tryReserve(owner?: string): Reservation | Refusal {
    if (this.closed || this.isFull) return { reason: "full", retryAfterS: this.retryAfterS };
    if (owner !== undefined && (this.perOwner.get(owner) ?? 0) >= this.maxPerOwner) return { reason: "owner", retryAfterS: this.retryAfterS };
    this.reserved += 1;
    if (owner !== undefined) this.perOwner.set(owner, (this.perOwner.get(owner) ?? 0) + 1);
    let held = true;
    const letGo = () => {
      if (!held) return false;
      held = false;
      this.reserved -= 1;
      return true;
    };
    return {
      run: (input, onProgress) => {
        if (!letGo()) return Promise.reject(new Error("this reservation was already used"));
        return this.submit<EstimateResult>({ input, onProgress, owner }, true);
      },
      release: () => {
        if (letGo() && owner !== undefined) this.ownerDone(owner);
      },
    };
  }

  private ownerDone(owner: string): void {
    const n = (this.perOwner.get(owner) ?? 1) - 1;
    if (n <= 0) this.perOwner.delete(owner);
    else this.perOwner.set(owner, n);
  }

  /** Seconds a refused caller should wait before trying again. */
  get retryAfterS(): number {
    return Math.max(1, Math.ceil(this.timeLimitMs / 1000 / 4));
  }

  /** Jobs waiting plus running. */
  get load(): { running: number; queued: number } {
    return { running: this.slots.filter((s) => s.job).length, queued: this.queue.length };
  }

  run(input: JobInput, onProgress?: ProgressFn): Promise<EstimateResult> {
    return this.submit<EstimateResult>({ input, onProgress });
  }

  /** Read (and for STEP/IGES tessellate) a model in a worker; same queue, limits and errors as `run`. */
  read(job: ReadJob): Promise<ReadJobResult> {
    return this.submit<ReadJobResult>({ read: job });
  }

  /** `reserved`: room was already held by a reservation, so the queue bound was checked then. */
  private submit<T>(work: Pick<Job, "input" | "read" | "onProgress" | "owner">, reserved = false): Promise<T> {
    const { owner } = work;
    const settle = () => {
      if (owner !== undefined) this.ownerDone(owner);
    };
    if (this.closed) {
      settle();
      return Promise.reject(new Error("the estimate pool is closed"));
    }
    return new Promise<T>((resolve, reject) => {
      const job: Job = {
        id: this.nextId++,
        ...work,
        resolve: (r) => { settle(); (resolve as (r: unknown) => void)(r); },
        reject: (e) => { settle(); reject(e); },
      };
      // Reserved work had its room counted when it was reserved; other work must find room now
      // (held reservations included, so nobody is let in over them).
      if (!reserved && this.isFull) {
        job.reject(new QueueFullError(this.retryAfterS));
        return;
      }
      const idle = this.idleSlot();
      if (idle) { this.start(idle, job); return; }
      this.queue.push(job);
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const j of this.queue.splice(0)) j.reject(new Error("the estimate pool is closed"));
    await Promise.all(this.slots.splice(0).map((s) => { s.job?.reject(new Error("the estimate pool is closed")); if (s.timer) clearTimeout(s.timer); return s.worker.terminate(); }));
  }

  private idleSlot(): Slot | null {
    const free = this.slots.find((s) => !s.job);
    if (free) return free;
    if (this.slots.length < this.size) {
      const slot = this.spawn();
      return slot;
    }
    return null;
  }

  private spawn(): Slot {
    const worker = new Worker(this.workerPath, { resourceLimits: { maxOldGenerationSizeMb: this.heapMb } });
    this.started += 1;
    const slot: Slot = { worker, job: null, timer: null };
    worker.unref();
    worker.on("message", (msg: { id: number; type: string; fraction?: number; stage?: string; result?: unknown; error?: { name: string; code: string; message: string }; retire?: boolean }) => {
      const job = slot.job;
      if (!job || msg.id !== job.id) return;
      if (msg.type === "progress") { try { job.onProgress?.(msg.fraction ?? 0, msg.stage ?? ""); } catch { /* a failing listener must not kill the job */ } return; }
      this.finish(slot);
      if (msg.retire) {
        // Its CAD kernel's memory has grown past the limit: replace the worker before the next job.
        this.remove(slot);
        void slot.worker.terminate();
      }
      if (msg.type === "result") job.resolve(msg.result!);
      else {
        const e = msg.error!;
        job.reject(
          e.name === "EstimateInputError"
            ? new EstimateInputError(e.code, e.message)
            : e.name === "ModelFetchError"
              ? new EstimateJobError("storage", e.message)
              : new EstimateJobError("worker-failed", e.message),
        );
      }
      this.pump();
    });
    const dead = (err: Error | number) => {
      const job = slot.job;
      this.remove(slot);
      if (job) job.reject(new EstimateJobError("worker-failed", `The analysis stopped unexpectedly (${typeof err === "number" ? `exit ${err}` : err.message}).`));
      this.pump();
    };
    worker.on("error", dead);
    worker.on("exit", (code) => { if (this.slots.includes(slot)) dead(code); });
    this.slots.push(slot);
    return slot;
  }

  private remove(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer);
    const i = this.slots.indexOf(slot);
    if (i >= 0) this.slots.splice(i, 1);
  }

  private start(slot: Slot, job: Job): void {
    slot.job = job;
    slot.worker.ref();
    slot.timer = setTimeout(() => {
      this.remove(slot);
      void slot.worker.terminate();
      job.reject(new EstimateJobError("timeout", `The analysis took longer than ${Math.round(this.timeLimitMs / 1000)} s and was stopped.`));
      this.pump();
    }, this.timeLimitMs);
    if (job.read) slot.worker.postMessage({ id: job.id, read: job.read });
    else slot.worker.postMessage({ id: job.id, input: job.input });
  }

  private finish(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = null;
    slot.job = null;
    slot.worker.unref();
  }

  private pump(): void {
    while (this.queue.length > 0 && !this.closed) {
      const slot = this.idleSlot();
      if (!slot) return;
      this.start(slot, this.queue.shift()!);
    }
  }
}

let shared: EstimatePool | null = null;

/** One pool per process; size from $ESTIMATE_WORKERS (default 1). */
export function getEstimatePool(): EstimatePool {
  shared ??= new EstimatePool({ size: Number(process.env.ESTIMATE_WORKERS ?? 1) || 1 });
  return shared;
}
