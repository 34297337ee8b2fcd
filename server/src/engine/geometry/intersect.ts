/**
 * Where contours cross, touch or run over each other (self-intersections, crossings between
 * contours, double cuts).
 *
 * Broad phase: every segment is cut into x/y-monotone pieces (intersectPieces.ts) whose end-point
 * boxes are paired by one join of a packed box tree with itself (piecePairs.ts); only pairs whose
 * boxes meet reach the narrow phase, in order of their piece indices, so the cost is ~ n log n + k
 * for n pieces and k candidate pairs. [src: REFERENCES.md §4.8; Bentley & Ottmann 1979 for the
 * n log n + k target]
 * Narrow phase by pair kind:
 * - line–line: decided exactly with orient2d (robust-predicates; its sign is flipped relative to
 *   Shewchuk's C code, REFERENCES.md §7.2, so `ccw` below negates it); the point is computed after,
 *   in floating point, from the exact signs (§7.2 last bullet);
 * - line–Bézier: the Bézier put into the line's implicit equation is a polynomial of degree 2–3 in t;
 *   line–arc: in the arc's own frame (inverse of [U V]) the ellipse is the unit circle and the line
 *   gives a quadratic. Roots by intersectRoots.ts.
 * - Bézier–Bézier, Bézier–arc and arc–arc: recursive subdivision of both monotone pieces with
 *   end-point boxes (exact boxes, by monotonicity) down to `eps` = 1e-9 of the outline size, then
 *   Newton polishing; at most MAX_SUBDIVISION_PAIRS box pairs per piece pair, and hitting that cap is
 *   reported (`unresolved`). [src: subdivision with bounding boxes, REFERENCES.md §4.8; Sederberg &
 *   Nishita 1990 for the clipping family]
 * Adjacent pieces meet at their shared end: that point is not an intersection, but a piece that
 * doubles back over its neighbour is an overlap (REFERENCES.md §4.8).
 * Crossing vs touch: at the meeting point each pass of the contour(s) has an incoming and an
 * outgoing direction; the passes cross when the second pass's two directions lie on different sides
 * of the first pass (decided with orient2d on direction probes). [common practice, no source]
 */
import { orient2d } from 'robust-predicates';
import type { Arc, Contour, Cubic, Quad, Segment, SourceSpan } from '../types';
import {
  buildPieces, releasePieces, getPieceEndProbe, getPiecePoint, getPieceTangent,
  KIND_ARC, KIND_CUBIC, KIND_LINE, KIND_QUAD, STRIDE,
  type PieceChain, type Pieces,
} from './intersectPieces';
import { getBezierPowerCoefficients, getPolynomialRoots } from './intersectRoots';
import { findPiecePairs } from './piecePairs';
import { getSegmentLength, getVectorLength } from './length';
import { getSegmentAt, SegmentView } from '../model/packedSegment';

/** Relative geometric tolerance: "same point" is 1e-9 of the outline's bounding-box diagonal.
 *  Quantity: length · relative to the drawing. Source: REFERENCES.md §7.3 (abs = 1e-9·diagonal). */
export const RELATIVE_POINT_TOLERANCE = 1e-9;

/** Most box pairs examined for one pair of curved pieces. Transversal crossings need ~4 pairs per
 *  halving and ~60 halvings to reach 1e-9 of the size; tangencies and curves that partly run over
 *  each other spread over many boxes, and those are what the cap stops (its hit is reported).
 *  Same idea and order of magnitude as paper.js `addCurveIntersections` (`calls >= 4096`). */
export const MAX_SUBDIVISION_PAIRS = 4096;

/**
 * Limits of one search, so that a broken or hostile file (thousands of copies of one line, every line
 * through one point) cannot take all memory and time: candidate pairs of pieces whose boxes meet, and
 * meetings found (crossings, touches and runs of overlap, before merging). A wavy outline of a million
 * lines, arcs or cubics gives one candidate pair per piece and no meeting (measured), so real files
 * stay far below both; a search that reaches one stops, keeps what it found and says so (`stopped`;
 * the `search-stopped` check). Source: common practice, no source.
 */
export const MAX_PIECE_PAIRS = 5_000_000;
export const MAX_MEETINGS = 100_000;

/** Newton steps when polishing a subdivision hit; quadratic convergence needs ~3 from a 1e-9 box. */
const MAX_NEWTON_STEPS = 8;

/** Candidate pairs examined between two polls of `isCancelled` (a curved pair may take 4096 box pairs). */
const NARROW_POLL_EVERY = 1024;

/** A place on a contour: segment index (−1 = implicit closing line) and parameter in it. */
export interface ContourPlace {
  readonly contour: number;
  readonly segment: number;
  /** Parameter in the segment: t ∈ [0, 1] (arcs: fraction of the sweep). */
  readonly t: number;
  readonly span: SourceSpan;
}

export interface Intersection {
  readonly kind: 'crossing' | 'touch';
  readonly x: number;
  readonly y: number;
  readonly a: ContourPlace;
  readonly b: ContourPlace;
}

export interface Overlap {
  /** The run on the earlier piece (document order) and on the later one. */
  readonly a: { readonly contour: number; readonly firstSegment: number; readonly lastSegment: number; readonly span: SourceSpan };
  readonly b: { readonly contour: number; readonly firstSegment: number; readonly lastSegment: number; readonly span: SourceSpan };
  /** Length cut twice (mm). */
  readonly length: number;
  /** Where the overlapping run starts. */
  readonly x: number;
  readonly y: number;
}

/** A pair of curved pieces whose subdivision hit MAX_SUBDIVISION_PAIRS: intersections there are not resolved. */
export interface UnresolvedPair {
  readonly x: number;
  readonly y: number;
  readonly a: ContourPlace;
  readonly b: ContourPlace;
}

export interface IntersectionResult {
  readonly intersections: readonly Intersection[];
  readonly overlaps: readonly Overlap[];
  readonly unresolved: readonly UnresolvedPair[];
  /** The "same point" tolerance used (mm). */
  readonly eps: number;
  /**
   * Null when every pair of pieces was examined; otherwise the limit that stopped the search (more
   * candidate pairs than MAX_PIECE_PAIRS, or more meetings than MAX_MEETINGS), and there may be
   * meetings that are not listed.
   */
  readonly stopped: SearchStop | null;
}

/** The limit that stopped an intersection search. */
export interface SearchStop {
  readonly reason: 'pairs' | 'meetings';
  readonly limit: number;
}

export interface IntersectOptions {
  /** Also look for intersections between different contours (default true). */
  readonly acrossContours?: boolean;
  /** Also look within each contour (default true). */
  readonly withinContours?: boolean;
  /** Polled during the search (piecePairs.ts, then every NARROW_POLL_EVERY candidate pairs); when it returns true the search stops early. */
  readonly isCancelled?: () => boolean;
  /** Take the piece buffers the last search with this option left, and leave them for the next
   *  (intersectPieces.ts `spare`): for the one file-wide search of each analysis. */
  readonly reuseBuffers?: boolean;
}

/** +1 when a→b→c turns counter-clockwise in y-up axes, −1 clockwise, 0 collinear; exact. */
function ccw(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const d = orient2d(ax, ay, bx, by, cx, cy);
  return d < 0 ? 1 : d > 0 ? -1 : 0;
}

interface RawHit {
  pa: number; ua: number; pb: number; ub: number; x: number; y: number;
  /** Known transversal (both interiors, non-parallel): no need for the side test. */
  transversal: boolean;
}

interface RawOverlap { pa: number; a0: number; a1: number; pb: number; b0: number; b1: number; length: number }

class Collector {
  hits: RawHit[] = [];
  overlaps: RawOverlap[] = [];
  unresolved: { pa: number; pb: number; x: number; y: number }[] = [];
  constructor(readonly P: Pieces, readonly eps: number) {}
}

// ---------------------------------------------------------------- narrow phase: line–line

function lineLine(col: Collector, i: number, j: number): void {
  const b = col.P.buf;
  const o = i * STRIDE, q = j * STRIDE;
  const px = b[o + 4]!, py = b[o + 5]!, qx = b[o + 6]!, qy = b[o + 7]!;
  const rx = b[q + 4]!, ry = b[q + 5]!, sx = b[q + 6]!, sy = b[q + 7]!;
  const o1 = ccw(px, py, qx, qy, rx, ry), o2 = ccw(px, py, qx, qy, sx, sy);
  if (o1 !== 0 && o1 === o2) return;
  const o3 = ccw(rx, ry, sx, sy, px, py), o4 = ccw(rx, ry, sx, sy, qx, qy);
  if (o3 !== 0 && o3 === o4) return;
  if (o1 === 0 && o2 === 0) {
    collinearLines(col, i, j, px, py, qx, qy, rx, ry, sx, sy);
    return;
  }
  // Exactly one meeting point. Parameters from the exact signs where an end point is involved.
  let ua: number, ub: number, x: number, y: number;
  if (o3 === 0) { ua = 0; x = px; y = py; ub = project(rx, ry, sx, sy, px, py); }
  else if (o4 === 0) { ua = 1; x = qx; y = qy; ub = project(rx, ry, sx, sy, qx, qy); }
  else if (o1 === 0) { ub = 0; x = rx; y = ry; ua = project(px, py, qx, qy, rx, ry); }
  else if (o2 === 0) { ub = 1; x = sx; y = sy; ua = project(px, py, qx, qy, sx, sy); }
  else {
    // Proper crossing: signed distances of p and q from rs are proportional to the cross products.
    const dA = (sx - rx) * (py - ry) - (sy - ry) * (px - rx);
    const dB = (sx - rx) * (qy - ry) - (sy - ry) * (qx - rx);
    ua = clamp01(dA / (dA - dB));
    const dC = (qx - px) * (ry - py) - (qy - py) * (rx - px);
    const dD = (qx - px) * (sy - py) - (qy - py) * (sx - px);
    ub = clamp01(dC / (dC - dD));
    x = px + (qx - px) * ua;
    y = py + (qy - py) * ua;
    col.hits.push({ pa: i, ua, pb: j, ub, x, y, transversal: true });
    return;
  }
  col.hits.push({ pa: i, ua: clamp01(ua), pb: j, ub: clamp01(ub), x, y, transversal: false });
}

function clamp01(t: number): number {
  return t < 0 ? 0 : t > 1 ? 1 : Number.isFinite(t) ? t : 0;
}

/** Parameter of the projection of (x, y) on segment a→b. */
function project(ax: number, ay: number, bx: number, by: number, x: number, y: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  return l2 === 0 ? 0 : ((x - ax) * dx + (y - ay) * dy) / l2;
}

function collinearLines(
  col: Collector, i: number, j: number,
  px: number, py: number, qx: number, qy: number, rx: number, ry: number, sx: number, sy: number,
): void {
  // Compare along the dominant axis of pq: exact comparisons of coordinates.
  const useX = Math.abs(qx - px) >= Math.abs(qy - py);
  const a0 = useX ? px : py, a1 = useX ? qx : qy, b0 = useX ? rx : ry, b1 = useX ? sx : sy;
  const lo = Math.max(Math.min(a0, a1), Math.min(b0, b1));
  const hi = Math.min(Math.max(a0, a1), Math.max(b0, b1));
  if (lo > hi) return;
  const ta = (v: number) => (v - a0) / (a1 - a0);
  const tb = (v: number) => (b1 === b0 ? 0 : (v - b0) / (b1 - b0));
  if (lo === hi) {
    const x = px + (qx - px) * ta(lo), y = py + (qy - py) * ta(lo);
    col.hits.push({ pa: i, ua: clamp01(ta(lo)), pb: j, ub: clamp01(tb(lo)), x, y, transversal: false });
    return;
  }
  const lenA = getVectorLength(qx - px, qy - py);
  const length = (lenA * (hi - lo)) / Math.abs(a1 - a0);
  const u0 = clamp01(ta(lo)), u1 = clamp01(ta(hi));
  col.overlaps.push({ pa: i, a0: Math.min(u0, u1), a1: Math.max(u0, u1), pb: j, b0: Math.min(clamp01(tb(lo)), clamp01(tb(hi))), b1: Math.max(clamp01(tb(lo)), clamp01(tb(hi))), length });
}

// ---------------------------------------------------------------- narrow phase: line–curve (analytic)

function pieceControls(buf: Float64Array, i: number): { xs: number[]; ys: number[] } {
  const o = i * STRIDE;
  if (buf[o] === KIND_QUAD) return { xs: [buf[o + 4]!, buf[o + 8]!, buf[o + 6]!], ys: [buf[o + 5]!, buf[o + 9]!, buf[o + 7]!] };
  return { xs: [buf[o + 4]!, buf[o + 8]!, buf[o + 10]!, buf[o + 6]!], ys: [buf[o + 5]!, buf[o + 9]!, buf[o + 11]!, buf[o + 7]!] };
}

/** Pushes a hit for line piece `li` at point (x, y) with curve piece `ci` at `u`, if the point is on the line. */
function pushLineCurveHit(col: Collector, li: number, ci: number, u: number, lineFirst: boolean): void {
  const b = col.P.buf;
  const o = li * STRIDE;
  const [x, y] = getPiecePoint(b, ci, u);
  const px = b[o + 4]!, py = b[o + 5]!, qx = b[o + 6]!, qy = b[o + 7]!;
  const len = getVectorLength(qx - px, qy - py);
  const s = project(px, py, qx, qy, x, y);
  const slack = col.eps / len;
  if (s < -slack || s > 1 + slack) return;
  const hit = { ua: clamp01(s), ub: u, x, y, transversal: false };
  col.hits.push(lineFirst ? { pa: li, pb: ci, ...hit } : { pa: ci, pb: li, ...hit, ua: u, ub: clamp01(s) });
}

function lineBezier(col: Collector, li: number, ci: number, lineFirst: boolean): void {
  const b = col.P.buf;
  const o = li * STRIDE;
  const px = b[o + 4]!, py = b[o + 5]!, dx = b[o + 6]! - px, dy = b[o + 7]! - py;
  const len = getVectorLength(dx, dy);
  const { xs, ys } = pieceControls(b, ci);
  // Signed distance × len of the curve from the line: dx·(y − py) − dy·(x − px), a polynomial in u.
  const ds = xs.map((x, k) => dx * (ys[k]! - py) - dy * (x - px));
  if (ds.every((d) => Math.abs(d) <= col.eps * len)) {
    curveOnLine(col, li, ci, lineFirst);
    return;
  }
  const coeffs = getBezierPowerCoefficients(ds);
  const slack = col.eps / Math.max(curveHull(xs, ys), col.eps);
  for (const u of mergeRoots(getPolynomialRoots(coeffs, -slack, 1 + slack, col.eps * len))) pushLineCurveHit(col, li, ci, clamp01(u), lineFirst);
}

function curveHull(xs: number[], ys: number[]): number {
  let m = 0;
  for (let k = 1; k < xs.length; k++) m += getVectorLength(xs[k]! - xs[k - 1]!, ys[k]! - ys[k - 1]!);
  return m;
}

function mergeRoots(roots: number[]): number[] {
  const out: number[] = [];
  for (const r of roots) if (out.length === 0 || r - out[out.length - 1]! > 1e-9) out.push(r);
  return out;
}

/** A straight curve piece lying on a line piece: both are monotone, so the overlap is an interval. */
function curveOnLine(col: Collector, li: number, ci: number, lineFirst: boolean): void {
  const b = col.P.buf;
  const o = li * STRIDE, q = ci * STRIDE;
  const px = b[o + 4]!, py = b[o + 5]!, qx = b[o + 6]!, qy = b[o + 7]!;
  const s0 = project(px, py, qx, qy, b[q + 4]!, b[q + 5]!);
  const s1 = project(px, py, qx, qy, b[q + 6]!, b[q + 7]!);
  const lo = Math.max(0, Math.min(s0, s1)), hi = Math.min(1, Math.max(s0, s1));
  if (lo > hi) return;
  const len = getVectorLength(qx - px, qy - py);
  if ((hi - lo) * len <= col.eps) {
    pushLineCurveHit(col, li, ci, s0 < s1 ? (lo === s0 ? 0 : 1) : lo === s1 ? 1 : 0, lineFirst);
    return;
  }
  const c0 = clamp01((lo - s0) / (s1 - s0)), c1 = clamp01((hi - s0) / (s1 - s0));
  const rec = { length: (hi - lo) * len };
  if (lineFirst) col.overlaps.push({ pa: li, a0: lo, a1: hi, pb: ci, b0: Math.min(c0, c1), b1: Math.max(c0, c1), ...rec });
  else col.overlaps.push({ pa: ci, a0: Math.min(c0, c1), a1: Math.max(c0, c1), pb: li, b0: lo, b1: hi, ...rec });
}

/** Line–arc: in the arc's frame (inverse of [U V]) the ellipse is the unit circle. */
function lineArc(col: Collector, li: number, ai: number, lineFirst: boolean): void {
  const b = col.P.buf;
  const o = li * STRIDE, q = ai * STRIDE;
  const cx = b[q + 8]!, cy = b[q + 9]!, ux = b[q + 10]!, uy = b[q + 11]!, vx = b[q + 12]!, vy = b[q + 13]!;
  const det = ux * vy - vx * uy;
  const toFrame = (x: number, y: number): [number, number] => [((x - cx) * vy - (y - cy) * vx) / det, (-(x - cx) * uy + (y - cy) * ux) / det];
  const [ax, ay] = toFrame(b[o + 4]!, b[o + 5]!);
  const [bx, by] = toFrame(b[o + 6]!, b[o + 7]!);
  const dx = bx - ax, dy = by - ay;
  const sMin = Math.min(getVectorLength(ux, uy), getVectorLength(vx, vy), Math.abs(det) / Math.max(getVectorLength(ux, uy), getVectorLength(vx, vy)));
  const epsFrame = col.eps / sMin;
  const len = getVectorLength(b[o + 6]! - b[o + 4]!, b[o + 7]! - b[o + 5]!);
  const slack = col.eps / len;
  const roots = getPolynomialRoots([ax * ax + ay * ay - 1, 2 * (ax * dx + ay * dy), dx * dx + dy * dy], -slack, 1 + slack, 2 * epsFrame * getVectorLength(dx, dy) * Math.max(1, getVectorLength(dx, dy)));
  const th0 = b[q + 14]!, th1 = b[q + 15]!;
  for (const s of mergeRoots(roots)) {
    const fx = ax + dx * s, fy = ay + dy * s;
    const u = getArcFraction(Math.atan2(fy, fx), th0, th1, epsFrame);
    if (u === null) continue;
    const x = b[o + 4]! + (b[o + 6]! - b[o + 4]!) * clamp01(s), y = b[o + 5]! + (b[o + 7]! - b[o + 5]!) * clamp01(s);
    const hit = { x, y, transversal: false };
    col.hits.push(lineFirst ? { pa: li, ua: clamp01(s), pb: ai, ub: u, ...hit } : { pa: ai, ua: u, pb: li, ub: clamp01(s), ...hit });
  }
}

/** Fraction of the arc piece θ0→θ1 at angle `phi`, or null when outside (with angular slack). */
function getArcFraction(phi: number, th0: number, th1: number, slack: number): number | null {
  const sweep = th1 - th0;
  let d = phi - th0;
  const twoPi = 2 * Math.PI;
  d -= Math.floor(d / twoPi) * twoPi; // d ∈ [0, 2π)
  if (sweep < 0) d -= twoPi; // ∈ (−2π, 0]
  if (sweep < 0 ? d < sweep - slack : d > sweep + slack) {
    // Maybe just before the start.
    const alt = sweep < 0 ? d + twoPi : d - twoPi;
    if (Math.abs(alt) <= slack) return 0;
    if (Math.abs(d) <= slack) return 0;
    return null;
  }
  return clamp01(d / sweep);
}

// ---------------------------------------------------------------- narrow phase: curve–curve (subdivision)

function boxOf(buf: Float64Array, i: number, u0: number, u1: number, out: number[]): void {
  const [x0, y0] = getPiecePoint(buf, i, u0);
  const [x1, y1] = getPiecePoint(buf, i, u1);
  out[0] = Math.min(x0, x1); out[1] = Math.min(y0, y1); out[2] = Math.max(x0, x1); out[3] = Math.max(y0, y1);
}

function sameCurve(buf: Float64Array, i: number, j: number, eps: number): 'same' | 'reversed' | null {
  const o = i * STRIDE, q = j * STRIDE;
  if (buf[o] !== buf[q]) return null;
  const kind = buf[o]!;
  const close = (a: number, b: number) => Math.abs(buf[a]! - buf[b]!) <= eps;
  if (kind === KIND_ARC) {
    for (let k = 8; k < 14; k++) if (!close(o + k, q + k)) return null;
    const fwd = close(o + 4, q + 4) && close(o + 5, q + 5) && close(o + 6, q + 6) && close(o + 7, q + 7);
    const rev = close(o + 4, q + 6) && close(o + 5, q + 7) && close(o + 6, q + 4) && close(o + 7, q + 5);
    return fwd ? 'same' : rev ? 'reversed' : null;
  }
  const ends = close(o + 4, q + 4) && close(o + 5, q + 5) && close(o + 6, q + 6) && close(o + 7, q + 7);
  const endsRev = close(o + 4, q + 6) && close(o + 5, q + 7) && close(o + 6, q + 4) && close(o + 7, q + 5);
  if (kind === KIND_QUAD) return close(o + 8, q + 8) && close(o + 9, q + 9) ? (ends ? 'same' : endsRev ? 'reversed' : null) : null;
  if (ends && close(o + 8, q + 8) && close(o + 9, q + 9) && close(o + 10, q + 10) && close(o + 11, q + 11)) return 'same';
  if (endsRev && close(o + 8, q + 10) && close(o + 9, q + 11) && close(o + 10, q + 8) && close(o + 11, q + 9)) return 'reversed';
  return null;
}

/** The piece as a `Segment`, to measure its length with length.ts. */
export function pieceToSegment(buf: Float64Array, i: number): Segment {
  const o = i * STRIDE;
  const span = { start: 0, end: 0 };
  const kind = buf[o];
  if (kind === KIND_LINE) return { kind: 'line', x0: buf[o + 4]!, y0: buf[o + 5]!, x1: buf[o + 6]!, y1: buf[o + 7]!, span };
  if (kind === KIND_QUAD) return { kind: 'quad', x0: buf[o + 4]!, y0: buf[o + 5]!, x1: buf[o + 8]!, y1: buf[o + 9]!, x2: buf[o + 6]!, y2: buf[o + 7]!, span } satisfies Quad;
  if (kind === KIND_CUBIC) return { kind: 'cubic', x0: buf[o + 4]!, y0: buf[o + 5]!, x1: buf[o + 8]!, y1: buf[o + 9]!, x2: buf[o + 10]!, y2: buf[o + 11]!, x3: buf[o + 6]!, y3: buf[o + 7]!, span } satisfies Cubic;
  return {
    kind: 'arc', x0: buf[o + 4]!, y0: buf[o + 5]!, x1: buf[o + 6]!, y1: buf[o + 7]!,
    cx: buf[o + 8]!, cy: buf[o + 9]!, ux: buf[o + 10]!, uy: buf[o + 11]!, vx: buf[o + 12]!, vy: buf[o + 13]!,
    theta0: buf[o + 14]!, sweep: buf[o + 15]! - buf[o + 14]!, span,
  } satisfies Arc;
}

/** Co-elliptic arc pieces: same centre and conjugate diameters of the same ellipse; overlap in angle. */
function coEllipticArcs(col: Collector, i: number, j: number): boolean {
  const b = col.P.buf;
  const o = i * STRIDE, q = j * STRIDE;
  const eps = col.eps;
  if (Math.abs(b[o + 8]! - b[q + 8]!) > eps || Math.abs(b[o + 9]! - b[q + 9]!) > eps) return false;
  const ux = b[o + 10]!, uy = b[o + 11]!, vx = b[o + 12]!, vy = b[o + 13]!;
  const det = ux * vy - vx * uy;
  // Map the other arc's U′, V′ into this arc's frame: same ellipse ⇔ they are orthonormal there.
  const f = (x: number, y: number): [number, number] => [(x * vy - y * vx) / det, (-x * uy + y * ux) / det];
  const [a1, a2] = f(b[q + 10]!, b[q + 11]!);
  const [b1, b2] = f(b[q + 12]!, b[q + 13]!);
  const r = Math.max(getVectorLength(ux, uy), getVectorLength(vx, vy));
  const tol = eps / r;
  if (Math.abs(a1 * a1 + a2 * a2 - 1) > tol || Math.abs(b1 * b1 + b2 * b2 - 1) > tol || Math.abs(a1 * b1 + a2 * b2) > tol) return false;
  // Angles of the other piece's ends in this frame.
  const ang = (x: number, y: number) => { const [p, s] = f(x - b[o + 8]!, y - b[o + 9]!); return Math.atan2(s, p); };
  const th0 = b[o + 14]!, th1 = b[o + 15]!;
  const e0 = getArcFraction(ang(b[q + 4]!, b[q + 5]!), th0, th1, tol);
  const e1 = getArcFraction(ang(b[q + 6]!, b[q + 7]!), th0, th1, tol);
  const s0 = getArcFraction(ang(b[o + 4]!, b[o + 5]!), b[q + 14]!, b[q + 15]!, tol);
  const s1 = getArcFraction(ang(b[o + 6]!, b[o + 7]!), b[q + 14]!, b[q + 15]!, tol);
  // Interval of this piece covered by the other: from the fractions of ends that fall inside.
  const inA = [e0, e1, s0 === null ? null : 0, s1 === null ? null : 1].filter((v): v is number => v !== null);
  const inB = [s0, s1, e0 === null ? null : 0, e1 === null ? null : 1].filter((v): v is number => v !== null);
  if (inA.length < 2 || inB.length < 2) return true;
  const a0 = Math.min(...inA), aEnd = Math.max(...inA);
  const b0 = Math.min(...inB), bEnd = Math.max(...inB);
  const seg = pieceToSegment(b, i) as Arc;
  const sub: Arc = { ...seg, theta0: th0 + a0 * (th1 - th0), sweep: (aEnd - a0) * (th1 - th0) };
  const length = getSegmentLength(sub);
  if (length <= eps) {
    const [x, y] = getPiecePoint(b, i, a0);
    col.hits.push({ pa: i, ua: a0, pb: j, ub: b0, x, y, transversal: false });
    return true;
  }
  col.overlaps.push({ pa: i, a0, a1: aEnd, pb: j, b0, b1: bEnd, length });
  return true;
}

const boxA = [0, 0, 0, 0];
const boxB = [0, 0, 0, 0];

function curveCurve(col: Collector, i: number, j: number): void {
  const buf = col.P.buf;
  const same = sameCurve(buf, i, j, col.eps);
  if (same) {
    col.overlaps.push({ pa: i, a0: 0, a1: 1, pb: j, b0: 0, b1: 1, length: getSegmentLength(pieceToSegment(buf, i)) });
    return;
  }
  if (buf[i * STRIDE] === KIND_ARC && buf[j * STRIDE] === KIND_ARC && coEllipticArcs(col, i, j)) return;
  const eps = col.eps;
  const stack: number[] = [0, 1, 0, 1];
  const found: number[] = []; // u0,u1,v0,v1 cells
  let pairs = 0;
  while (stack.length > 0) {
    const v1 = stack.pop()!, v0 = stack.pop()!, u1 = stack.pop()!, u0 = stack.pop()!;
    if (++pairs > MAX_SUBDIVISION_PAIRS) {
      const [x, y] = getPiecePoint(buf, i, 0.5 * (u0 + u1));
      col.unresolved.push({ pa: i, pb: j, x, y });
      return;
    }
    boxOf(buf, i, u0, u1, boxA);
    boxOf(buf, j, v0, v1, boxB);
    if (boxA[0]! > boxB[2]! + eps || boxB[0]! > boxA[2]! + eps || boxA[1]! > boxB[3]! + eps || boxB[1]! > boxA[3]! + eps) continue;
    const sa = Math.max(boxA[2]! - boxA[0]!, boxA[3]! - boxA[1]!);
    const sb = Math.max(boxB[2]! - boxB[0]!, boxB[3]! - boxB[1]!);
    if (sa <= eps && sb <= eps) {
      found.push(u0, u1, v0, v1);
      continue;
    }
    if (sa >= sb) {
      const m = 0.5 * (u0 + u1);
      stack.push(u0, m, v0, v1, m, u1, v0, v1);
    } else {
      const m = 0.5 * (v0 + v1);
      stack.push(u0, u1, v0, m, u0, u1, m, v1);
    }
  }
  // Cluster neighbouring cells (a tangency leaves a run of them), keep the closest, polish it.
  const cells: number[][] = [];
  for (let k = 0; k < found.length; k += 4) cells.push(found.slice(k, k + 4));
  cells.sort((p, q) => p[0]! - q[0]! || p[2]! - q[2]!);
  const used = new Array<boolean>(cells.length).fill(false);
  for (let k = 0; k < cells.length; k++) {
    if (used[k]) continue;
    const group = [cells[k]!];
    used[k] = true;
    for (let g = 0; g < group.length; g++) {
      const c = group[g]!;
      for (let m = k + 1; m < cells.length; m++) {
        if (used[m]) continue;
        const d = cells[m]!;
        const ua = Math.max(c[1]! - c[0]!, d[1]! - d[0]!), va = Math.max(c[3]! - c[2]!, d[3]! - d[2]!);
        if (d[0]! <= c[1]! + ua && d[1]! >= c[0]! - ua && d[2]! <= c[3]! + va && d[3]! >= c[2]! - va) {
          used[m] = true;
          group.push(d);
        }
      }
    }
    let best = { u: 0, v: 0, d: Infinity };
    for (const c of group) {
      const u = 0.5 * (c[0]! + c[1]!), v = 0.5 * (c[2]! + c[3]!);
      const [ax, ay] = getPiecePoint(buf, i, u);
      const [bx, by] = getPiecePoint(buf, j, v);
      const d = getVectorLength(ax - bx, ay - by);
      if (d < best.d) best = { u, v, d };
    }
    const [u, v] = polish(buf, i, j, best.u, best.v);
    const [x, y] = getPiecePoint(buf, i, u);
    col.hits.push({ pa: i, ua: u, pb: j, ub: v, x, y, transversal: false });
  }
}

/** Newton on A(u) − B(v) = 0; keeps the start when a step does not reduce the residual. */
function polish(buf: Float64Array, i: number, j: number, u: number, v: number): [number, number] {
  let [ax, ay] = getPiecePoint(buf, i, u);
  let [bx, by] = getPiecePoint(buf, j, v);
  let r = getVectorLength(ax - bx, ay - by);
  for (let k = 0; k < MAX_NEWTON_STEPS && r > 0; k++) {
    const [tax, tay] = getPieceTangent(buf, i, u);
    const [tbx, tby] = getPieceTangent(buf, j, v);
    // [ta −tb] [du dv]ᵀ = B − A
    const det = -tax * tby + tay * tbx;
    if (det === 0) break;
    const rx = bx - ax, ry = by - ay;
    const du = (-rx * tby + ry * tbx) / det;
    const dv = (tax * ry - tay * rx) / det;
    const nu = clamp01(u + du), nv = clamp01(v + dv);
    const [nax, nay] = getPiecePoint(buf, i, nu);
    const [nbx, nby] = getPiecePoint(buf, j, nv);
    const nr = getVectorLength(nax - nbx, nay - nby);
    if (!(nr < r)) break;
    u = nu; v = nv; ax = nax; ay = nay; bx = nbx; by = nby; r = nr;
  }
  return [u, v];
}

function narrow(col: Collector, i: number, j: number): void {
  const buf = col.P.buf;
  const ki = buf[i * STRIDE]!, kj = buf[j * STRIDE]!;
  if (ki === KIND_LINE && kj === KIND_LINE) lineLine(col, i, j);
  else if (ki === KIND_LINE) (kj === KIND_ARC ? lineArc : lineBezier)(col, i, j, true);
  else if (kj === KIND_LINE) (ki === KIND_ARC ? lineArc : lineBezier)(col, j, i, false);
  else curveCurve(col, i, j);
}

// ---------------------------------------------------------------- post-processing

interface Place { piece: number; u: number; vertex: number } // vertex = chain-local vertex index or −1

function chainOf(P: Pieces, piece: number): PieceChain {
  return P.chains[P.contourOf[piece]!]!;
}

/** Snaps a place within eps of a piece end to that vertex. */
function toPlace(P: Pieces, piece: number, u: number, x: number, y: number, eps: number): Place {
  const o = piece * STRIDE;
  const ch = chainOf(P, piece);
  const local = piece - ch.first;
  const ds = getVectorLength(x - P.buf[o + 4]!, y - P.buf[o + 5]!);
  const de = getVectorLength(x - P.buf[o + 6]!, y - P.buf[o + 7]!);
  if (u === 0 || (ds <= eps && ds <= de)) return { piece, u: 0, vertex: local };
  if (u === 1 || de <= eps) {
    const v = local + 1;
    return { piece, u: 1, vertex: ch.cyclic && v === ch.count ? 0 : v };
  }
  return { piece, u, vertex: -1 };
}

function placeKey(P: Pieces, p: Place): string {
  return p.vertex >= 0 ? `${P.contourOf[p.piece]}v${p.vertex}` : `${P.contourOf[p.piece]}p${p.piece}`;
}

/** Incoming and outgoing direction probes (points) at a place; null for an open chain's end. */
function getProbes(P: Pieces, p: Place, x: number, y: number): [[number, number] | null, [number, number] | null] {
  const buf = P.buf;
  if (p.vertex < 0) {
    const [tx, ty] = getPieceTangent(buf, p.piece, p.u);
    return [[x - tx, y - ty], [x + tx, y + ty]];
  }
  const ch = chainOf(P, p.piece);
  const v = p.vertex;
  const before = v > 0 ? ch.first + v - 1 : ch.cyclic ? ch.first + ch.count - 1 : -1;
  const after = v < ch.count ? ch.first + v : ch.cyclic ? ch.first : -1;
  return [before >= 0 ? getPieceEndProbe(buf, before, true) : null, after >= 0 ? getPieceEndProbe(buf, after, false) : null];
}

/** Second-order probe: a point on the curve a little way along the branch (for tangent branches). */
function getFarProbes(P: Pieces, p: Place): [[number, number] | null, [number, number] | null] {
  const ch = chainOf(P, p.piece);
  const step = 1e-3;
  if (p.vertex < 0) return [getPiecePoint(P.buf, p.piece, Math.max(0, p.u - step)), getPiecePoint(P.buf, p.piece, Math.min(1, p.u + step))];
  const v = p.vertex;
  const before = v > 0 ? ch.first + v - 1 : ch.cyclic ? ch.first + ch.count - 1 : -1;
  const after = v < ch.count ? ch.first + v : ch.cyclic ? ch.first : -1;
  return [before >= 0 ? getPiecePoint(P.buf, before, 1 - step) : null, after >= 0 ? getPiecePoint(P.buf, after, step) : null];
}

/** Side of x relative to the wedge swept counter-clockwise from a1 to a2 around c: +1 in, −1 out, 0 on a ray. */
function wedgeSide(c: [number, number], a1: [number, number], a2: [number, number], x: [number, number]): number {
  const o = (p: [number, number], q: [number, number]) => ccw(c[0], c[1], p[0], p[1], q[0], q[1]);
  const dot = (p: [number, number], q: [number, number]) => (p[0] - c[0]) * (q[0] - c[0]) + (p[1] - c[1]) * (q[1] - c[1]);
  if ((o(a1, x) === 0 && dot(a1, x) > 0) || (o(a2, x) === 0 && dot(a2, x) > 0)) return 0;
  const s = o(a1, a2);
  if (s > 0) return o(a1, x) > 0 && o(x, a2) > 0 ? 1 : -1;
  if (s < 0) return o(a2, x) > 0 && o(x, a1) > 0 ? -1 : 1;
  if (dot(a1, a2) < 0) return o(a1, x) > 0 ? 1 : -1;
  return 0; // the first pass doubles back on itself here
}

function classify(P: Pieces, a: Place, b: Place, x: number, y: number): 'crossing' | 'touch' {
  for (const far of [false, true]) {
    const [a1, a2] = far ? getFarProbes(P, a) : getProbes(P, a, x, y);
    const [b1, b2] = far ? getFarProbes(P, b) : getProbes(P, b, x, y);
    if (!a1 || !a2 || !b1 || !b2) return 'touch';
    const c: [number, number] = [x, y];
    const s1 = wedgeSide(c, a1, a2, b1), s2 = wedgeSide(c, a1, a2, b2);
    if (s1 !== 0 && s2 !== 0) return s1 !== s2 ? 'crossing' : 'touch';
  }
  return 'touch';
}

/** Where the spans of reported places are read, for contours whose segments are stored. */
const spanView = new SegmentView();

function toContourPlace(P: Pieces, contours: readonly Contour[], piece: number, u: number): ContourPlace {
  const o = piece * STRIDE;
  const ci = P.contourOf[piece]!;
  const seg = P.buf[o + 1]!;
  const c = contours[ci]!;
  return {
    contour: ci,
    segment: seg,
    t: P.buf[o + 2]! + u * (P.buf[o + 3]! - P.buf[o + 2]!),
    span: seg >= 0 ? getSegmentAt(c, seg, spanView).span : c.endSpan,
  };
}

/** Is the place inside a recorded overlap of its piece (or, for a vertex, of a piece meeting there)? */
function isCovered(P: Pieces, cover: Map<number, [number, number][]>, p: Place, tol: number): boolean {
  const test = (piece: number, u: number) => (cover.get(piece) ?? []).some(([lo, hi]) => u >= lo - tol && u <= hi + tol);
  if (p.vertex < 0) return test(p.piece, p.u);
  const ch = chainOf(P, p.piece);
  const v = p.vertex;
  const before = v > 0 ? ch.first + v - 1 : ch.cyclic ? ch.first + ch.count - 1 : -1;
  const after = v < ch.count ? ch.first + v : ch.cyclic ? ch.first : -1;
  return (before >= 0 && test(before, 1)) || (after >= 0 && test(after, 0));
}

function spanUnion(a: SourceSpan, b: SourceSpan): SourceSpan {
  return { start: Math.min(a.start, b.start), end: Math.max(a.end, b.end) };
}

/** The piece `step` (−1, 0 or 1) places along piece p's chain, the first piece of a cyclic chain following its last; −1 past an open chain's end. */
function getChainNeighbour(P: Pieces, p: number, step: number): number {
  const ch = chainOf(P, p);
  const k = p - ch.first + step;
  if (k >= 0 && k < ch.count) return ch.first + k;
  return ch.cyclic ? ch.first + ((k + ch.count) % ch.count) : -1;
}

/**
 * Groups the overlap records into runs. Two records are in one run when their pieces are the same or
 * neighbours on both sides, the last and first pieces of a cyclic chain being neighbours like any
 * others: so the runs found for a stretch cut twice do not depend on where either contour starts or
 * which way it runs. A run is a connected group, walked depth first from its first record in the
 * order (contour pair, pieces), with a hash of the records by piece pair: O(r) lookups for r
 * records, plus a sort per run.
 * Within one contour a record's pieces are an unordered pair (recorded lower index first): the walk
 * reads each record it reaches with the piece next to the previous record's side-a piece as its side
 * a, so that side a of a run crossing the chain's start stays one stretch; it steps forward along
 * side a first, so that a contour drawn round twice has its first round as side a.
 */
function mergeOverlaps(P: Pieces, contours: readonly Contour[], raw: RawOverlap[]): Overlap[] {
  const key = (r: RawOverlap) => [P.contourOf[r.pa]!, P.contourOf[r.pb]!, r.pa, r.pb];
  raw.sort((p, q) => {
    const a = key(p), b = key(q);
    return a[0]! - b[0]! || a[1]! - b[1]! || a[2]! - b[2]! || a[3]! - b[3]!;
  });
  const byPieces = new Map<number, number>();
  for (let k = 0; k < raw.length; k++) byPieces.set(raw[k]!.pa * P.count + raw[k]!.pb, k);
  // Per record: −1 not reached yet, 0 read as recorded, 1 read with its pieces swapped.
  const swapped = new Int8Array(raw.length).fill(-1);
  const out: Overlap[] = [];
  const run: number[] = [];
  const stack: number[] = []; // record, reading
  for (let root = 0; root < raw.length; root++) {
    if (swapped[root] !== -1) continue;
    run.length = 0;
    stack.push(root, 0);
    while (stack.length > 0) {
      const reading = stack.pop()!, k = stack.pop()!;
      if (swapped[k] !== -1) continue;
      swapped[k] = reading;
      run.push(k);
      const r = raw[k]!;
      const p = reading ? r.pb : r.pa, q = reading ? r.pa : r.pb;
      for (let dp = -1; dp <= 1; dp++) { // the forward step last, so that it is popped first
        const p2 = getChainNeighbour(P, p, dp);
        if (p2 < 0) continue;
        for (let dq = -1; dq <= 1; dq++) {
          const q2 = getChainNeighbour(P, q, dq);
          if (q2 < 0 || q2 === p2) continue;
          const m = byPieces.get(Math.min(p2, q2) * P.count + Math.max(p2, q2));
          if (m !== undefined && swapped[m] === -1) stack.push(m, raw[m]!.pa === p2 ? 0 : 1);
        }
      }
    }
    out.push(toOverlap(P, contours, raw, run, swapped));
  }
  return out;
}

/** The overlap of one run of records, each read with its pieces swapped where `swapped` says (sorts `run`). */
function toOverlap(P: Pieces, contours: readonly Contour[], raw: readonly RawOverlap[], run: number[], swapped: Int8Array): Overlap {
  const pieceA = (k: number) => (swapped[k] ? raw[k]!.pb : raw[k]!.pa);
  const pieceB = (k: number) => (swapped[k] ? raw[k]!.pa : raw[k]!.pb);
  const fromA = (k: number) => (swapped[k] ? raw[k]!.b0 : raw[k]!.a0);
  run.sort((k, m) => pieceA(k) - pieceA(m) || fromA(k) - fromA(m));
  // The run starts after the widest gap between its side-a pieces. On a cyclic chain that may be the
  // gap across the chain's start, which wins ties: a run round the whole loop starts where side a does.
  const ch = chainOf(P, pieceA(run[0]!));
  let head = 0;
  let widest = ch.cyclic ? pieceA(run[0]!) + ch.count - pieceA(run[run.length - 1]!) : Infinity;
  for (let i = 1; i < run.length; i++) {
    const gap = pieceA(run[i]!) - pieceA(run[i - 1]!);
    if (gap > widest) {
      widest = gap;
      head = i;
    }
  }
  const first = run[head]!, last = run[(head + run.length - 1) % run.length]!;
  const side = (piece: (k: number) => number) => {
    const ci = P.contourOf[piece(first)]!;
    const c = contours[ci]!;
    const segment = (k: number) => P.buf[piece(k) * STRIDE + 1]!;
    const spans = run.map((k) => (segment(k) >= 0 ? getSegmentAt(c, segment(k), spanView).span : c.endSpan));
    return { contour: ci, firstSegment: segment(first), lastSegment: segment(last), span: spans.reduce(spanUnion) };
  };
  let length = 0;
  for (const k of run) length += raw[k]!.length;
  const [x, y] = getPiecePoint(P.buf, pieceA(first), fromA(first));
  return { a: side(pieceA), b: side(pieceB), length, x, y };
}

/**
 * Line piece `a` ends exactly where line piece `b` starts and b does not double back over a: two
 * lines through their common joint meet nowhere else, and the joint itself is no intersection, so
 * the narrow phase would find only that point and drop it. Exact: orient2d, and for collinear
 * pieces coordinate comparisons along a's dominant axis (as collinearLines).
 */
function linesMeetOnlyAtJoint(buf: Float64Array, a: number, b: number): boolean {
  const o = a * STRIDE, q = b * STRIDE;
  const px = buf[o + 4]!, py = buf[o + 5]!, jx = buf[o + 6]!, jy = buf[o + 7]!, sx = buf[q + 6]!, sy = buf[q + 7]!;
  if (jx !== buf[q + 4] || jy !== buf[q + 5] || (px === jx && py === jy)) return false;
  if (ccw(px, py, jx, jy, sx, sy) !== 0) return true;
  return Math.abs(jx - px) >= Math.abs(jy - py) ? (px < jx ? jx < sx : sx < jx) : (py < jy ? jy < sy : sy < jy);
}

/** Monotone neighbours whose boxes meet in a zero-area region can share only their common end. */
function boxesOverlapWithArea(buf: Float64Array, i: number, j: number): boolean {
  const o = i * STRIDE, q = j * STRIDE;
  const w = Math.min(Math.max(buf[o + 4]!, buf[o + 6]!), Math.max(buf[q + 4]!, buf[q + 6]!))
    - Math.max(Math.min(buf[o + 4]!, buf[o + 6]!), Math.min(buf[q + 4]!, buf[q + 6]!));
  const h = Math.min(Math.max(buf[o + 5]!, buf[o + 7]!), Math.max(buf[q + 5]!, buf[q + 7]!))
    - Math.max(Math.min(buf[o + 5]!, buf[o + 7]!), Math.min(buf[q + 5]!, buf[q + 7]!));
  return w > 0 && h > 0;
}

/** Bounding-box diagonal of all contours' pieces, the size that `eps` is relative to. */
function getSize(P: Pieces): number {
  const [a, b, c, d] = P.bbox;
  return P.count > 0 ? getVectorLength(c - a, d - b) : 0;
}

/**
 * All intersections and overlaps among the given contours: within each contour and between
 * different ones (see the options). Touching ends of consecutive segments are not reported.
 */
export function findIntersections(contours: readonly Contour[], options: IntersectOptions = {}): IntersectionResult {
  const across = options.acrossContours ?? true;
  const within = options.withinContours ?? true;
  const reuse = options.reuseBuffers ?? false;
  const provisional = buildPieces(contours, 0, { reuse });
  const size = getSize(provisional);
  const eps = Math.max(RELATIVE_POINT_TOLERANCE * size, Number.MIN_VALUE);
  // Rebuild only when some segment or closing gap is within eps (it is then dropped as a point).
  let P = provisional;
  if (provisional.minKeptExtent <= eps) {
    if (reuse) releasePieces(provisional);
    P = buildPieces(contours, eps, { reuse });
  }
  const col = new Collector(P, eps);
  const result = { intersections: [] as Intersection[], overlaps: [] as Overlap[], unresolved: [] as UnresolvedPair[], eps, stopped: null as SearchStop | null };
  if (P.count < 2) {
    if (reuse) releasePieces(P);
    return result;
  }
  const buf = P.buf;
  const keep = (i: number, j: number): boolean => {
    const ci = P.contourOf[i]!, cj = P.contourOf[j]!;
    if (ci === cj ? !within : !across) return false;
    if (ci !== cj) return true;
    const ch = P.chains[ci]!;
    const adjacent = j === i + 1 || (ch.cyclic && i === ch.first && j === ch.first + ch.count - 1 && ch.count > 2);
    if (!adjacent) return true;
    if (buf[i * STRIDE] === KIND_LINE && buf[j * STRIDE] === KIND_LINE) {
      return !(j === i + 1 ? linesMeetOnlyAtJoint(buf, i, j) : linesMeetOnlyAtJoint(buf, j, i));
    }
    return boxesOverlapWithArea(buf, i, j);
  };
  const pairs = findPiecePairs(P, eps, keep, { isCancelled: options.isCancelled, maxPairs: MAX_PIECE_PAIRS });
  if (pairs.length / 2 > MAX_PIECE_PAIRS) result.stopped = { reason: 'pairs', limit: MAX_PIECE_PAIRS };
  for (let p = 0; 2 * p < pairs.length; p++) {
    if (p % NARROW_POLL_EVERY === NARROW_POLL_EVERY - 1 && options.isCancelled?.()) break;
    if (col.hits.length + col.overlaps.length > MAX_MEETINGS) {
      result.stopped ??= { reason: 'meetings', limit: MAX_MEETINGS };
      break;
    }
    narrow(col, pairs[2 * p]!, pairs[2 * p + 1]!);
  }

  // Overlap coverage, to drop the touches found at the ends of overlapping runs.
  const cover = new Map<number, [number, number][]>();
  const addCover = (piece: number, lo: number, hi: number) => {
    const list = cover.get(piece) ?? [];
    list.push([lo, hi]);
    cover.set(piece, list);
  };
  for (const r of col.overlaps) {
    addCover(r.pa, r.a0, r.a1);
    addCover(r.pb, r.b0, r.b1);
  }

  const seen = new Map<string, { x: number; y: number }[]>();
  const mergeTol = Math.max(1e3 * eps, 0);
  for (const h of col.hits) {
    const a = toPlace(P, h.pa, h.ua, h.x, h.y, eps);
    const b = toPlace(P, h.pb, h.ub, h.x, h.y, eps);
    const ka = placeKey(P, a), kb = placeKey(P, b);
    if (ka === kb) continue; // the shared end of neighbours, or the same point found twice
    if (cover.size > 0 && isCovered(P, cover, a, 1e-9) && isCovered(P, cover, b, 1e-9)) continue;
    const key = ka < kb ? `${ka}|${kb}` : `${kb}|${ka}`;
    const prev = seen.get(key) ?? [];
    if (prev.some((p) => getVectorLength(p.x - h.x, p.y - h.y) <= mergeTol)) continue;
    prev.push({ x: h.x, y: h.y });
    seen.set(key, prev);
    const kind = h.transversal ? 'crossing' : classify(P, a, b, h.x, h.y);
    const first = h.pa < h.pb;
    const pa = toContourPlace(P, contours, first ? a.piece : b.piece, first ? a.u : b.u);
    const pb = toContourPlace(P, contours, first ? b.piece : a.piece, first ? b.u : a.u);
    result.intersections.push({ kind, x: h.x, y: h.y, a: pa, b: pb });
  }
  result.intersections.sort((p, q) => p.a.contour - q.a.contour || p.a.segment - q.a.segment || p.a.t - q.a.t);
  result.overlaps = mergeOverlaps(P, contours, col.overlaps);
  result.unresolved = col.unresolved.map((u) => ({ x: u.x, y: u.y, a: toContourPlace(P, contours, u.pa, 0.5), b: toContourPlace(P, contours, u.pb, 0.5) }));
  if (reuse) releasePieces(P);
  return result;
}

/** Self-intersections and overlaps of one contour. */
export function findSelfIntersections(contour: Contour, options: Omit<IntersectOptions, 'acrossContours' | 'withinContours'> = {}): IntersectionResult {
  return findIntersections([contour], { ...options, acrossContours: false });
}

/** Crossings, touches and overlaps between different contours only. */
export function findContourCrossings(contours: readonly Contour[], options: Omit<IntersectOptions, 'acrossContours' | 'withinContours'> = {}): IntersectionResult {
  return findIntersections(contours, { ...options, withinContours: false });
}
