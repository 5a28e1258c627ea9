import { Worker } from "node:worker_threads";
import path from "node:path";
import { EstimateInputError } from "./errors";
import { FairQueue } from "./fair-queue";
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

interface Job {
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
  private readonly queue = new FairQueue<Job>();
  private nextId = 1;
  private closed = false;
  private started = 0;
  private reserved = 0;
  private readonly maxPerOwner: number;
  private readonly perOwner = new Map<string, number>();
  private readonly maxPerLane: number;
  private readonly perLane = new Map<string, number>();
  /** Recent job durations, s (a moving average), for the waits told to waiting users. */
  private meanJobS = 20;

  constructor(opts: PoolOptions = {}) {
    this.size = Math.max(1, Math.min(8, opts.size ?? 1));
    this.maxQueue = Math.max(0, opts.maxQueue ?? 8);
    this.timeLimitMs = opts.timeLimitMs ?? 60_000;
    this.heapMb = opts.maxOldGenerationSizeMb ?? 1024;
    this.workerPath = opts.workerPath ?? defaultWorkerPath();
    this.maxPerOwner = Math.max(1, opts.maxPerOwner ?? 2);
    this.maxPerLane = Math.max(1, opts.maxPerLane ?? Math.ceil((this.size + this.maxQueue) / 2));
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
  tryReserve(owner?: string, lane?: string): Reservation | Refusal {
    const refusal = (reason: Refusal["reason"]): Refusal => ({ reason, retryAfterS: this.retryAfterS, queued: this.queue.length });
    if (this.closed || this.isFull) return refusal("full");
    if (owner !== undefined && (this.perOwner.get(owner) ?? 0) >= this.maxPerOwner) return refusal("owner");
    if (lane !== undefined && (this.perLane.get(lane) ?? 0) >= this.maxPerLane) return refusal("lane");
    this.reserved += 1;
    if (owner !== undefined) this.perOwner.set(owner, (this.perOwner.get(owner) ?? 0) + 1);
    if (lane !== undefined) this.perLane.set(lane, (this.perLane.get(lane) ?? 0) + 1);
    let held = true;
    const letGo = () => {
      if (!held) return false;
      held = false;
      this.reserved -= 1;
      return true;
    };
    return {
      run: (input, onProgress, onPlace) => {
        if (!letGo()) return Promise.reject(new Error("this reservation was already used"));
        return this.submit<EstimateResult>({ input, onProgress, onPlace, owner, lane }, true);
      },
      release: () => {
        if (!letGo()) return;
        if (owner !== undefined) this.ownerDone(owner);
        if (lane !== undefined) this.laneDone(lane);
      },
    };
  }

  private laneDone(lane: string): void {
    const n = (this.perLane.get(lane) ?? 1) - 1;
    if (n <= 0) this.perLane.delete(lane);
    else this.perLane.set(lane, n);
  }

  /** A guess at the wait of a job with `ahead` jobs before it in line, s. */
  waitFor(ahead: number): number {
    const running = this.slots.filter((s) => s.job).length;
    // The running jobs are about half done on average; each round of `size` workers takes one mean job.
    return Math.round(((running > 0 ? 0.5 : 0) + Math.floor(ahead / this.size)) * this.meanJobS);
  }

  /** Tell every waiting job where it now stands (the queue is short: at most maxQueue jobs). */
  private tellPlaces(): void {
    this.queue.order().forEach((job, ahead) => {
      try {
        job.onPlace?.({ ahead, waitS: this.waitFor(ahead) });
      } catch {
        /* a failing listener must not stop the queue */
      }
    });
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

  /**
   * Run a job; `lane` (a firm) puts it in that firm's turn of the fair queue; `owner` (a user)
   * counts it against that user's share (OwnerBusyError when it is taken).
   */
  run(input: JobInput, onProgress?: ProgressFn, opts: { lane?: string; owner?: string; onPlace?: PlaceFn } = {}): Promise<EstimateResult> {
    return this.submit<EstimateResult>({ input, onProgress, lane: opts.lane, owner: opts.owner, onPlace: opts.onPlace });
  }

  /** Read (and for STEP/IGES tessellate) a model in a worker; same queue, limits, owner's share and errors as `run`. */
  read(job: ReadJob, opts: { lane?: string; owner?: string } = {}): Promise<ReadJobResult> {
    return this.submit<ReadJobResult>({ read: job, lane: opts.lane, owner: opts.owner });
  }

  /** `reserved`: room was already held by a reservation, so the queue bound was checked then. */
  private submit<T>(work: Pick<Job, "input" | "read" | "onProgress" | "owner" | "lane" | "onPlace">, reserved = false): Promise<T> {
    const { owner } = work;
    // A reserved job's lane share was taken at reservation; it is given back when the job settles.
    const lane = reserved ? work.lane : undefined;
    // A reserved job's owner share was taken at reservation; other work takes it now, or is refused.
    if (!reserved && owner !== undefined) {
      if ((this.perOwner.get(owner) ?? 0) >= this.maxPerOwner) return Promise.reject(new OwnerBusyError(this.retryAfterS));
      this.perOwner.set(owner, (this.perOwner.get(owner) ?? 0) + 1);
    }
    const startedAt = { t: 0 };
    const settle = () => {
      if (owner !== undefined) this.ownerDone(owner);
      if (lane !== undefined) this.laneDone(lane);
      if (startedAt.t > 0) this.meanJobS = 0.8 * this.meanJobS + 0.2 * ((performance.now() - startedAt.t) / 1000);
    };
    if (this.closed) {
      settle();
      return Promise.reject(new Error("the estimate pool is closed"));
    }
    return new Promise<T>((resolve, reject) => {
      const job: Job = {
        id: this.nextId++,
        ...work,
        started: startedAt,
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
      this.queue.push(job.lane ?? job.owner ?? "bureau", job);
      this.tellPlaces();
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const j of this.queue.drain()) j.reject(new Error("the estimate pool is closed"));
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
      if (msg.type === "result") job.resolve(msg.result);
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
    job.started.t = performance.now();
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
      this.tellPlaces();
    }
  }
}

let shared: EstimatePool | null = null;

/** One pool per process; size from $ESTIMATE_WORKERS (default 1). */
export function getEstimatePool(): EstimatePool {
  shared ??= new EstimatePool({ size: Number(process.env.ESTIMATE_WORKERS ?? 1) || 1 });
  return shared;
}
