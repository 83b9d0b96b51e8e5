/**
 * The one way a benchmark reports a figure. Each `bench/*.bench.ts` runs in its own process
 * (so one benchmark's heap never slows the next) and prints one line per figure, prefixed `BENCH `,
 * that `scripts/bench.mjs` gathers into bench/results.json and a table.
 *
 * A figure is always paired with a baseline measured in the same run on the same machine, and the
 * ratio says how many times better (for higherIsBetter figures) or faster the subject is.
 */
export interface BenchFigure {
  /** Benchmark group, e.g. "heatmap". */
  readonly group: string;
  /** What was measured, e.g. "full IDW 10,000 points, 200x200 grid". */
  readonly name: string;
  readonly value: number;
  readonly unit: string;
  /** What the value is compared with, e.g. "@turf/interpolate". Absent for a plain figure such as RSS. */
  readonly baselineName?: string;
  readonly baselineValue?: number;
  /** True for throughput-like figures (records/s); false for times and sizes. */
  readonly higherIsBetter: boolean;
  /** The goal from the issue, in words, e.g. ">= 100x faster". */
  readonly goal?: string;
  readonly note?: string;
}

/** `smoke` in CI (small inputs, seconds), `full` for the figures quoted in notes. */
export const BENCH_SIZE: 'smoke' | 'full' = process.env['BENCH_SIZE'] === 'full' ? 'full' : 'smoke';

/** Prints one figure for the harness to collect. */
export function reportFigure(figure: BenchFigure): void {
  process.stdout.write(`BENCH ${JSON.stringify(figure)}\n`);
}

/** Wall time of one call in milliseconds, with the call's result. */
export async function timeIt<T>(run: () => T | Promise<T>): Promise<{ ms: number; result: T }> {
  const start = process.hrtime.bigint();
  const result = await run();
  return { ms: Number(process.hrtime.bigint() - start) / 1e6, result };
}

/** The median of several timed runs, which is steadier than one run on a shared 2-core machine. */
export async function medianMs(runs: number, run: () => unknown): Promise<number> {
  const times: number[] = [];
  for (let index = 0; index < runs; index += 1) {
    times.push((await timeIt(run)).ms);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}
