/**
 * The latest object of a few short-lived classes, kept alive so that the code optimised for them
 * survives between analyses.
 *
 * V8 gives every object layout a hidden class (a "map") and compiles hot code against the maps it
 * has seen; it throws that code away once one of those maps is collected. A map is held only by the
 * objects that have it (the transitions that lead to it are weak), so when the objects of an analysis
 * have all become garbage, the next full collection drops their maps and, with them, the optimised
 * code of every function that used them: the next analysis runs unoptimised until the compiler has
 * caught up (`node --trace-deopt` reports it as `reason: weak objects`). Measured on 1e5 loose DXF
 * entities analysed 16 times in one process: the DXF reader's code was thrown away after every other
 * analysis, and keeping its objects took ~25 % off the steady state (DEVELOPERS.md, "Steady state").
 *
 * A kept object is the latest one its class handed over, until the next one replaces it. A class
 * whose objects hold a file's data empties them when its work is done (a `release` method), so what
 * stays is its layout, not the data.
 */

const latest = new Map<Function, object>();

/** Keeps `instance` as the latest object of its class; returns it. */
export function keepShape<T extends object>(instance: T): T {
  latest.set(instance.constructor, instance);
  return instance;
}
