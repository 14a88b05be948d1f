// The part of autocannon's programmatic API that bench/ uses (the package ships no types).
declare module 'autocannon' {
  export type Request = { method?: string; path?: string; headers?: Record<string, string>; body?: string };
  export type Options = {
    url: string;
    connections?: number;
    duration?: number;
    amount?: number;
    overallRate?: number;
    timeout?: number;
    requests?: (Request & { setupRequest?: (req: Request, context: Record<string, unknown>) => Request })[];
  };
  export type Histogram = { average: number; mean: number; min: number; max: number; p50: number; p90: number; p99: number; total: number };
  export type Result = {
    duration: number;
    errors: number;
    timeouts: number;
    non2xx: number;
    '2xx': number;
    '4xx': number;
    '5xx': number;
    statusCodeStats: Record<string, { count: number }>;
    latency: Histogram;
    requests: Histogram & { sent: number };
  };
  export default function autocannon(options: Options): Promise<Result>;
}
