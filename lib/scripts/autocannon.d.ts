/** The part of autocannon 8's API the load script uses (the package ships no types). */
declare module "autocannon" {
  export interface Histogram {
    average: number;
    mean: number;
    p50: number;
    p90: number;
    p99: number;
    max: number;
    total: number;
  }
  export interface Options {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    timeout?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
    pipelining?: number;
  }
  export interface Result {
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
    statusCodeStats: Record<string, { count: number }>;
    "1xx": number;
    "2xx": number;
    "3xx": number;
    "4xx": number;
    "5xx": number;
  }
  /** The running benchmark: awaitable for its result, stoppable early. */
  export interface Instance extends PromiseLike<Result> {
    on(event: "response", listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): this;
    stop(): void;
  }
  function autocannon(opts: Options): Instance;
  export default autocannon;
}
