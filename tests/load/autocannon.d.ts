// The few parts of autocannon's programmatic API the load run uses (the package ships no types).
declare module 'autocannon' {
  type Histogram = { average: number; mean: number; stddev: number; min: number; max: number; p50: number; p90: number; p99: number; total: number };
  export type Result = {
    requests: Histogram & { sent: number };
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    duration: number;
    '2xx': number;
    '4xx': number;
    '5xx': number;
    statusCodeStats: Record<string, { count: number }>;
  };
  export type RequestSpec = {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    setupRequest?: (req: RequestSpec) => RequestSpec;
  };
  export type Options = {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    timeout?: number;
    headers?: Record<string, string>;
    requests?: RequestSpec[];
  };
  function autocannon(opts: Options): Promise<Result>;
  export default autocannon;
}
