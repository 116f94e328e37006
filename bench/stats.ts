/** Small helpers shared by the benchmarks: medians, a checksum sink, formatting. */

/** Median of a list of numbers. */
export function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Time `f` `runs` times after `warm` warm-up calls; returns the median in ms and the last result. */
export function timeMedian<T>(f: () => T, runs: number, warm = 1): { ms: number; result: T } {
  let result = f();
  for (let i = 1; i < warm; i++) result = f();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    result = f();
    times.push(performance.now() - t0);
  }
  return { ms: median(times), result };
}

/** Keeps a value alive so the JIT cannot drop the work that made it. */
export let checksum = 0;
export function consume(v: number): void {
  checksum = (checksum + v) % 1e9;
}

export const fmt = (v: number, d = 0): string => v.toFixed(d);
