/**
 * Convex hull of a contour and the contour as a polyline with a stated deviation bound (used by
 * roundness.ts and by the Banchoff–Pohl integral).
 *
 * Flattening, per monotone piece (intersectPieces.ts `writeSegmentPieces`): lines are kept exactly; a Bézier piece gets m
 * chords with m from Wang's formula m ≥ √(d(d−1)·M/(8δ)) (REFERENCES.md §4.6), an arc piece m chords
 * with sagitta r(1 − cos(Δθ/2m)) ≤ δ (r = the semi-major axis a). Every curve point is then within
 * δ of the polyline and vice versa. The polyline is kept in flat arrays and built one segment at a
 * time, so a contour of a million segments costs no object per vertex.
 * Hull: Andrew's monotone chain with exact orient2d turns [src: Andrew, Inf. Process. Lett. 9 (1979)
 * 216–219 — from memory; de Berg et al. 2008 §1.1], over the points that Quickhull's elimination
 * (exact, see getHullCandidates) leaves: a huge outline keeps a few per cent of its vertices.
 */
import { orient2d } from 'robust-predicates';
import type { Contour, Segment } from '../types';
import { controlExtent, getPiecePoint, KIND_ARC, KIND_LINE, KIND_QUAD, SEGMENT_PIECES, STRIDE, writeSegmentPieces } from './intersectPieces';
import { getVectorLength } from './length';

/**
 * A contour flattened into a closed polyline, in flat arrays (a huge contour has millions of
 * vertices and pieces).
 */
export interface Polyline {
  /** Vertex i at (xs[i], ys[i]), in drawing order; the loop closes from the last back to the first. */
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  /** Largest distance between the contour and the polyline (0 when the contour has only lines). */
  readonly deviationMm: number;
  /** The contour's monotone pieces in order: piece k's chords run from vertex pieceFirst[k] to the
   *  next piece's first vertex (cyclic). */
  readonly pieceFirst: Int32Array;
  /** Index in the contour's segments of the segment piece k comes from (−1: the implicit closing line). */
  readonly pieceSegment: Int32Array;
  /** Largest distance between a piece not on a circle (see pieceOnCircle) and its chords. */
  readonly offCircleDeviationMm: number;
  /** 1 when piece k is part of an arc whose ellipse is a circle within the flattening tolerance
   *  (`getArcCircle` gives that circle), else 0. */
  readonly pieceOnCircle: Uint8Array;
}

/** An arc's circle and the largest distance between the arc and it. */
export interface ArcCircle { readonly cx: number; readonly cy: number; readonly r: number; readonly deviationMm: number }

/** The last semi-diameters given to `getSemiAxes` and its answer: the arcs of one drawing often
 *  share them, so their square roots are taken once. */
const lastAxes = { ux: Number.NaN, uy: 0, vx: 0, vy: 0, a: 0, b: 0 };

/** Semi-axes a ≥ b of the ellipse with conjugate semi-diameters U and V: square roots of the
 *  eigenvalues of their Gram matrix. */
function getSemiAxes(ux: number, uy: number, vx: number, vy: number): typeof lastAxes {
  const c = lastAxes;
  if (ux === c.ux && uy === c.uy && vx === c.vx && vy === c.vy) return c;
  const uu = ux * ux + uy * uy, vv = vx * vx + vy * vy, uv = ux * vx + uy * vy;
  const root = getVectorLength((uu - vv) / 2, uv);
  c.ux = ux; c.uy = uy; c.vx = vx; c.vy = vy;
  c.a = Math.sqrt((uu + vv) / 2 + root); c.b = Math.sqrt(Math.max(0, (uu + vv) / 2 - root));
  return c;
}

/**
 * The circle of an arc segment whose semi-axes differ by at most `toleranceMm` (radius their mean,
 * deviation half their difference), or null for any other segment (a flat arc is flattened as a line).
 */
export function getArcCircle(s: Segment, toleranceMm: number): ArcCircle | null {
  if (s.kind !== 'arc' || Math.abs(s.ux * s.vy - s.uy * s.vx) === 0) return null;
  const { a, b } = getSemiAxes(s.ux, s.uy, s.vx, s.vy);
  return a - b <= toleranceMm ? { cx: s.cx, cy: s.cy, r: (a + b) / 2, deviationMm: (a - b) / 2 } : null;
}

/** The last radius and tolerance given to `getHalfChordAngle` and its answer. */
const lastHalf = { r: Number.NaN, toleranceMm: 0, angle: 0 };

/** Half the angle of a chord with sagitta `toleranceMm` on a circle of radius r (π when r is smaller). */
function getHalfChordAngle(r: number, toleranceMm: number): number {
  const c = lastHalf;
  if (r !== c.r || toleranceMm !== c.toleranceMm) {
    c.r = r; c.toleranceMm = toleranceMm;
    c.angle = toleranceMm >= r ? Math.PI : Math.acos(1 - toleranceMm / r);
  }
  return c.angle;
}

/** Most chords for one curved piece: bounds the work on huge curves (the bound δ is then raised and reported). */
const MAX_CHORDS_PER_PIECE = 4096;

/** Growable flat arrays for `getContourPolyline`. */
class PolylineWriter {
  xs: Float64Array; ys: Float64Array; n = 0;
  first: Int32Array; segment: Int32Array; onCircle: Uint8Array; pieces = 0;
  constructor(capacity: number) {
    this.xs = new Float64Array(capacity); this.ys = new Float64Array(capacity);
    this.first = new Int32Array(capacity); this.segment = new Int32Array(capacity);
    this.onCircle = new Uint8Array(capacity);
  }
  addPoint(x: number, y: number): void {
    if (this.n === this.xs.length) { this.xs = grow(this.xs); this.ys = grow(this.ys); }
    this.xs[this.n] = x; this.ys[this.n++] = y;
  }
  /** Starts a piece at the next vertex. */
  addPiece(segment: number, onCircle: boolean): void {
    if (this.pieces === this.first.length) {
      this.first = grow(this.first); this.segment = grow(this.segment); this.onCircle = grow(this.onCircle);
    }
    const k = this.pieces++;
    this.first[k] = this.n; this.segment[k] = segment; this.onCircle[k] = onCircle ? 1 : 0;
  }
}

/** A copy twice as long (a contour's vertex count is not known before it is flattened). */
function grow<T extends Float64Array | Int32Array | Uint8Array>(a: T): T {
  const b = new (a.constructor as new (n: number) => T)(2 * a.length);
  b.set(a);
  return b;
}

/** A Bézier's M by getVectorLength (Math.hypot's value), as the module comment defines it ((cx, cy) unused for a quadratic). */
function getExactM(quad: boolean, ax: number, ay: number, cx: number, cy: number): number {
  return quad ? Math.max(0, getVectorLength(ax, ay)) : Math.max(Math.max(0, getVectorLength(ax, ay)), getVectorLength(cx, cy));
}

/**
 * The chord count m = max(1, ⌈√(K·M/(8δ))⌉) (capped) of a Bézier piece with second-difference
 * bound M, computed from an M within a few ulp of Math.hypot's, or NaN when that M is within 1e-9
 * of a step of the ceiling, where only the exact M can tell.
 */
function getBezierChords(K: number, M: number, toleranceMm: number): number {
  const q = Math.sqrt((K * M) / (8 * toleranceMm));
  const m = Math.ceil(q);
  if (!(m - q > 1e-9 * q && q - (m - 1) > 1e-9 * q)) return Number.NaN;
  return getChordCount(K, M, toleranceMm);
}

/** m = max(1, ⌈√(K·M/(8δ))⌉), capped at MAX_CHORDS_PER_PIECE. */
function getChordCount(K: number, M: number, toleranceMm: number): number {
  return Math.min(MAX_CHORDS_PER_PIECE, Math.max(1, Math.ceil(Math.sqrt((K * M) / (8 * toleranceMm)))));
}

/**
 * Flattens piece i of SEGMENT_PIECES (from segment `segment`) into the writer and returns its
 * deviation: exact (as the module comment defines it) when it may exceed `floor`, else possibly a
 * few ulp off. M is first taken as √(x² + y²), cheaper still than getVectorLength (Math.hypot's
 * value), and redone with it only where the result could differ.
 */
function flattenPiece(w: PolylineWriter, segment: number, i: number, toleranceMm: number, floor: number): number {
  const b = SEGMENT_PIECES, o = i * STRIDE;
  const kind = b[o]!;
  let m = 1;
  let pieceDeviation = 0;
  let onCircle = false;
  if (kind === KIND_ARC) {
    const { a, b: bMinor } = getSemiAxes(b[o + 10]!, b[o + 11]!, b[o + 12]!, b[o + 13]!);
    onCircle = a - bMinor <= toleranceMm;
    const dth = Math.abs(b[o + 15]! - b[o + 14]!);
    const half = getHalfChordAngle(a, toleranceMm);
    m = Math.max(1, Math.ceil(dth / (2 * half)));
    if (m > MAX_CHORDS_PER_PIECE) m = MAX_CHORDS_PER_PIECE;
    pieceDeviation = a * (1 - Math.cos(dth / (2 * m)));
  } else if (kind !== KIND_LINE) {
    // Control points P0, P1, (P2,) Pd; M = the largest second difference.
    const x0 = b[o + 4]!, y0 = b[o + 5]!, x1 = b[o + 8]!, y1 = b[o + 9]!;
    const quad = kind === KIND_QUAD;
    const ax = quad ? x0 - 2 * x1 + b[o + 6]! : x0 - 2 * x1 + b[o + 10]!, ay = quad ? y0 - 2 * y1 + b[o + 7]! : y0 - 2 * y1 + b[o + 11]!;
    const cx = quad ? 0 : x1 - 2 * b[o + 10]! + b[o + 6]!, cy = quad ? 0 : y1 - 2 * b[o + 11]! + b[o + 7]!;
    const K = quad ? 2 : 6;
    let M = Math.max(Math.max(0, Math.sqrt(ax * ax + ay * ay)), quad ? 0 : Math.sqrt(cx * cx + cy * cy));
    m = getBezierChords(K, M, toleranceMm);
    let exact = false;
    if (Number.isNaN(m)) {
      M = getExactM(quad, ax, ay, cx, cy); exact = true;
      m = getChordCount(K, M, toleranceMm);
    }
    pieceDeviation = (K * M) / (8 * m * m);
    if (!exact && !(pieceDeviation < floor * (1 - 1e-12))) pieceDeviation = (K * getExactM(quad, ax, ay, cx, cy)) / (8 * m * m);
  }
  w.addPiece(segment, onCircle);
  w.addPoint(b[o + 4]!, b[o + 5]!);
  for (let j = 1; j < m; j++) {
    const [x, y] = getPiecePoint(b, i, j / m);
    w.addPoint(x, y);
  }
  return pieceDeviation;
}

/**
 * The contour as a closed polyline within `toleranceMm` of it (see the module comment): its
 * monotone pieces (those of intersectPieces.ts `buildPieces`, one segment at a time), each cut into
 * chords.
 */
export function getContourPolyline(contour: Contour, toleranceMm: number): Polyline {
  const segments = contour.segments;
  const w = new PolylineWriter(segments.length + (segments.length >> 2) + 64);
  let deviation = 0, offCircle = 0;
  let lastX = contour.startX, lastY = contour.startY;
  for (let si = 0; si < segments.length; si++) {
    const s = segments[si]!;
    if (s.kind === 'line') {
      // The one piece writeSegmentPieces would write, without the buffer.
      if (controlExtent(s) <= 0) continue;
      w.addPiece(si, false);
      w.addPoint(s.x0, s.y0);
      lastX = s.x1; lastY = s.y1;
      continue;
    }
    const count = writeSegmentPieces(s);
    if (count === 0) continue;
    for (let i = 0; i < count; i++) {
      const d = flattenPiece(w, si, i, toleranceMm, offCircle);
      if (!w.onCircle[w.pieces - 1]) offCircle = Math.max(offCircle, d);
      deviation = Math.max(deviation, d);
    }
    const o = (count - 1) * STRIDE;
    lastX = SEGMENT_PIECES[o + 6]!; lastY = SEGMENT_PIECES[o + 7]!;
  }
  if (getVectorLength(lastX - contour.startX, lastY - contour.startY) > 0) {
    w.addPiece(-1, false);
    w.addPoint(lastX, lastY);
  }
  const { n, pieces } = w;
  return {
    xs: w.xs.subarray(0, n), ys: w.ys.subarray(0, n), deviationMm: deviation,
    pieceFirst: w.first.subarray(0, pieces), pieceSegment: w.segment.subarray(0, pieces),
    pieceOnCircle: w.onCircle.subarray(0, pieces), offCircleDeviationMm: offCircle,
  };
}

/**
 * Quickhull's elimination [src: Eddy, ACM TOMS 3 (1977) 398–403; Barber, Dobkin & Huhdanpaa, ACM
 * TOMS 22 (1996) 469–483 — from memory] on the points idx[lo..hi), each strictly outside the
 * counter-clockwise hull edge p → q: the point f farthest outside (by orient2d's value) is kept,
 * points strictly inside the triangle p, f, q are dropped (decided exactly with orient2d), and the
 * rest are handed to the edges p → f and f → q. A dropped point lies in the interior of a triangle
 * of input points, so it is no hull vertex; every other point ends in `kept`. `spill` is scratch of
 * idx's length. Outside an edge of the counter-clockwise hull is its right: orient2d > 0
 * (REFERENCES.md §7.2).
 */
function eliminateOutside(
  xs: Float64Array, ys: Float64Array, idx: Int32Array, spill: Int32Array, kept: number[],
  edges: number[],
): void {
  while (edges.length > 0) {
    const hi = edges.pop()!, lo = edges.pop()!, q = edges.pop()!, p = edges.pop()!;
    if (lo === hi) continue;
    const px = xs[p]!, py = ys[p]!, qx = xs[q]!, qy = ys[q]!;
    let f = idx[lo]!, best = -Infinity;
    for (let k = lo; k < hi; k++) {
      const i = idx[k]!, o = orient2d(px, py, qx, qy, xs[i]!, ys[i]!);
      if (o > best) { best = o; f = i; }
    }
    kept.push(f);
    const fx = xs[f]!, fy = ys[f]!;
    let toF = lo, fromF = 0;
    for (let k = lo; k < hi; k++) {
      const i = idx[k]!;
      if (i === f) continue;
      const x = xs[i]!, y = ys[i]!;
      const o1 = orient2d(px, py, fx, fy, x, y);
      if (o1 > 0) { idx[toF++] = i; continue; }
      const o2 = orient2d(fx, fy, qx, qy, x, y);
      if (o2 > 0) spill[fromF++] = i;
      else if (o1 === 0 || o2 === 0) kept.push(i);
    }
    for (let k = 0; k < fromF; k++) idx[toF + k] = spill[k]!;
    edges.push(p, f, lo, toF, f, q, toF, toF + fromF);
  }
}

/**
 * The points among `points` that may be hull vertices (all of them are): Quickhull's elimination
 * from the segment between the lexicographic extremes.
 */
function getHullCandidatesFrom(xs: Float64Array, ys: Float64Array, points: Int32Array): number[] {
  const n = points.length;
  if (n === 0) return [];
  let a = points[0]!, b = a;
  for (const i of points) {
    if (xs[i]! < xs[a]! || (xs[i] === xs[a] && ys[i]! < ys[a]!)) a = i;
    if (xs[i]! > xs[b]! || (xs[i] === xs[b] && ys[i]! > ys[b]!)) b = i;
  }
  const kept = [a];
  if (b !== a) kept.push(b);
  const idx = new Int32Array(n), spill = new Int32Array(n);
  let below = 0, above = 0;
  for (const i of points) {
    if (i === a || i === b) continue;
    const o = orient2d(xs[a]!, ys[a]!, xs[b]!, ys[b]!, xs[i]!, ys[i]!);
    if (o > 0) idx[below++] = i;
    else if (o < 0) spill[above++] = i;
    else kept.push(i);
  }
  for (let k = 0; k < above; k++) idx[below + k] = spill[k]!;
  eliminateOutside(xs, ys, idx, spill, kept, [a, b, 0, below, b, a, below, below + above]);
  return kept;
}

/** Pseudo-angle of the direction (dx, dy): in [0, 4), increasing with the angle from +x. */
function pseudoAngle(dx: number, dy: number): number {
  const r = dy / (Math.abs(dx) + Math.abs(dy));
  return dx >= 0 ? (r >= 0 ? r : 4 + r) : 2 - r;
}

/** Below this many points all of them go to Andrew's chain (an outline this small is mostly hull:
 *  elimination would cost more than it saves); above, Quickhull's elimination starts from a sample's
 *  hull. */
const HULL_SAMPLE_FROM = 4096;
/** Points in that sample. */
const HULL_SAMPLE = 2048;

/**
 * The points of (xs[i], ys[i]), i < n, that may be hull vertices. A huge point set is first tested
 * against the hull Q of an evenly spaced sample of it, around a centre c strictly inside Q (checked
 * exactly): a point in a disc about c inside Q is dropped at once; else it is located among Q's
 * edges by its pseudo-angle about c (in floating point; a wrong guess only keeps the point); inside
 * the closed triangle c, q_j, q_{j+1} and strictly inside the edge it lies in Q's interior and is
 * dropped; strictly outside the edge it goes to Quickhull's elimination on that edge. Otherwise (a
 * point on an edge, a wrong guess) it is kept.
 */
function getHullCandidates(xs: Float64Array, ys: Float64Array, n: number): number[] {
  const all = () => { const a = new Int32Array(n); for (let i = 0; i < n; i++) a[i] = i; return a; };
  if (n < HULL_SAMPLE_FROM) return Array.from(all());
  const step = Math.floor(n / HULL_SAMPLE);
  const sample = Int32Array.from({ length: Math.ceil(n / step) }, (_, k) => k * step);
  const q = getHullIndices(xs, ys, getHullCandidatesFrom(xs, ys, sample));
  const h = q.length;
  if (h < 3) return getHullCandidatesFrom(xs, ys, all());
  let cx = 0, cy = 0;
  for (const i of q) { cx += xs[i]!; cy += ys[i]!; }
  cx /= h; cy /= h;
  for (let j = 0; j < h; j++) {
    const a = q[j]!, b = q[(j + 1) % h]!;
    if (!(orient2d(xs[a]!, ys[a]!, xs[b]!, ys[b]!, cx, cy) < 0)) return getHullCandidatesFrom(xs, ys, all());
  }
  // A disc about c inside Q: its radius is the least distance from c to Q's edge lines, shrunk by
  // far more than their rounding error (a few ulp of the coordinates' size).
  let size = Math.abs(cx) + Math.abs(cy), radius = Infinity;
  for (let j = 0; j < h; j++) {
    const a = q[j]!, b = q[(j + 1) % h]!;
    const ex = xs[b]! - xs[a]!, ey = ys[b]! - ys[a]!;
    radius = Math.min(radius, Math.abs(ex * (cy - ys[a]!) - ey * (cx - xs[a]!)) / Math.sqrt(ex * ex + ey * ey));
    size = Math.max(size, Math.abs(xs[a]!) + Math.abs(ys[a]!));
  }
  radius = Math.max(0, radius * (1 - 1e-9) - 1e-12 * size);
  const inner2 = radius * radius;
  // Q's vertices by pseudo-angle about c, from the least.
  const angle = q.map((i) => pseudoAngle(xs[i]! - cx, ys[i]! - cy));
  let start = 0;
  for (let j = 1; j < h; j++) if (angle[j]! < angle[start]!) start = j;
  const order = Int32Array.from({ length: h }, (_, k) => q[(start + k) % h]!);
  const sorted = Float64Array.from({ length: h }, (_, k) => angle[(start + k) % h]!);
  const outside: number[] = [], outsideEdge: number[] = [];
  const count = new Int32Array(h + 1);
  const kept: number[] = [];
  let j = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i]!, y = ys[i]!;
    if ((x - cx) * (x - cx) + (y - cy) * (y - cy) < inner2) continue;
    const t = pseudoAngle(x - cx, y - cy);
    // The last vertex with angle ≤ t (the last one when t is below them all: the wrapping edge);
    // along a contour it is mostly the previous point's.
    if (!(sorted[j]! <= t && (j + 1 === h || t < sorted[j + 1]!)) && !(j === h - 1 && t < sorted[0]!)) {
      let lo = 0, hi = h;
      while (lo < hi) { const mid = (lo + hi) >> 1; if (sorted[mid]! <= t) lo = mid + 1; else hi = mid; }
      j = (lo + h - 1) % h;
    }
    const a = order[j]!, b = order[(j + 1) % h]!;
    const ax = xs[a]!, ay = ys[a]!, bx = xs[b]!, by = ys[b]!;
    const o = orient2d(ax, ay, bx, by, x, y);
    if (o > 0) { outside.push(i); outsideEdge.push(j); count[j + 1]!++; continue; }
    if (o < 0 && orient2d(cx, cy, ax, ay, x, y) <= 0 && orient2d(cx, cy, bx, by, x, y) >= 0) continue;
    kept.push(i);
  }
  for (let j = 0; j < h; j++) count[j + 1]! += count[j]!;
  const idx = new Int32Array(count[h]!), spill = new Int32Array(count[h]!);
  const fill = count.slice(0, h);
  for (let k = 0; k < outside.length; k++) idx[fill[outsideEdge[k]!]!++] = outside[k]!;
  const edges: number[] = [];
  for (let j = 0; j < h; j++) edges.push(order[j]!, order[(j + 1) % h]!, count[j]!, count[j + 1]!);
  eliminateOutside(xs, ys, idx, spill, kept, edges);
  return kept;
}

/** Andrew's monotone chain over the points with the given indices (exact orient2d turns): the hull's
 *  vertex indices, counter-clockwise in y-up axes from the lexicographically least point. */
function getHullIndices(xs: Float64Array, ys: Float64Array, indices: number[]): number[] {
  const p = indices.sort((i, j) => xs[i]! - xs[j]! || ys[i]! - ys[j]!);
  if (p.length < 3) return p;
  // orient2d < 0 ⇔ counter-clockwise in y-up axes (REFERENCES.md §7.2).
  const turnsLeft = (i: number, j: number, k: number) => orient2d(xs[i]!, ys[i]!, xs[j]!, ys[j]!, xs[k]!, ys[k]!) < 0;
  const lower: number[] = [];
  for (const q of p) {
    while (lower.length >= 2 && !turnsLeft(lower[lower.length - 2]!, lower[lower.length - 1]!, q)) lower.pop();
    lower.push(q);
  }
  const upper: number[] = [];
  for (let k = p.length - 1; k >= 0; k--) {
    const q = p[k]!;
    while (upper.length >= 2 && !turnsLeft(upper[upper.length - 2]!, upper[upper.length - 1]!, q)) upper.pop();
    upper.push(q);
  }
  lower.pop();
  upper.pop();
  return [...lower, ...upper];
}

/** Convex hull of the points (xs[i], ys[i]): counter-clockwise in y-up axes from the lexicographically
 *  least point, no collinear vertices. */
export function getConvexHullOfCoordinates(xs: Float64Array, ys: Float64Array): [number, number][] {
  return getHullIndices(xs, ys, getHullCandidates(xs, ys, xs.length)).map((i) => [xs[i]!, ys[i]!]);
}

/** Convex hull, counter-clockwise in y-up axes, no collinear vertices. */
export function getConvexHull(points: readonly (readonly [number, number])[]): [number, number][] {
  return getConvexHullOfCoordinates(Float64Array.from(points, (p) => p[0]), Float64Array.from(points, (p) => p[1]));
}

export interface HullFigures {
  readonly areaMm2: number;
  readonly perimeterMm: number;
  /** The true hull's area is within [areaMm2, areaMm2 + areaErrorMm2] (0 for polygons). */
  readonly areaErrorMm2: number;
  /** The true hull's perimeter is within [perimeterMm, perimeterMm + perimeterErrorMm]. */
  readonly perimeterErrorMm: number;
  readonly points: readonly (readonly [number, number])[];
}

/**
 * Convex hull figures of a contour flattened by `getContourPolyline`. For curves the hull of the
 * polyline (deviation δ) lies inside the true hull, which lies inside it offset by δ: area error
 * ≤ δ·P + πδ², perimeter ≤ 2πδ (Steiner's formula for parallel convex bodies; [src: Steiner 1840 —
 * from memory]).
 */
export function getPolylineHull(poly: Polyline): HullFigures {
  const h = getConvexHullOfCoordinates(poly.xs, poly.ys);
  let a = 0, per = 0;
  const [ox, oy] = h[0] ?? [0, 0];
  for (let i = 0; i < h.length; i++) {
    const [x0, y0] = h[i]!, [x1, y1] = h[(i + 1) % h.length]!;
    a += (x0 - ox) * (y1 - oy) - (x1 - ox) * (y0 - oy);
    per += getVectorLength(x1 - x0, y1 - y0);
  }
  const d = poly.deviationMm;
  return { areaMm2: Math.abs(a) / 2, perimeterMm: h.length > 1 ? per : 0, areaErrorMm2: d * per + Math.PI * d * d, perimeterErrorMm: 2 * Math.PI * d, points: h };
}
