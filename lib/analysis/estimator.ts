import "server-only";
import { AppError } from "@/lib/errors";
import { isEstimateInputError } from "@/lib/estimating/errors";
import { EstimateJobError, getEstimatePool, OwnerBusyError, QueueFullError, type JobInput, type ReadJob, type Refusal } from "@/lib/estimating/pool";
import type { EstimateResult } from "@/lib/estimating/types";

/**
 * The request thread's one door to the estimator (the estimate API and the 3D preview; analyses
 * go through lib/analysis/run.ts, which waits its turn instead of refusing). Room is held before
 * any costly step, and whatever the pool or the engine throws becomes an AppError from one table,
 * so every door answers a busy estimator, a bad file and a failed job with the same status:
 *
 * | what                                   | code                     | status |
 * |----------------------------------------|--------------------------|--------|
 * | this user already has their share      | busy:yours               | 429    |
 * | this firm's share of the room is full  | busy:firm                | 429    |
 * | the whole estimator is full            | busy                     | 503    |
 * | the file cannot be read                | unprocessable:<engine's> | 422    |
 * | the job ran past its time              | timeout:estimate         | 504    |
 * | the worker could not fetch the file    | bad_gateway:storage      | 502    |
 * | the worker died                        | unavailable:estimator    | 503    |
 *
 * Each busy answer carries Retry-After.
 */
export function estimatorError(e: unknown): unknown {
  if (e instanceof OwnerBusyError) return new AppError("busy:yours", e.message, undefined, e.retryAfterS);
  if (e instanceof QueueFullError) return new AppError("busy", e.message, undefined, e.retryAfterS);
  if (isEstimateInputError(e)) return new AppError(`unprocessable:${e.code}`, e.message);
  if (e instanceof EstimateJobError) {
    if (e.code === "timeout") return new AppError("timeout:estimate", e.message);
    if (e.code === "storage") return new AppError("bad_gateway:storage", e.message);
    return new AppError("unavailable:estimator", e.message);
  }
  return e;
}

/** A refused reservation as the same table's AppError; the message says how many wait and for how long. */
function refusalError(r: Refusal): AppError {
  const wait = `${r.queued} estimate${r.queued === 1 ? "" : "s"} in line; try again in about ${r.retryAfterS} s`;
  if (r.reason === "owner") return new AppError("busy:yours", new OwnerBusyError(r.retryAfterS).message, undefined, r.retryAfterS);
  if (r.reason === "lane") return new AppError("busy:firm", `Your firm's estimates already fill its share of the estimator (${wait}).`, undefined, r.retryAfterS);
  return new AppError("busy", `${new QueueFullError(r.retryAfterS).message} (${wait}.)`, undefined, r.retryAfterS);
}

/** Who holds the room: the user, inside their firm's lane (staff each have a lane of their own). */
export interface EstimatorCaller {
  id: string;
  orgId: string | null;
}

const laneOf = (user: EstimatorCaller) => user.orgId ?? `staff:${user.id}`;

/**
 * Hold room for one estimate, then `work` with the reservation's `run`; the room is given back
 * however it ends. Refused at once (busy) before anything costly is done.
 */
export async function withEstimator<T>(user: EstimatorCaller, work: (run: (input: JobInput) => Promise<EstimateResult>) => Promise<T>): Promise<T> {
  const ticket = getEstimatePool().tryReserve(user.id, laneOf(user));
  if ("reason" in ticket) throw refusalError(ticket);
  try {
    return await work((input) => ticket.run(input));
  } catch (e) {
    throw estimatorError(e);
  } finally {
    ticket.release();
  }
}

/** Read a stored model's triangles in the pool (the 3D preview), counted against the user's share. */
export async function readModel(user: EstimatorCaller, input: ReadJob) {
  try {
    return await getEstimatePool().read(input, { owner: user.id, lane: laneOf(user) });
  } catch (e) {
    throw estimatorError(e);
  }
}
