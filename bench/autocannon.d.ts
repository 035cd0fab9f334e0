// The little of autocannon's API bench/load.ts uses (the package ships no types).
declare module "autocannon" {
  interface Request {
    method?: string;
    path?: string;
    headers?: Record<string, string>;
    body?: string;
  }
  interface Context {
    client?: { cursor: string | null; cookie: string; checklistId: string; email: string };
  }
  interface Options {
    url: string;
    connections?: number;
    duration?: number;
    requests?: (Request & {
      /** `context` is per connection and kept across its requests. */
      setupRequest?: (request: Request, context: Context) => Request;
      onResponse?: (status: number, body: string, context: Context) => void;
    })[];
  }
  interface Histogram {
    average: number;
    p50: number;
    p97_5: number;
    p99: number;
  }
  interface Result {
    requests: Histogram & { total: number };
    latency: Histogram;
    errors: number;
    timeouts: number;
    non2xx: number;
  }
  export default function autocannon(options: Options): Promise<Result>;
}
