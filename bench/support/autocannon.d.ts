/** The part of autocannon 9 the benchmarks use (the package ships no types). */
declare module 'autocannon' {
  interface Histogram {
    readonly average: number;
    readonly p50: number;
    readonly p99: number;
    readonly max: number;
  }
  interface Result {
    readonly requests: Histogram & { readonly total: number };
    readonly latency: Histogram;
    readonly errors: number;
    readonly timeouts: number;
    readonly non2xx: number;
  }
  interface Options {
    readonly url: string;
    readonly connections?: number;
    readonly duration?: number;
    /** Seconds before a request counts as timed out. */
    readonly timeout?: number;
    readonly headers?: Record<string, string>;
    readonly requests?: readonly { readonly method?: string; readonly path: string }[];
  }
  function autocannon(options: Options): Promise<Result>;
  export = autocannon;
}
