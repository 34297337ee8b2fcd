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

/**
 * Steady-state median wall time (ms) of `runs` calls of `fn`, and the last call's value. Before timing,
 * `fn` is called until `warmUpMs` of wall time have passed or `maxWarmUps` calls were made (none
 * when 0), so the optimising compiler is done with its hot paths: every contender of a comparison gets
 * the same budget (a fixed count of calls warms a fast contender for far less time than a slow one).
 */
export function timeSteady<T>(runs: number, fn: () => T, warmUpMs: number, maxWarmUps: number): { ms: number; value: T; warmUps: number } {
  const start = performance.now();
  let warmUps = 0;
  while (warmUps < maxWarmUps && (warmUps === 0 || performance.now() - start < warmUpMs)) { fn(); warmUps++; }
  return { ...time(runs, fn), warmUps };
}

/** A duration for the bench output: ms below one second, s above. */
export const fmt = (ms: number): string => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(0)} ms`);
