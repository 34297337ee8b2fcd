/**
 * Monotone pieces: every segment of a set of contours cut where x′ or y′ changes sign, stored flat
 * (one Float64Array, STRIDE numbers per piece) for the broad and narrow phases of intersect.ts.
 *
 * Invariant: a piece is monotone in x and in y, so its bounding box is the box of its two end points,
 * and so is the box of any sub-piece (this is what makes the subdivision in intersect.ts cheap).
 * [src: common practice for curve–curve intersection, e.g. paper.js `Curve.getMonoCurves` in
 * src/path/Curve.js splits at the roots of the derivative for the same reason]
 *
 * Layout of piece i at offset o = i·STRIDE:
 *   o+0 kind (KIND_*), o+1 segment index in its contour (−1 = the implicit closing line),
 *   o+2, o+3 the piece's parameter range [t0, t1] in its segment (arcs: fraction of the sweep),
 *   o+4..o+7 start and end point (exact copies of the file's points at segment ends),
 *   quad: o+8, o+9 control point; cubic: o+8..o+11 the two control points;
 *   arc: o+8 cx, o+9 cy, o+10 ux, o+11 uy, o+12 vx, o+13 vy, o+14 θ at start, o+15 θ at end.
 */
import type { Contour, Cubic, Quad, Segment } from '../types';
import { addQuadraticRootsInUnitInterval } from './intersectRoots';
import { getVectorLength } from './length';
import { getSegmentAt, getSegmentCount, SegmentView } from '../model/packedSegment';

export const STRIDE = 16;
export const KIND_LINE = 0;
export const KIND_QUAD = 1;
export const KIND_CUBIC = 2;
export const KIND_ARC = 3;

/** How the pieces of one contour form a chain. */
export interface PieceChain {
  /** Position of the contour in the array given to `buildPieces`. */
  readonly contour: number;
  readonly first: number;
  readonly count: number;
  /** The chain closes on itself (closed contour, or end point equal to the start point). */
  readonly cyclic: boolean;
}

export interface Pieces {
  readonly buf: Float64Array;
  readonly contourOf: Int32Array;
  readonly count: number;
  readonly chains: readonly PieceChain[];
  /** Bounding box of all pieces [minX, minY, maxX, maxY] (Infinity when empty). */
  readonly bbox: readonly [number, number, number, number];
  /** Smallest control extent of a kept segment or closing gap: with a larger `pointTol` the pieces would differ. */
  readonly minKeptExtent: number;
}

/**
 * The piece buffer, written in one pass over the segments so that each segment's numbers are read
 * once, while they are in cache. It starts with room for a piece per segment and per closing line
 * plus half as many again for cuts, and grows by half when a drawing needs more; the untouched tail
 * of a fresh zeroed buffer costs address space, not memory (its pages are never touched).
 */
class PieceWriter {
  buf: Float64Array;
  contourOf: Int32Array;
  count = 0;

  /** With `reuse`, takes the spare buffers when they fit (see `spare`). */
  constructor(capacity: number, reuse = false) {
    const spare = reuse ? takeSpare(capacity) : null;
    this.buf = spare ? spare.buf : new Float64Array(STRIDE * capacity);
    this.contourOf = spare ? spare.contourOf : new Int32Array(capacity);
  }

  next(contour: number): number {
    if (this.count === this.contourOf.length) this.grow();
    this.contourOf[this.count] = contour;
    return this.count++ * STRIDE;
  }

  private grow(): void {
    const capacity = Math.ceil(1.5 * this.contourOf.length) + 4;
    const buf = new Float64Array(STRIDE * capacity);
    buf.set(this.buf);
    this.buf = buf;
    const contourOf = new Int32Array(capacity);
    contourOf.set(this.contourOf);
    this.contourOf = contourOf;
  }
}

/**
 * The piece buffer of the last finished search, kept for the next one (`releasePieces`). A fresh
 * buffer costs its first touch of every page — at a million pieces ~128 MB and, on the machines
 * measured, ~0.4 s of page faults, more than the search itself — while the editor re-analyses the
 * same drawing on every edit. Only the last one is kept, and only for a search of at least a quarter
 * of its size, so a worker holds at most what its latest drawing needed.
 */
let spare: { buf: Float64Array; contourOf: Int32Array } | null = null;

/** The spare buffers when they hold `capacity` pieces and are not 4 times more; else null (a spare
 *  too large is dropped). They are not cleared: every piece is written whole for its kind (the add*
 *  functions below write every field the layout gives it, `next` its contour), and what reads a piece
 *  reads only those fields. */
function takeSpare(capacity: number): { buf: Float64Array; contourOf: Int32Array } | null {
  const s = spare;
  spare = null;
  return s && s.contourOf.length >= capacity && s.contourOf.length <= 4 * capacity + 1024 ? s : null;
}

/** Hands the buffers of pieces no longer used to the next `buildPieces(…, { reuse: true })`. */
export function releasePieces(P: Pieces): void {
  spare = { buf: new Float64Array(P.buf.buffer), contourOf: new Int32Array(P.contourOf.buffer) };
}

/** Coefficients c0, c1, c2 of one coordinate's derivative, for addDerivativeRoots (reused). */
const DERIVATIVE = new Float64Array(3);

/** Parameters in (0, 1) where c0 + c1·t + c2·t² = 0 for the coefficients in DERIVATIVE. */
function addDerivativeRoots(ts: number[]): void {
  const from = ts.length;
  addQuadraticRootsInUnitInterval(ts, DERIVATIVE);
  let n = from;
  for (let k = from; k < ts.length; k++) if (ts[k]! > 0 && ts[k]! < 1) ts[n++] = ts[k]!;
  if (n < ts.length) ts.length = n;
}

/**
 * Sorts ts[from..] (insertion sort: a handful of values) and drops those within 1e-12 of the one
 * kept before them.
 */
function sortSplits(ts: number[], from: number): void {
  for (let k = from + 1; k < ts.length; k++) {
    const t = ts[k]!;
    let m = k;
    for (; m > from && ts[m - 1]! > t; m--) ts[m] = ts[m - 1]!;
    ts[m] = t;
  }
  let n = Math.min(from + 1, ts.length);
  for (let k = from + 1; k < ts.length; k++) if (ts[k]! - ts[n - 1]! > 1e-12) ts[n++] = ts[k]!;
  if (n < ts.length) ts.length = n;
}

/**
 * Whether control-coordinate differences all have one strict sign, each above 1e-12 of the largest:
 * then the derivative (a convex combination of them in Bernstein form) stays above that share on
 * [0, 1], far beyond the ~40 ulp of rounding in its power form and its evaluation, so the root
 * search of `addDerivativeRoots` finds nothing and can be skipped. [floating-point error analysis,
 * Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., §5.1 (Horner) — from memory]
 */
function isStrictlyMonotone(d0: number, d1: number, d2: number): boolean {
  const lo = Math.min(d0, d1, d2), hi = Math.max(d0, d1, d2);
  return lo > 1e-12 * hi || hi < 1e-12 * lo;
}

/** Appends to `cuts` the parameters in (0, 1) where a Bézier stops being monotone, sorted. */
function addBezierCuts(cuts: number[], s: Segment & { kind: 'quad' | 'cubic' }): void {
  const from = cuts.length;
  if (s.kind === 'cubic') {
    if (isStrictlyMonotone(s.x1 - s.x0, s.x2 - s.x1, s.x3 - s.x2) && isStrictlyMonotone(s.y1 - s.y0, s.y2 - s.y1, s.y3 - s.y2)) return;
    // B′(t)/3 = (p1−p0)(1−t)² + 2(p2−p1)t(1−t) + (p3−p2)t², in powers of t, per coordinate:
    const d = DERIVATIVE;
    let a = s.x1 - s.x0, b = s.x2 - s.x1, c = s.x3 - s.x2;
    d[0] = a; d[1] = 2 * (b - a); d[2] = a - 2 * b + c;
    addDerivativeRoots(cuts);
    a = s.y1 - s.y0; b = s.y2 - s.y1; c = s.y3 - s.y2;
    d[0] = a; d[1] = 2 * (b - a); d[2] = a - 2 * b + c;
    addDerivativeRoots(cuts);
  } else {
    const d = DERIVATIVE;
    d[0] = s.x1 - s.x0; d[1] = s.x0 - 2 * s.x1 + s.x2; d[2] = 0;
    addDerivativeRoots(cuts);
    d[0] = s.y1 - s.y0; d[1] = s.y0 - 2 * s.y1 + s.y2; d[2] = 0;
    addDerivativeRoots(cuts);
  }
  sortSplits(cuts, from);
}

/*
 * The writers below keep their numbers in locals and write them straight into the buffer: passing
 * doubles to a function that is not inlined boxes each one, which on a million segments is a
 * collection's worth of garbage.
 */

/**
 * Writes the pieces of a cubic cut at cuts[from..to) (from addBezierCuts): each cut splits the
 * remaining right part at its local parameter by de Casteljau's construction.
 */
function addCubic(w: PieceWriter, contour: number, seg: number, s: Cubic, cuts: readonly number[], from: number, to: number): void {
  let x0 = s.x0, y0 = s.y0, x1 = s.x1, y1 = s.y1, x2 = s.x2, y2 = s.y2;
  const x3 = s.x3, y3 = s.y3;
  let t0 = 0;
  for (let k = from; ; k++) {
    const last = k === to;
    const t = last ? 1 : cuts[k]!;
    // The piece is p0, a, d, f; the rest f, e, c, p3 (the whole remaining curve when last).
    let ax = x1, ay = y1, dx = x2, dy = y2, fx = x3, fy = y3, ex = 0, ey = 0, cx = 0, cy = 0;
    if (!last) {
      const u = (t - t0) / (1 - t0);
      ax = x0 + (x1 - x0) * u; ay = y0 + (y1 - y0) * u;
      const bx = x1 + (x2 - x1) * u, by = y1 + (y2 - y1) * u;
      cx = x2 + (x3 - x2) * u; cy = y2 + (y3 - y2) * u;
      dx = ax + (bx - ax) * u; dy = ay + (by - ay) * u;
      ex = bx + (cx - bx) * u; ey = by + (cy - by) * u;
      fx = dx + (ex - dx) * u; fy = dy + (ey - dy) * u;
    }
    const o = w.next(contour);
    const b = w.buf; // after next(), which may have grown it
    b[o] = KIND_CUBIC; b[o + 1] = seg; b[o + 2] = t0; b[o + 3] = t;
    b[o + 4] = x0; b[o + 5] = y0; b[o + 6] = fx; b[o + 7] = fy;
    b[o + 8] = ax; b[o + 9] = ay; b[o + 10] = dx; b[o + 11] = dy;
    if (last) return;
    x0 = fx; y0 = fy; x1 = ex; y1 = ey; x2 = cx; y2 = cy;
    t0 = t;
  }
}

/** Writes the pieces of a quadratic cut at cuts[from..to), as addCubic. */
function addQuad(w: PieceWriter, contour: number, seg: number, s: Quad, cuts: readonly number[], from: number, to: number): void {
  let x0 = s.x0, y0 = s.y0, x1 = s.x1, y1 = s.y1;
  const x2 = s.x2, y2 = s.y2;
  let t0 = 0;
  for (let k = from; ; k++) {
    const last = k === to;
    const t = last ? 1 : cuts[k]!;
    // The piece is p0, a, c; the rest c, b, p2.
    let ax = x1, ay = y1, cx = x2, cy = y2, bx = 0, by = 0;
    if (!last) {
      const u = (t - t0) / (1 - t0);
      ax = x0 + (x1 - x0) * u; ay = y0 + (y1 - y0) * u;
      bx = x1 + (x2 - x1) * u; by = y1 + (y2 - y1) * u;
      cx = ax + (bx - ax) * u; cy = ay + (by - ay) * u;
    }
    const o = w.next(contour);
    const b = w.buf; // after next(), which may have grown it
    b[o] = KIND_QUAD; b[o + 1] = seg; b[o + 2] = t0; b[o + 3] = t;
    b[o + 4] = x0; b[o + 5] = y0; b[o + 6] = cx; b[o + 7] = cy;
    b[o + 8] = ax; b[o + 9] = ay;
    if (last) return;
    x0 = cx; y0 = cy; x1 = bx; y1 = by;
    t0 = t;
  }
}

/** Appends to `cuts` the sweep fractions in (0, 1) where an arc stops being monotone, sorted. */
function addArcCuts(cuts: number[], s: Segment & { kind: 'arc' }): void {
  const from = cuts.length;
  // x′(θ) = −ux sin θ + vx cos θ = 0 at θ = atan2(vx, ux) + kπ; likewise for y.
  addAngleCuts(cuts, Math.atan2(s.vx, s.ux), s.theta0, s.sweep);
  addAngleCuts(cuts, Math.atan2(s.vy, s.uy), s.theta0, s.sweep);
  sortSplits(cuts, from);
}

/** Appends the sweep fractions in (0, 1) of the angles base + kπ. */
function addAngleCuts(cuts: number[], base: number, theta0: number, sweep: number): void {
  for (let k = -4; k <= 4; k++) {
    const f = (base + k * Math.PI - theta0) / sweep;
    if (f > 1e-12 && f < 1 - 1e-12) cuts.push(f);
  }
}

/** Writes the pieces of an arc cut at cuts[from..to) (from addArcCuts). */
function addArc(w: PieceWriter, contour: number, seg: number, s: Segment & { kind: 'arc' }, cuts: readonly number[], from: number, to: number): void {
  const { ux, uy, vx, vy, theta0, sweep } = s;
  let prevF = 0;
  let px = s.x0, py = s.y0;
  for (let k = from; k <= to; k++) {
    const f = k < to ? cuts[k]! : 1;
    const th = theta0 + f * sweep;
    const ex = k < to ? s.cx + ux * Math.cos(th) + vx * Math.sin(th) : s.x1;
    const ey = k < to ? s.cy + uy * Math.cos(th) + vy * Math.sin(th) : s.y1;
    const o = w.next(contour);
    const b = w.buf;
    b[o] = KIND_ARC;
    b[o + 1] = seg;
    b[o + 2] = prevF;
    b[o + 3] = f;
    b[o + 4] = px; b[o + 5] = py; b[o + 6] = ex; b[o + 7] = ey;
    b[o + 8] = s.cx; b[o + 9] = s.cy; b[o + 10] = ux; b[o + 11] = uy; b[o + 12] = vx; b[o + 13] = vy;
    b[o + 14] = theta0 + prevF * sweep;
    b[o + 15] = th;
    prevF = f;
    px = ex;
    py = ey;
  }
}

function addLine(w: PieceWriter, contour: number, seg: number, x0: number, y0: number, x1: number, y1: number): void {
  const o = w.next(contour);
  const b = w.buf;
  b[o] = KIND_LINE;
  b[o + 1] = seg;
  b[o + 2] = 0;
  b[o + 3] = 1;
  b[o + 4] = x0; b[o + 5] = y0; b[o + 6] = x1; b[o + 7] = y1;
}

/** Size of a segment's control polygon seen from its start: 0 means the segment is a single point. */
export function controlExtent(s: Segment): number {
  const x0 = s.x0, y0 = s.y0;
  switch (s.kind) {
    case 'arc': {
      const r = Math.max(getVectorLength(s.ux, s.uy), getVectorLength(s.vx, s.vy));
      return Math.max(Math.abs(s.x1 - x0), Math.abs(s.y1 - y0), r * Math.abs(s.sweep));
    }
    case 'line':
      return Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0));
    case 'quad':
      return Math.max(Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)), Math.abs(s.x2 - x0), Math.abs(s.y2 - y0));
    case 'cubic':
      return Math.max(
        Math.max(Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)), Math.abs(s.x2 - x0), Math.abs(s.y2 - y0)),
        Math.abs(s.x3 - x0), Math.abs(s.y3 - y0),
      );
  }
}

/** Writes the monotone pieces of segment `seg` of contour `contour`, using `cuts` as scratch (appended to). */
function addSegmentPieces(w: PieceWriter, contour: number, seg: number, s: Segment, cuts: number[]): void {
  const cut = cuts.length;
  switch (s.kind) {
    case 'line': addLine(w, contour, seg, s.x0, s.y0, s.x1, s.y1); break;
    case 'quad': addBezierCuts(cuts, s); addQuad(w, contour, seg, s, cuts, cut, cuts.length); break;
    case 'cubic': addBezierCuts(cuts, s); addCubic(w, contour, seg, s, cuts, cut, cuts.length); break;
    case 'arc':
      if (Math.abs(s.ux * s.vy - s.uy * s.vx) === 0) {
        addLine(w, contour, seg, s.x0, s.y0, s.x1, s.y1);
      } else {
        addArcCuts(cuts, s);
        addArc(w, contour, seg, s, cuts, cut, cuts.length);
      }
      break;
  }
}

/**
 * Most pieces of one segment: a cubic has at most 4 cuts, an arc at most the 9 turns per axis that
 * addAngleCuts tries, so the writer below never grows and SEGMENT_PIECES stays its buffer.
 */
const MAX_SEGMENT_PIECES = 20;
const segmentWriter = new PieceWriter(MAX_SEGMENT_PIECES);
const segmentCuts: number[] = [];

/** Output of `writeSegmentPieces`, in the layout above (overwritten by every call). */
export const SEGMENT_PIECES = segmentWriter.buf;

/**
 * Writes the monotone pieces of one segment alone into SEGMENT_PIECES (from position 0), exactly
 * those `buildPieces` writes for it, and returns how many: 0 for a segment whose control points all
 * equal its start (`buildPieces` leaves those out even with `pointTol` = 0). For flattening huge
 * contours without building the file-wide piece buffer.
 */
export function writeSegmentPieces(s: Segment): number {
  if (controlExtent(s) <= 0) return 0;
  segmentWriter.count = 0;
  segmentCuts.length = 0;
  addSegmentPieces(segmentWriter, 0, 0, s, segmentCuts);
  return segmentWriter.count;
}

/** The segment buildPieces looks at, for a contour whose segments are stored. */
const pieceView = new SegmentView();

/** How `buildPieces` works beside its inputs. */
export interface BuildPiecesOptions {
  /** Take the spare buffers of pieces handed back (`releasePieces`) when they fit. */
  readonly reuse?: boolean;
  /** Give every contour, open ones too, its implicit closing line (for winding numbers). */
  readonly closeAll?: boolean;
}

/**
 * Cuts the contours into monotone pieces. Segments whose control points all lie within
 * `pointTol` of their start are left out (zero-length segments are their own check); a closed
 * contour whose last end point is not its start gets an implicit closing line (segment −1), and with
 * `closeAll` so does every other contour.
 */
export function buildPieces(contours: readonly Contour[], pointTol: number, { reuse = false, closeAll = false }: BuildPiecesOptions = {}): Pieces {
  let segments = 0;
  for (let ci = 0; ci < contours.length; ci++) segments += getSegmentCount(contours[ci]!);
  const w = new PieceWriter(segments + (segments >> 1) + contours.length, reuse);
  const cuts: number[] = [];
  const chains: PieceChain[] = [];
  let minKept = Infinity;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let ci = 0; ci < contours.length; ci++) {
    const c = contours[ci]!;
    const segmentCount = getSegmentCount(c);
    const closed = c.closed || closeAll;
    const first = w.count;
    let lastX = c.startX, lastY = c.startY;
    for (let si = 0; si < segmentCount; si++) {
      const s = getSegmentAt(c, si, pieceView);
      const extent = controlExtent(s);
      if (extent <= pointTol) continue;
      minKept = Math.min(minKept, extent);
      const from = w.count;
      addSegmentPieces(w, ci, si, s, cuts);
      const b = w.buf;
      for (let i = from; i < w.count; i++) {
        const o = i * STRIDE;
        minX = Math.min(minX, b[o + 4]!, b[o + 6]!);
        maxX = Math.max(maxX, b[o + 4]!, b[o + 6]!);
        minY = Math.min(minY, b[o + 5]!, b[o + 7]!);
        maxY = Math.max(maxY, b[o + 5]!, b[o + 7]!);
      }
      if (s.kind === 'cubic') { lastX = s.x3; lastY = s.y3; }
      else if (s.kind === 'quad') { lastX = s.x2; lastY = s.y2; }
      else { lastX = s.x1; lastY = s.y1; }
    }
    const gap = getVectorLength(lastX - c.startX, lastY - c.startY);
    if (gap > pointTol) minKept = Math.min(minKept, gap);
    if (closed && gap > pointTol) {
      addLine(w, ci, -1, lastX, lastY, c.startX, c.startY);
      minX = Math.min(minX, lastX, c.startX);
      maxX = Math.max(maxX, lastX, c.startX);
      minY = Math.min(minY, lastY, c.startY);
      maxY = Math.max(maxY, lastY, c.startY);
    }
    const count = w.count - first;
    chains.push({ contour: ci, first, count, cyclic: count > 0 && (closed || gap <= pointTol) });
  }
  return {
    buf: w.buf.subarray(0, w.count * STRIDE),
    contourOf: w.contourOf.subarray(0, w.count),
    count: w.count,
    chains,
    bbox: [minX, minY, maxX, maxY],
    minKeptExtent: minKept,
  };
}

/** Point of piece i at local parameter u ∈ [0, 1]. */
export function getPiecePoint(buf: Float64Array, i: number, u: number): [number, number] {
  const o = i * STRIDE;
  if (u === 0) return [buf[o + 4]!, buf[o + 5]!];
  if (u === 1) return [buf[o + 6]!, buf[o + 7]!];
  const v = 1 - u;
  switch (buf[o]) {
    case KIND_LINE:
      return [buf[o + 4]! * v + buf[o + 6]! * u, buf[o + 5]! * v + buf[o + 7]! * u];
    case KIND_QUAD: {
      const a = v * v, b = 2 * u * v, c = u * u;
      return [a * buf[o + 4]! + b * buf[o + 8]! + c * buf[o + 6]!, a * buf[o + 5]! + b * buf[o + 9]! + c * buf[o + 7]!];
    }
    case KIND_CUBIC: {
      const a = v * v * v, b = 3 * u * v * v, c = 3 * u * u * v, d = u * u * u;
      return [
        a * buf[o + 4]! + b * buf[o + 8]! + c * buf[o + 10]! + d * buf[o + 6]!,
        a * buf[o + 5]! + b * buf[o + 9]! + c * buf[o + 11]! + d * buf[o + 7]!,
      ];
    }
    default: {
      const th = buf[o + 14]! + u * (buf[o + 15]! - buf[o + 14]!);
      const cs = Math.cos(th), sn = Math.sin(th);
      return [buf[o + 8]! + buf[o + 10]! * cs + buf[o + 12]! * sn, buf[o + 9]! + buf[o + 11]! * cs + buf[o + 13]! * sn];
    }
  }
}

/** Derivative d/du of piece i at local parameter u. */
export function getPieceTangent(buf: Float64Array, i: number, u: number): [number, number] {
  const o = i * STRIDE;
  const v = 1 - u;
  switch (buf[o]) {
    case KIND_LINE:
      return [buf[o + 6]! - buf[o + 4]!, buf[o + 7]! - buf[o + 5]!];
    case KIND_QUAD:
      return [
        2 * (v * (buf[o + 8]! - buf[o + 4]!) + u * (buf[o + 6]! - buf[o + 8]!)),
        2 * (v * (buf[o + 9]! - buf[o + 5]!) + u * (buf[o + 7]! - buf[o + 9]!)),
      ];
    case KIND_CUBIC: {
      const a = 3 * v * v, b = 6 * u * v, c = 3 * u * u;
      return [
        a * (buf[o + 8]! - buf[o + 4]!) + b * (buf[o + 10]! - buf[o + 8]!) + c * (buf[o + 6]! - buf[o + 10]!),
        a * (buf[o + 9]! - buf[o + 5]!) + b * (buf[o + 11]! - buf[o + 9]!) + c * (buf[o + 7]! - buf[o + 11]!),
      ];
    }
    default: {
      const dth = buf[o + 15]! - buf[o + 14]!;
      const th = buf[o + 14]! + u * dth;
      const cs = Math.cos(th), sn = Math.sin(th);
      return [dth * (-buf[o + 10]! * sn + buf[o + 12]! * cs), dth * (-buf[o + 11]! * sn + buf[o + 13]! * cs)];
    }
  }
}

/**
 * Direction of the piece leaving its start (end = false) or arriving at its end (end = true), as a
 * point: for a line the other end point (exact), for a Bézier the nearest distinct control point
 * (the tangent there, exact), for an arc the point one tangent-length away.
 */
export function getPieceEndProbe(buf: Float64Array, i: number, end: boolean): [number, number] {
  const o = i * STRIDE;
  const kind = buf[o];
  const px = buf[o + (end ? 6 : 4)]!, py = buf[o + (end ? 7 : 5)]!;
  if (kind === KIND_LINE) return [buf[o + (end ? 4 : 6)]!, buf[o + (end ? 5 : 7)]!];
  if (kind === KIND_QUAD || kind === KIND_CUBIC) {
    const order = kind === KIND_QUAD ? [8, end ? 4 : 6] : end ? [10, 8, 4] : [8, 10, 6];
    for (const k of order) {
      const x = buf[o + k]!, y = buf[o + k + 1]!;
      if (x !== px || y !== py) return [x, y];
    }
    return [px, py];
  }
  const [tx, ty] = getPieceTangent(buf, i, end ? 1 : 0);
  return end ? [px - tx, py - ty] : [px + tx, py + ty];
}
