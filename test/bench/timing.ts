/** Timing helpers shared by the benchmarks (wall time; the machine is noisy, so read ratios). */

/** Median wall time (ms) of `runs` calls of `fn`, and the last call's value. */
export function time<T>(runs: number, fn: () => T): { ms: number; value: T } {
  const times: number[] = [];
  let value!: T;
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    value = fn();
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(times.length / 2)]!, value };
}

/** A duration for the bench output: ms below one second, s above. */
export const fmt = (ms: number): string => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(0)} ms`);
