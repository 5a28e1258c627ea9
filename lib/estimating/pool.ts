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

/** A job ran past its time limit (its worker was terminated) or its worker died (e.g. out of memory). */
export class EstimateJobError extends Error {
  readonly code: "timeout" | "worker-failed";
  constructor(code: "timeout" | "worker-failed", message: string) {
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
}

/** A read-only job: the model's triangles in millimetres, for the 3D preview. */
export interface ReadJob {
  bytes: Uint8Array;
  fileName: string;
  options: { units?: LengthUnit; toleranceMm?: number; bodies?: number[] };
}

export interface ReadJobResult {
  positions: Float32Array;
  format: MeshFormat;
  units: LengthUnit;
}

interface Job {
  id: number;
  input?: AnalyseInput;
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

  constructor(opts: PoolOptions = {}) {
    this.size = Math.max(1, Math.min(8, opts.size ?? 1));
    this.maxQueue = Math.max(0, opts.maxQueue ?? 8);
    this.timeLimitMs = opts.timeLimitMs ?? 60_000;
    this.heapMb = opts.maxOldGenerationSizeMb ?? 1024;
    this.workerPath = opts.workerPath ?? defaultWorkerPath();
  }

  /** Workers started so far (a retired or crashed worker is replaced by a new one). */
  get workersStarted(): number {
    return this.started;
  }

  /**
   * True when a job run now would be refused: every worker busy and the queue full. Callers
   * check it before costly preparation (fetching the file), so a refusal stays cheap.
   */
  get isFull(): boolean {
    return this.slots.length >= this.size && this.slots.every((s) => s.job) && this.queue.length >= this.maxQueue;
  }

  /** Seconds a refused caller should wait before trying again. */
  get retryAfterS(): number {
    return Math.max(1, Math.ceil(this.timeLimitMs / 1000 / 4));
  }

  /** Jobs waiting plus running. */
  get load(): { running: number; queued: number } {
    return { running: this.slots.filter((s) => s.job).length, queued: this.queue.length };
  }

  run(input: AnalyseInput, onProgress?: ProgressFn): Promise<EstimateResult> {
    return this.submit<EstimateResult>({ input, onProgress });
  }

  /** Read (and for STEP/IGES tessellate) a model in a worker; same queue, limits and errors as `run`. */
  read(job: ReadJob): Promise<ReadJobResult> {
    return this.submit<ReadJobResult>({ read: job });
  }

  private submit<T>(work: Pick<Job, "input" | "read" | "onProgress">): Promise<T> {
    if (this.closed) return Promise.reject(new Error("the estimate pool is closed"));
    return new Promise<T>((resolve, reject) => {
      const job: Job = { id: this.nextId++, ...work, resolve: resolve as (r: unknown) => void, reject };
      const idle = this.idleSlot();
      if (idle) { this.start(idle, job); return; }
      if (this.queue.length >= this.maxQueue) {
        reject(new QueueFullError(this.retryAfterS));
        return;
      }
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
        job.reject(e.name === "EstimateInputError" ? new EstimateInputError(e.code, e.message) : new EstimateJobError("worker-failed", e.message));
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
