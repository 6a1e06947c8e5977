// autocannon ships no types and @types/autocannon is not installed; just what bench/load.ts uses.
declare module "autocannon" {
  import type { EventEmitter } from "node:events";
  type Histogram = { average: number; mean: number; stddev: number; min: number; max: number; total: number; p50: number; p90: number; p97_5: number; p99: number };
  export type Result = {
    requests: Histogram;
    latency: Histogram;
    throughput: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
    statusCodeStats?: Record<string, { count: number }>;
    duration: number;
  };
  export type RequestSpec = {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
    /** May change the request before it is sent (path, headers, body). */
    setupRequest?: (req: { path: string; headers?: Record<string, string> }) => { path: string; headers?: Record<string, string> };
  };
  export type Options = { url: string; connections?: number; duration?: number; headers?: Record<string, string>; timeout?: number; method?: string; requests?: RequestSpec[] };
  type Instance = EventEmitter & PromiseLike<Result>;
  export default function autocannon(options: Options): Instance;
}
