// Minimal types for autocannon 8 (the package ships none): only what scripts/bench-load.ts uses.
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events';

  export interface AutocannonRequest {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string | Buffer;
    setupRequest?: (req: AutocannonRequest, context: Record<string, unknown>) => AutocannonRequest | null;
    onResponse?: (status: number, body: string, context: Record<string, unknown>, headers: Record<string, string>) => void;
  }

  export interface AutocannonOptions {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    maxOverallRequests?: number;
    /** Requests per second over all connections. */
    overallRate?: number;
    timeout?: number;
    method?: string;
    headers?: Record<string, string>;
    body?: string;
    requests?: AutocannonRequest[];
    latencyPercentiles?: number[];
  }

  export interface Histogram {
    average: number;
    mean: number;
    stddev: number;
    min: number;
    max: number;
    total: number;
    p50: number;
    p90: number;
    p97_5: number;
    p99: number;
    [percentile: string]: number;
  }

  export interface AutocannonResult {
    duration: number;
    latency: Histogram;
    requests: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    mismatches: number;
    non2xx: number;
    resets: number;
    '1xx': number;
    '2xx': number;
    '3xx': number;
    '4xx': number;
    '5xx': number;
    statusCodeStats: Record<string, { count: number }>;
  }

  export interface Instance extends EventEmitter, PromiseLike<AutocannonResult> {
    stop(): void;
  }

  function autocannon(opts: AutocannonOptions): Instance;
  export default autocannon;
}
