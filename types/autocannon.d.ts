declare module "autocannon" {
  type Request = { method?: string; path?: string; headers?: Record<string, string>; body?: string };
  type Options = {
    url: string;
    connections?: number;
    duration?: number;
    warmup?: { connections?: number; duration?: number };
    requests?: (Request & { setupRequest?: (req: Request, context: Record<string, unknown>) => Request })[];
    headers?: Record<string, string>;
  };
  type Histogram = { average: number; mean: number; p50: number; p90: number; p99: number; max: number; total?: number };
  type Result = { requests: Histogram & { total: number }; latency: Histogram; errors: number; timeouts: number; non2xx: number; duration: number };
  function autocannon(opts: Options): Promise<Result>;
  export default autocannon;
}
