/**
 * Convex hull of a contour and the contour as a polyline with a stated deviation bound (used by
 * roundness.ts and by the Banchoff–Pohl integral).
 *
 * Flattening, per monotone piece (intersectPieces.ts `writeSegmentPieces`): lines are kept exactly; a Bézier piece gets m
 * chords with m from Wang's formula m ≥ √(d(d−1)·M/(8δ)) (REFERENCES.md §4.6), an arc piece m chords
 * with sagitta r(1 − cos(Δθ/2m)) ≤ δ (r = the semi-major axis a). Every curve point is then within
 * δ of the polyline and vice versa. The polyline is kept in flat arrays and built one segment at a
 * time, so a contour of a million segments costs no object per vertex; contours that fit share one
 * set of arrays (most are small: a file of 250 000 small outlines would otherwise allocate and grow
 * arrays 250 000 times), and arcs that repeat their chord angles share their cosines and sines.
 * Hull: Andrew's monotone chain with exact orient2d turns [src: Andrew, Inf. Process. Lett. 9 (1979)
 * 216–219 — from memory; de Berg et al. 2008 §1.1], over the points that Quickhull's elimination
 * (exact, see getHullCandidates) leaves: a huge outline keeps a few per cent of its vertices. Index
 * arrays and their sort need no comparator closure and no object per point.
 */
import { orient2d } from 'robust-predicates';
import type { Contour, Segment } from '../types';
import { controlExtent, KIND_ARC, KIND_LINE, KIND_QUAD, SEGMENT_PIECES, STRIDE, writeSegmentPieces } from './intersectPieces';
import { getVectorLength } from './length';
import { getSegmentAt, getSegmentCount, SegmentView } from '../model/packedSegment';

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

/** Growable flat arrays for the flattening. */
class PolylineWriter {
  xs: Float64Array; ys: Float64Array; n = 0;
  first: Int32Array; segment: Int32Array; onCircle: Uint8Array; pieces = 0;
  /** The polyline's deviations, as Polyline has them: NaN until flattenContour sets them, a double from
   *  the start, so that every writer has one layout. A field that starts as a small integer changes
   *  layout at its first double, and the module's shared writer, made at load, would keep the old one
   *  while the layout of huge contours' own writers died with them (keepShape.ts). */
  deviation = NaN; offCircleDeviation = NaN;
  constructor(capacity: number) {
    this.xs = new Float64Array(capacity); this.ys = new Float64Array(capacity);
    this.first = new Int32Array(capacity); this.segment = new Int32Array(capacity);
    this.onCircle = new Uint8Array(capacity);
  }
  addPoint(x: number, y: number): void {
    if (this.n === this.xs.length) { this.xs = grow(this.xs); this.ys = grow(this.ys); }
    this.xs[this.n] = x; this.ys[this.n++] = y;
  }
  /** Makes room for `count` more points. */
  reservePoints(count: number): void {
    while (this.n + count > this.xs.length) { this.xs = grow(this.xs); this.ys = grow(this.ys); }
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

/** Largest capacity the shared writer keeps between contours: a contour needing more gets arrays of
 *  its own, which die with its polyline. */
const SHARED_WRITER_MAX = 1 << 16;
/** The writer of `getTransientPolyline`, reused by every contour that fits it: most contours are
 *  small, and fresh arrays for each (then grown) cost more than flattening them. */
let sharedWriter = new PolylineWriter(1024);

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
  if (m > 1) addInnerPoints(w, o, kind, m);
  return pieceDeviation;
}

/** Cosines and sines of an arc piece's inner chord angles θ0 + (j/m)(θ1 − θ0), 0 < j < m. */
interface ChordAngles { th0: number; th1: number; m: number; readonly cos: Float64Array; readonly sin: Float64Array }

/** Most chord angle sets kept (each at most 2·8·MAX_CHORDS_PER_PIECE bytes): a drawing's arcs
 *  often repeat the same angles at other centres (a rounded corner or slot per part), so their
 *  trigonometry is done once. */
const CHORD_ANGLE_SETS = 8;
const chordAngles: ChordAngles[] = [];
let nextChordAngles = 0;

/** The chord angles' cosines and sines for (th0, th1, m), computed as getPiecePoint computes them
 *  (so to the bit) or taken from a set kept from an earlier piece with the same three numbers (a
 *  zero of either sign matches both: θ0 + (j/m)(θ1 − θ0) is the same for them when m > 1). */
function getChordAngles(th0: number, th1: number, m: number): ChordAngles {
  for (const c of chordAngles) if (c.th0 === th0 && c.th1 === th1 && c.m === m) return c;
  let c = chordAngles[nextChordAngles];
  if (!c || c.cos.length < m) {
    c = { th0, th1, m, cos: new Float64Array(Math.max(m, 128)), sin: new Float64Array(Math.max(m, 128)) };
    chordAngles[nextChordAngles] = c;
  }
  nextChordAngles = (nextChordAngles + 1) % CHORD_ANGLE_SETS;
  c.th0 = th0; c.th1 = th1; c.m = m;
  const dth = th1 - th0, cos = c.cos, sin = c.sin;
  for (let j = 1; j < m; j++) {
    const th = th0 + (j / m) * dth;
    cos[j] = Math.cos(th); sin[j] = Math.sin(th);
  }
  return c;
}

/**
 * Adds the points of piece o/STRIDE of SEGMENT_PIECES at u = j/m, 0 < j < m (m > 1, so not a line):
 * getPiecePoint's arithmetic, operation for operation, so the values are its values to the bit,
 * without an array per point.
 */
function addInnerPoints(w: PolylineWriter, o: number, kind: number, m: number): void {
  const b = SEGMENT_PIECES;
  w.reservePoints(m - 1);
  const xs = w.xs, ys = w.ys;
  let n = w.n;
  const x0 = b[o + 4]!, y0 = b[o + 5]!, x1 = b[o + 6]!, y1 = b[o + 7]!;
  if (kind === KIND_ARC) {
    const cx = b[o + 8]!, cy = b[o + 9]!, ux = b[o + 10]!, uy = b[o + 11]!, vx = b[o + 12]!, vy = b[o + 13]!;
    const { cos, sin } = getChordAngles(b[o + 14]!, b[o + 15]!, m);
    for (let j = 1; j < m; j++) {
      const cs = cos[j]!, sn = sin[j]!;
      xs[n] = cx + ux * cs + vx * sn; ys[n++] = cy + uy * cs + vy * sn;
    }
  } else if (kind === KIND_QUAD) {
    const px = b[o + 8]!, py = b[o + 9]!;
    for (let j = 1; j < m; j++) {
      const u = j / m, v = 1 - u;
      const a = v * v, bb = 2 * u * v, c = u * u;
      xs[n] = a * x0 + bb * px + c * x1; ys[n++] = a * y0 + bb * py + c * y1;
    }
  } else {
    const px = b[o + 8]!, py = b[o + 9]!, qx = b[o + 10]!, qy = b[o + 11]!;
    for (let j = 1; j < m; j++) {
      const u = j / m, v = 1 - u;
      const a = v * v * v, bb = 3 * u * v * v, c = 3 * u * u * v, d = u * u * u;
      xs[n] = a * x0 + bb * px + c * qx + d * x1; ys[n++] = a * y0 + bb * py + c * qy + d * y1;
    }
  }
  w.n = n;
}

/**
 * The contour as a closed polyline within `toleranceMm` of it (see the module comment): its
 * monotone pieces (those of intersectPieces.ts `buildPieces`, one segment at a time), each cut into
 * chords. Its arrays are shared: the next call overwrites them, so a caller is done with one
 * contour's polyline before it flattens the next (or copies it).
 */
export function getTransientPolyline(contour: Contour, toleranceMm: number): Polyline {
  const w = flattenContour(contour, toleranceMm), { n, pieces } = w;
  return {
    xs: w.xs.subarray(0, n), ys: w.ys.subarray(0, n), deviationMm: w.deviation,
    pieceFirst: w.first.subarray(0, pieces), pieceSegment: w.segment.subarray(0, pieces),
    pieceOnCircle: w.onCircle.subarray(0, pieces), offCircleDeviationMm: w.offCircleDeviation,
  };
}

/**
 * The measures of `getPolylineHull(getTransientPolyline(contour, toleranceMm))`, without a polyline
 * object or the hull's vertices (the flattening is left in arrays that the next one may overwrite).
 */
export function getContourHullMeasures(contour: Contour, toleranceMm: number): HullMeasures {
  const w = flattenContour(contour, toleranceMm);
  return measureHull(w.xs, w.ys, getHullOfCoordinates(w.xs, w.ys, w.n), w.deviation);
}

/** The segment flattenContour looks at, for a contour whose segments are stored. */
const flattenView = new SegmentView();

/** Flattens the contour (see getTransientPolyline) into the shared writer, or into one of its own
 *  when it is huge, and returns that writer. */
function flattenContour(contour: Contour, toleranceMm: number): PolylineWriter {
  const segmentCount = getSegmentCount(contour);
  const capacity = segmentCount + (segmentCount >> 2) + 64;
  let w = sharedWriter;
  if (capacity > SHARED_WRITER_MAX) w = new PolylineWriter(capacity);
  else if (w.xs.length < capacity || w.first.length < capacity) w = sharedWriter = new PolylineWriter(capacity);
  w.n = 0; w.pieces = 0;
  let deviation = 0, offCircle = 0;
  let lastX = contour.startX, lastY = contour.startY;
  for (let si = 0; si < segmentCount; si++) {
    const s = getSegmentAt(contour, si, flattenView);
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
  if (w === sharedWriter && (w.xs.length > SHARED_WRITER_MAX || w.first.length > SHARED_WRITER_MAX)) sharedWriter = new PolylineWriter(1024);
  w.deviation = deviation; w.offCircleDeviation = offCircle;
  return w;
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
 *  elimination would cost more than it saves); from it on, Quickhull's elimination starts from a
 *  sample's hull. */
const HULL_SAMPLE_FROM = 4096;
/** Points in that sample. */
const HULL_SAMPLE = 2048;

/**
 * The points of (xs[i], ys[i]), i < n (n ≥ HULL_SAMPLE_FROM), that may be hull vertices. They are first tested
 * against the hull Q of an evenly spaced sample of it, around a centre c strictly inside Q (checked
 * exactly): a point in a disc about c inside Q is dropped at once; else it is located among Q's
 * edges by its pseudo-angle about c (in floating point; a wrong guess only keeps the point); inside
 * the closed triangle c, q_j, q_{j+1} and strictly inside the edge it lies in Q's interior and is
 * dropped; strictly outside the edge it goes to Quickhull's elimination on that edge. Otherwise (a
 * point on an edge, a wrong guess) it is kept.
 */
function getHullCandidates(xs: Float64Array, ys: Float64Array, n: number): number[] {
  const all = () => { const a = new Int32Array(n); for (let i = 0; i < n; i++) a[i] = i; return a; };
  const step = Math.floor(n / HULL_SAMPLE);
  const sample = Int32Array.from({ length: Math.ceil(n / step) }, (_, k) => k * step);
  const fromSample = getHullCandidatesFrom(xs, ys, sample);
  const sampleHull = getHullIndices(xs, ys, fromSample, fromSample.length);
  const q = Array.from(sampleHull.chain.subarray(0, sampleHull.count));
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

/** Index scratch of `getHullIndices`: the order being sorted, the merge's other buffer, run bounds
 *  (then the upper chain's points), and the hull's vertex indices chain[0..count). */
interface HullScratch { order: Int32Array; merge: Int32Array; runs: Int32Array; chain: Int32Array; count: number }

const newHullScratch = (n: number): HullScratch =>
  ({ order: new Int32Array(n), merge: new Int32Array(n), runs: new Int32Array(n + 1), chain: new Int32Array(2 * n + 2), count: 0 });

/** Largest point count whose scratch is kept between calls (a larger set gets scratch of its own). */
const SHARED_HULL_MAX = 1 << 16;
let sharedHull = newHullScratch(1024);

/** Whether point i comes before point j in (x, y) order. */
const before = (xs: Float64Array, ys: Float64Array, i: number, j: number) => xs[i]! < xs[j]! || (xs[i] === xs[j] && ys[i]! < ys[j]!);

/**
 * Sorts order[0..n) by (x, y), stably (a stable sort's result is unique: that of Array.prototype.sort
 * with the comparator xs[i] − xs[j] || ys[i] − ys[j], which is consistent for non-NaN coordinates):
 * a natural merge sort [src: Knuth, TAOCP vol. 3, §5.2.4 — from memory] over the runs the input
 * already has (a polyline's monotone pieces give long ones), without a comparator call per
 * comparison. Returns the array holding the result (order or merge).
 */
function sortByXY(xs: Float64Array, ys: Float64Array, n: number, s: HullScratch): Int32Array {
  const a = s.order, runs = s.runs;
  // Runs: non-decreasing ones as they are, strictly decreasing ones reversed (no ties to keep in order).
  let count = 0;
  for (let i = 0; i < n;) {
    let j = i + 1;
    if (j < n && before(xs, ys, a[j]!, a[i]!)) {
      while (j + 1 < n && before(xs, ys, a[j + 1]!, a[j]!)) j++;
      for (let lo = i, hi = j; lo < hi; lo++, hi--) { const t = a[lo]!; a[lo] = a[hi]!; a[hi] = t; }
      j++;
    } else {
      while (j < n && !before(xs, ys, a[j]!, a[j - 1]!)) j++;
    }
    runs[count++] = i;
    i = j;
  }
  runs[count] = n;
  let src = a, dst = s.merge;
  while (count > 1) {
    let kept = 0, k = 0;
    for (; k + 2 <= count; k += 2) {
      const lo = runs[k]!, mid = runs[k + 1]!, hi = runs[k + 2]!;
      let i = lo, j = mid, o = lo;
      while (i < mid && j < hi) dst[o++] = before(xs, ys, src[j]!, src[i]!) ? src[j++]! : src[i++]!;
      while (i < mid) dst[o++] = src[i++]!;
      while (j < hi) dst[o++] = src[j++]!;
      runs[kept++] = lo;
    }
    if (k < count) {
      for (let i = runs[k]!; i < n; i++) dst[i] = src[i]!;
      runs[kept++] = runs[k]!;
    }
    runs[kept] = n;
    count = kept;
    const t = src; src = dst; dst = t;
  }
  return src;
}

/** Coordinates are 0 or of a magnitude within [EXACT_MIN, EXACT_MAX] for the split chain: orient2d's
 *  expansions then neither underflow nor overflow, so its signs are exact. */
const EXACT_MIN = 2 ** -300, EXACT_MAX = 2 ** 300;

/**
 * Andrew's monotone chain [src: Andrew, Inf. Process. Lett. 9 (1979) 216–219 — from memory] over
 * the points with the given indices (all n points when null), with orient2d turns: the hull's
 * vertex indices, counter-clockwise in y-up axes from the lexicographically least point a, in
 * chain[0..count) of the scratch returned, which the next call may overwrite.
 *
 * When orient2d is exact for every point (see EXACT_MIN), the hull's vertices are determined, and
 * so is which of a vertex's copies is kept (the lower chain keeps the last in the sorted order, the
 * upper one the first): then only points strictly right of the line from a to the greatest point b
 * enter the lower chain, and only points strictly left of it the upper one (no other point can be
 * a vertex of that chain, and a point on the line between them is none of the hull's, which keeps
 * no collinear vertex), after the comparator-free sort. Otherwise both chains take every point
 * after Array.prototype.sort, as ever, so the answer is the same whatever orient2d gives there.
 * Both chains share one stack.
 */
function getHullIndices(xs: Float64Array, ys: Float64Array, indices: readonly number[] | null, n: number): HullScratch {
  let s = sharedHull;
  if (n > SHARED_HULL_MAX) s = newHullScratch(n);
  else if (s.order.length < n) s = sharedHull = newHullScratch(n);
  const order = s.order, h = s.chain;
  let exact = true;
  for (let k = 0; k < n; k++) {
    const i = indices ? indices[k]! : k;
    order[k] = i;
    const x = Math.abs(xs[i]!), y = Math.abs(ys[i]!);
    if (!((x === 0 || (x >= EXACT_MIN && x <= EXACT_MAX)) && (y === 0 || (y >= EXACT_MIN && y <= EXACT_MAX)))) exact = false;
  }
  const p = exact ? sortByXY(xs, ys, n, s)
    : Int32Array.from(Array.from(order.subarray(0, n)).sort((i, j) => xs[i]! - xs[j]! || ys[i]! - ys[j]!));
  if (n < 3) {
    for (let k = 0; k < n; k++) h[k] = p[k]!;
    s.count = n;
    return s;
  }
  // orient2d < 0 ⇔ counter-clockwise in y-up axes, so > 0 is right of a → b (REFERENCES.md §7.2).
  const upper = s.runs;
  const a = p[0]!, b = p[n - 1]!, ax = xs[a]!, ay = ys[a]!, bx = xs[b]!, by = ys[b]!;
  let k = 0, u = 0;
  h[k++] = a;
  for (let t = 1; t < n; t++) {
    const q = p[t]!, qx = xs[q]!, qy = ys[q]!;
    if (t < n - 1) {
      if (exact) {
        const o = orient2d(ax, ay, bx, by, qx, qy);
        if (o < 0) upper[u++] = q;
        if (!(o > 0)) continue;
      } else {
        upper[u++] = q;
      }
    }
    while (k >= 2 && !(orient2d(xs[h[k - 2]!]!, ys[h[k - 2]!]!, xs[h[k - 1]!]!, ys[h[k - 1]!]!, qx, qy) < 0)) k--;
    h[k++] = q;
  }
  const lowest = k + 1;
  for (let t = u; t >= 0; t--) {
    const q = t > 0 ? upper[t - 1]! : a, qx = xs[q]!, qy = ys[q]!;
    while (k >= lowest && !(orient2d(xs[h[k - 2]!]!, ys[h[k - 2]!]!, xs[h[k - 1]!]!, ys[h[k - 1]!]!, qx, qy) < 0)) k--;
    h[k++] = q;
  }
  s.count = k - 1;
  return s;
}

/** Hull vertex indices of the points (xs[i], ys[i]), i < n, as getHullIndices gives them. */
function getHullOfCoordinates(xs: Float64Array, ys: Float64Array, n: number): HullScratch {
  if (n < HULL_SAMPLE_FROM) return getHullIndices(xs, ys, null, n);
  const candidates = getHullCandidates(xs, ys, n);
  return getHullIndices(xs, ys, candidates, candidates.length);
}

/** Convex hull: counter-clockwise in y-up axes from the lexicographically least point, no collinear vertices. */
export function getConvexHull(points: readonly (readonly [number, number])[]): [number, number][] {
  const xs = Float64Array.from(points, (p) => p[0]), ys = Float64Array.from(points, (p) => p[1]);
  return hullPoints(xs, ys, getHullOfCoordinates(xs, ys, xs.length));
}

/** Area and perimeter of a contour's convex hull, with their error bounds. */
export interface HullMeasures {
  readonly areaMm2: number;
  readonly perimeterMm: number;
  /** The true hull's area is within [areaMm2, areaMm2 + areaErrorMm2] (0 for polygons). */
  readonly areaErrorMm2: number;
  /** The true hull's perimeter is within [perimeterMm, perimeterMm + perimeterErrorMm]. */
  readonly perimeterErrorMm: number;
}

export interface HullFigures extends HullMeasures {
  readonly points: readonly (readonly [number, number])[];
}

/**
 * Convex hull figures of a contour flattened by `getTransientPolyline`. For curves the hull of the
 * polyline (deviation δ) lies inside the true hull, which lies inside it offset by δ: area error
 * ≤ δ·P + πδ², perimeter ≤ 2πδ (Steiner's formula for parallel convex bodies; [src: Steiner 1840 —
 * from memory]).
 */
export function getPolylineHull(poly: Polyline): HullFigures {
  const { xs, ys } = poly, hull = getHullOfCoordinates(xs, ys, xs.length);
  return { ...measureHull(xs, ys, hull, poly.deviationMm), points: hullPoints(xs, ys, hull) };
}

/** The hull's vertices. */
function hullPoints(xs: Float64Array, ys: Float64Array, hull: HullScratch): [number, number][] {
  const points: [number, number][] = [];
  for (let k = 0; k < hull.count; k++) { const i = hull.chain[k]!; points.push([xs[i]!, ys[i]!]); }
  return points;
}

/** The figures of a polyline's hull (see getHullIndices) with deviation d. */
function measureHull(xs: Float64Array, ys: Float64Array, hull: HullScratch, d: number): HullMeasures {
  const h = hull.chain, count = hull.count;
  let a = 0, per = 0;
  const ox = count > 0 ? xs[h[0]!]! : 0, oy = count > 0 ? ys[h[0]!]! : 0;
  for (let i = 0; i < count; i++) {
    const i0 = h[i]!, i1 = h[i + 1 === count ? 0 : i + 1]!;
    const x0 = xs[i0]!, y0 = ys[i0]!, x1 = xs[i1]!, y1 = ys[i1]!;
    a += (x0 - ox) * (y1 - oy) - (x1 - ox) * (y0 - oy);
    per += getVectorLength(x1 - x0, y1 - y0);
  }
  return { areaMm2: Math.abs(a) / 2, perimeterMm: count > 1 ? per : 0, areaErrorMm2: d * per + Math.PI * d * d, perimeterErrorMm: 2 * Math.PI * d };
}
