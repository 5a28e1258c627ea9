import { FairQueue } from "./fair-queue";
import type { ProgressFn } from "./analyse";
import type { EstimateResult } from "./types";
import { Counts, EstimateJobError, poolSettings, type PoolSettings, OwnerBusyError, QueueFullError, startWorker, workerError, type Job, type JobInput, type Slot, type PlaceFn, type PoolOptions, type ReadJob, type ReadJobResult, type Refusal, type Reservation } from "./pool-types";

export * from "./pool-types";

/**
 * Runs `analyse` off the request thread in a small pool of worker threads, with a bounded
 * queue, a per-job time limit and a memory limit; progress is relayed to the job's callback.
 */
export class EstimatePool {
  private readonly cfg: PoolSettings;
  private readonly slots: Slot[] = [];
  private readonly queue = new FairQueue<Job>();
  private nextId = 1;
  private closed = false;
  private started = 0;
  private reserved = 0;
  private readonly perOwner = new Counts();
  private readonly perLane = new Counts();
  /** Recent job durations, s (a moving average), for the waits told to waiting users. */
  private meanJobS = 20;

  constructor(opts: PoolOptions = {}) {
    this.cfg = poolSettings(opts);
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
    return this.inFlight >= this.cfg.size + this.cfg.maxQueue;
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
    if (owner !== undefined && this.perOwner.of(owner) >= this.cfg.maxPerOwner) return refusal("owner");
    if (lane !== undefined && this.perLane.of(lane) >= this.cfg.maxPerLane) return refusal("lane");
    this.reserved += 1;
    this.perOwner.add(owner);
    this.perLane.add(lane);
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
        this.perOwner.remove(owner);
        this.perLane.remove(lane);
      },
    };
  }

  /** A guess at the wait of a job with `ahead` jobs before it in line, s. */
  waitFor(ahead: number): number {
    const running = this.slots.filter((s) => s.job).length;
    // The running jobs are about half done on average; each round of `size` workers takes one mean job.
    return Math.round(((running > 0 ? 0.5 : 0) + Math.floor(ahead / this.cfg.size)) * this.meanJobS);
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

  /** Seconds a refused caller should wait before trying again. */
  get retryAfterS(): number {
    return Math.max(1, Math.ceil(this.cfg.timeLimitMs / 1000 / 4));
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
      if (this.perOwner.of(owner) >= this.cfg.maxPerOwner) return Promise.reject(new OwnerBusyError(this.retryAfterS));
      this.perOwner.add(owner);
    }
    const startedAt = { t: 0 };
    const settle = () => {
      this.perOwner.remove(owner);
      this.perLane.remove(lane);
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
    return this.slots.length < this.cfg.size ? this.spawn() : null;
  }

  private spawn(): Slot {
    this.started += 1;
    const slot: Slot = startWorker(this.cfg.workerPath, this.cfg.maxOldGenerationSizeMb, {
      message: (msg) => {
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
        else job.reject(workerError(msg.error!));
        this.pump();
      },
      dead: (err) => {
        if (!this.slots.includes(slot)) return;
        const job = slot.job;
        this.remove(slot);
        if (job) job.reject(new EstimateJobError("worker-failed", `The analysis stopped unexpectedly (${typeof err === "number" ? `exit ${err}` : err.message}).`));
        this.pump();
      },
    });
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
      job.reject(new EstimateJobError("timeout", `The analysis took longer than ${Math.round(this.cfg.timeLimitMs / 1000)} s and was stopped.`));
      this.pump();
    }, this.cfg.timeLimitMs);
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

/**
 * One pool per process; size from $ESTIMATE_WORKERS (default 1). Kept on globalThis: the built app
 * bundles this module into several chunks (the estimate route, analysis runs, health, the
 * background pass), and a module-level variable would give each chunk a pool of its own.
 */
const holder = globalThis as unknown as { layerwrightEstimatePool?: EstimatePool };
export function getEstimatePool(): EstimatePool {
  holder.layerwrightEstimatePool ??= new EstimatePool({ size: Number(process.env.ESTIMATE_WORKERS ?? 1) || 1 });
  return holder.layerwrightEstimatePool;
}
