/**
 * Fewer vertices for a finely divided closed polyline, with a proven distance bound: the inradius
 * and minimum-zone searches (roundness.ts) cost grows with the pieces they see, and a round part
 * exported as tens of thousands of short lines is exactly the part whose roundness a user wants.
 *
 * Douglas–Peucker [Douglas & Peucker 1973, Canadian Cartographer 10(2)], best first: every run
 * between kept vertices waits in a heap keyed by its farthest vertex's distance from its chord (capped
 * by the parent run's, so keys fall along the split tree [the capped ranking is common practice, no
 * source]), and the budget of vertices goes to the largest keys. What this keeps is what the classic
 * recursion keeps for the tolerance of the first key left behind, without splitting below it.
 *
 * The bound: each kept chord has all the dropped vertices between its ends within ε of it, so the
 * dropped run of edges lies within ε of the chord (the distance to a segment is convex along a
 * line), and the chord lies within ε of the run (the run is a path between the chord's ends: its
 * projection onto the chord covers it, and a point's distance to the chord's line is at most its
 * distance to the chord). The bound returned is not trusted from the ranking: it is measured again,
 * after the choice, over every dropped vertex. Ties at the budget's edge (a regular polygon's
 * vertices of one level) may leave a level split in part, so the bound can be that of the level
 * above it: about 4 times the sagitta of `maxKept` equal chords on a tessellated circle.
 */

/** Most distance evaluations per vertex: the split tree down to the budget costs about
 *  log₂(budget) per vertex on outlines that split evenly (a tessellated circle); a hostile outline
 *  can make it quadratic, and is then left unsimplified. */
export const SIMPLIFY_WORK_PER_VERTEX = 64;

export interface Simplified {
  /** 1 for the entries of `order` that stay. */
  readonly keep: Uint8Array;
  /** The most vertices kept (fixed ones included). */
  readonly kept: number;
  /** Largest distance between a dropped vertex and the kept chord across it (the Hausdorff bound). */
  readonly deviationMm: number;
}

/** Distance from (x, y) to the segment A–B (also the searches' in roundness.ts). */
export function distToSegment(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 === 0 ? 0 : ((x - ax) * dx + (y - ay) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = x - ax - t * dx, ey = y - ay - t * dy;
  return Math.sqrt(ex * ex + ey * ey);
}

/** From this many vertices per kept one, a loop is first thinned on an evenly spaced subsample of
 *  about half as many vertices per kept one. */
const SUBSAMPLE_FROM = 8;

/**
 * Keeps at most `maxKept` of the closed polyline's vertices `order` (indices into xs, ys, in cyclic
 * order; the loop closes from the last back to the first), always keeping those with `fixed[k]`
 * (aligned with `order`). With no fixed entry, the first and the vertex farthest from it are fixed.
 * Null when the fixed ones alone exceed the budget, or the work cap (`workPerVertex` distance
 * evaluations per vertex) is reached.
 *
 * A loop of more than SUBSAMPLE_FROM vertices per kept one is first thinned on a subsample (every
 * step-th entry and every fixed one), which costs the split tree's depth on the subsample instead of
 * on the whole loop. Its choice is kept when every vertex lies within twice the subsample's own
 * deviation of the kept chords (measured over every vertex, which is the bound returned): on a finely
 * divided smooth curve the vertices between samples lie as close as the samples do. A feature between
 * samples (a corner, a spike) shows as a larger deviation, and the whole loop is thinned instead.
 */
export function simplifyClosedPolyline(
  xs: Float64Array, ys: Float64Array, order: Int32Array, fixed: Uint8Array, maxKept: number,
  workPerVertex = SIMPLIFY_WORK_PER_VERTEX,
): Simplified | null {
  const m = order.length;
  if (m > SUBSAMPLE_FROM * maxKept) {
    const step = Math.floor((2 * m) / (SUBSAMPLE_FROM * maxKept));
    let count = 0;
    for (let k = 0; k < m; k++) if (k % step === 0 || fixed[k]) count++;
    const subOrder = new Int32Array(count), subFixed = new Uint8Array(count), at = new Int32Array(count);
    for (let k = 0, j = 0; k < m; k++) {
      if (k % step !== 0 && !fixed[k]) continue;
      subOrder[j] = order[k]!; subFixed[j] = fixed[k]!; at[j++] = k;
    }
    const sub = thinLoop(xs, ys, subOrder, subFixed, maxKept, workPerVertex);
    if (sub) {
      const keep = new Uint8Array(m);
      for (let j = 0; j < count; j++) keep[at[j]!] = sub.keep[j]!;
      const deviation = getDeviation(xs, ys, order, keep);
      if (deviation <= 2 * sub.deviationMm) return { keep, kept: sub.kept, deviationMm: deviation };
    }
  }
  return thinLoop(xs, ys, order, fixed, maxKept, workPerVertex);
}

/** The largest distance of a dropped vertex of the loop `order` from the chord across it between the
 *  kept ones (`keep`, aligned with `order`; at least one is kept). */
function getDeviation(xs: Float64Array, ys: Float64Array, order: Int32Array, keep: Uint8Array): number {
  const m = order.length;
  let first = 0;
  while (!keep[first]) first++;
  let deviation = 0;
  for (let a = first; a < first + m;) {
    let b = a + 1;
    while (!keep[b % m]) b++;
    const i = order[a % m]!, j = order[b % m]!;
    for (let p = a + 1; p < b; p++) {
      const k = order[p % m]!;
      deviation = Math.max(deviation, distToSegment(xs[k]!, ys[k]!, xs[i]!, ys[i]!, xs[j]!, ys[j]!));
    }
    a = b;
  }
  return deviation;
}

/** `simplifyClosedPolyline` on the whole loop. */
function thinLoop(
  xs: Float64Array, ys: Float64Array, order: Int32Array, fixed: Uint8Array, maxKept: number, workPerVertex: number,
): Simplified | null {
  const m = order.length;
  const isFixed = Uint8Array.from(fixed);
  let fixedCount = 0;
  for (let k = 0; k < m; k++) fixedCount += isFixed[k]!;
  if (fixedCount === 0 && m > 0) {
    const x0 = xs[order[0]!]!, y0 = ys[order[0]!]!;
    let far = 0, best = -1;
    for (let k = 1; k < m; k++) {
      const dx = xs[order[k]!]! - x0, dy = ys[order[k]!]! - y0, d = dx * dx + dy * dy;
      if (d > best) { best = d; far = k; }
    }
    isFixed[0] = 1; isFixed[far] = 1;
    fixedCount = far === 0 ? 1 : 2;
  }
  if (fixedCount > maxKept) return null;
  const keep = new Uint8Array(m);
  if (m <= maxKept) {
    keep.fill(1);
    return { keep, kept: m, deviationMm: 0 };
  }
  // The loop's points copied in order from a fixed entry: position p holds order[(start + p) % m],
  // p = 0..m (p = m is the start again), so the runs between fixed entries are plain ranges.
  let start = 0;
  while (!isFixed[start]) start++;
  const px = new Float64Array(m + 1), py = new Float64Array(m + 1), pinned = new Uint8Array(m + 1);
  for (let p = 0; p <= m; p++) {
    const k = (start + p) % m, i = order[k]!;
    px[p] = xs[i]!; py[p] = ys[i]!; pinned[p] = isFixed[k]!;
  }
  // Best first: a heap of runs (lo, hi) keyed by their farthest vertex's distance, capped by the
  // parent's; popping a run keeps its farthest vertex and pushes the two halves. The first `budget`
  // pops are the vertices of highest importance, and the tree below the rest is never built.
  const kept = new Uint8Array(m + 1);
  let count = 0;
  for (let p = 0; p <= m; p++) if (pinned[p]) { kept[p] = 1; count += p < m ? 1 : 0; }
  const heap = runHeap.reset();
  let work = 0;
  const workCap = workPerVertex * m;
  const push = (lo: number, hi: number, cap: number): boolean => {
    if (hi - lo < 2) return true;
    // The farthest vertex by squared distance to the chord (its root taken once).
    const ax = px[lo]!, ay = py[lo]!, dx = px[hi]! - ax, dy = py[hi]! - ay;
    const l2 = dx * dx + dy * dy;
    let worst = -1, split = lo + 1;
    for (let p = lo + 1; p < hi; p++) {
      const qx = px[p]! - ax, qy = py[p]! - ay;
      let t = l2 === 0 ? 0 : (qx * dx + qy * dy) / l2;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const ex = qx - t * dx, ey = qy - t * dy, d2 = ex * ex + ey * ey;
      if (d2 > worst) { worst = d2; split = p; }
    }
    work += hi - lo - 1;
    heap.push(lo, hi, split, Math.min(Math.sqrt(worst), cap));
    return work <= workCap;
  };
  for (let a = 0; a < m;) {
    let b = a + 1;
    while (!pinned[b]) b++;
    if (!push(a, b, Infinity)) return null;
    a = b;
  }
  // A run whose farthest vertex lies on its chord to rounding (1e-12 of the loop's size) gains nothing
  // from a split, nor does any run after it, as keys only fall: collinear runs thin to their ends.
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let p = 0; p < m; p++) {
    minX = Math.min(minX, px[p]!); maxX = Math.max(maxX, px[p]!);
    minY = Math.min(minY, py[p]!); maxY = Math.max(maxY, py[p]!);
  }
  const negligible = 1e-12 * Math.hypot(maxX - minX, maxY - minY);
  for (let budget = maxKept - fixedCount; budget > 0 && heap.size > 0 && heap.peekValue() > negligible; budget--) {
    const top = heap.pop();
    kept[top.split] = 1;
    count++;
    if (!push(top.lo, top.split, top.value) || !push(top.split, top.hi, top.value)) return null;
  }
  for (let p = 0; p < m; p++) keep[(start + p) % m] = kept[p]!;
  // The bound, measured over every dropped vertex against its kept chord.
  return { keep, kept: count, deviationMm: getDeviation(xs, ys, order, keep) };
}

/** A binary max-heap of runs (lo, hi) with their farthest vertex `split` and its key `value`. */
class RunHeap {
  private readonly lo: number[] = [];
  private readonly hi: number[] = [];
  private readonly split: number[] = [];
  private readonly value: number[] = [];
  private readonly out = { lo: 0, hi: 0, split: 0, value: 0 };

  /** Empties the heap; returns it. */
  reset(): this {
    this.lo.length = this.hi.length = this.split.length = this.value.length = 0;
    return this;
  }

  get size(): number {
    return this.value.length;
  }

  push(lo: number, hi: number, split: number, value: number): void {
    let i = this.value.length;
    this.lo.push(lo); this.hi.push(hi); this.split.push(split); this.value.push(value);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (this.value[parent]! >= value) break;
      this.move(parent, i);
      i = parent;
    }
    this.set(i, lo, hi, split, value);
  }

  /** The largest value in the heap (which must not be empty). */
  peekValue(): number {
    return this.value[0]!;
  }

  /** Removes the run with the largest value; the returned object is reused by the next call. */
  pop(): { lo: number; hi: number; split: number; value: number } {
    const out = this.out;
    out.lo = this.lo[0]!; out.hi = this.hi[0]!; out.split = this.split[0]!; out.value = this.value[0]!;
    const lo = this.lo.pop()!, hi = this.hi.pop()!, split = this.split.pop()!, value = this.value.pop()!;
    const n = this.value.length;
    if (n === 0) return out;
    let i = 0;
    for (;;) {
      let child = 2 * i + 1;
      if (child >= n) break;
      if (child + 1 < n && this.value[child + 1]! > this.value[child]!) child++;
      if (this.value[child]! <= value) break;
      this.move(child, i);
      i = child;
    }
    this.set(i, lo, hi, split, value);
    return out;
  }

  private move(from: number, to: number): void {
    this.set(to, this.lo[from]!, this.hi[from]!, this.split[from]!, this.value[from]!);
  }

  private set(i: number, lo: number, hi: number, split: number, value: number): void {
    this.lo[i] = lo; this.hi[i] = hi; this.split[i] = split; this.value[i] = value;
  }
}

/** The one heap every thinning uses (emptied first), so its layout, and the code compiled for it,
 *  outlive the garbage collections between analyses (see keepShape.ts). */
const runHeap = new RunHeap();
