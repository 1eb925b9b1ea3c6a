// Minimal types for the parts of autocannon the benchmarks use (the package ships none).
declare module 'autocannon' {
  namespace autocannon {
    interface Options {
      url: string;
      method?: string;
      headers?: Record<string, string>;
      body?: string;
      connections?: number;
      duration?: number;
    }
    interface Result {
      requests: { average: number; total: number };
      latency: { p50: number; p90: number; p97_5: number; p99: number; average: number; max: number };
      non2xx: number;
      errors: number;
    }
  }
  function autocannon(options: autocannon.Options): Promise<autocannon.Result>;
  export default autocannon;
}
