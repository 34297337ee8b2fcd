/**
 * The monotone pieces of one segment, written into a small reusable buffer in the layout of
 * intersectPieces.ts (STRIDE numbers per piece), for flattening huge contours without building the
 * file-wide piece buffer. The cuts and the split points are those `buildPieces` computes for the
 * segment with `pointTol` = 0, by the same floating-point operations in the same order, so the
 * pieces are identical to the last bit (checked against `buildPieces` in segmentPieces.test.ts).
 * Fields o+1..o+3 (segment index, parameter range) are not written: flattening does not read them.
 */
import type { Segment } from '../types';
import { KIND_ARC, KIND_CUBIC, KIND_LINE, KIND_QUAD, splitCubic, splitQuad, STRIDE } from './intersectPieces';
import { addQuadraticRootsInUnitInterval } from './intersectRoots';

/** Most pieces of one segment: a cubic has at most 4 cuts; an arc of |sweep| ≤ 2π at most 2 per
 *  quarter turn and axis, and 9 per axis from the search window of `addArcCuts`. */
const MAX_SEGMENT_PIECES = 20;

/** Reusable output of `writeSegmentPieces`. */
export const SEGMENT_PIECES = new Float64Array(STRIDE * MAX_SEGMENT_PIECES);

/** The segment's cut parameters, cuts[0..cutCount). */
const cuts = new Float64Array(MAX_SEGMENT_PIECES);
let cutCount = 0;
/** The part of the Bézier being cut that is still to be split (cubic, quadratic). */
const cubicRest = new Float64Array(8), quadRest = new Float64Array(6);

/** Roots found so far; only appended to (emptied when long), so no call allocates. */
const roots: number[] = [];

/** Adds the roots in (0, 1) of c0 + c1·t + c2·t² (one coordinate of a Bézier derivative). */
function addDerivativeRoots(c0: number, c1: number, c2: number): void {
  if (roots.length > 1000) roots.length = 0;
  const from = roots.length;
  addQuadraticRootsInUnitInterval(roots, c0, c1, c2);
  for (let k = from; k < roots.length; k++) if (roots[k]! > 0 && roots[k]! < 1) cuts[cutCount++] = roots[k]!;
}

/** Sorts the cuts and drops values within 1e-12 of the one kept before them. */
function sortCuts(): void {
  for (let k = 1; k < cutCount; k++) {
    const t = cuts[k]!;
    let m = k;
    for (; m > 0 && cuts[m - 1]! > t; m--) cuts[m] = cuts[m - 1]!;
    cuts[m] = t;
  }
  let n = Math.min(1, cutCount);
  for (let k = 1; k < cutCount; k++) if (cuts[k]! - cuts[n - 1]! > 1e-12) cuts[n++] = cuts[k]!;
  cutCount = n;
}

/**
 * Whether every control point of `s` equals its start (buildPieces' control extent ≤ 0): such a
 * segment is a single point and gets no piece. For an arc whose ends differ the extent is positive
 * whatever its radius term, so that term's square roots are skipped.
 */
function isSinglePoint(s: Segment): boolean {
  const x0 = s.x0, y0 = s.y0;
  switch (s.kind) {
    case 'arc': {
      if (Math.max(Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)) > 0) return false;
      const r = Math.max(Math.hypot(s.ux, s.uy), Math.hypot(s.vx, s.vy));
      return Math.max(Math.abs(s.x1 - x0), Math.abs(s.y1 - y0), r * Math.abs(s.sweep)) <= 0;
    }
    case 'line':
      return Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)) <= 0;
    case 'quad':
      return Math.max(Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)), Math.abs(s.x2 - x0), Math.abs(s.y2 - y0)) <= 0;
    case 'cubic':
      return Math.max(
        Math.max(Math.max(0, Math.abs(s.x1 - x0), Math.abs(s.y1 - y0)), Math.abs(s.x2 - x0), Math.abs(s.y2 - y0)),
        Math.abs(s.x3 - x0), Math.abs(s.y3 - y0),
      ) <= 0;
  }
}

/** Writes a line piece at piece position k. */
function writeLinePiece(k: number, x0: number, y0: number, x1: number, y1: number): void {
  const b = SEGMENT_PIECES, o = k * STRIDE;
  b[o] = KIND_LINE;
  b[o + 4] = x0; b[o + 5] = y0; b[o + 6] = x1; b[o + 7] = y1;
}

function writeBezierPiece(k: number, kind: number, p: ArrayLike<number>): void {
  const b = SEGMENT_PIECES, o = k * STRIDE, n = p.length;
  b[o] = kind;
  b[o + 4] = p[0]!; b[o + 5] = p[1]!; b[o + 6] = p[n - 2]!; b[o + 7] = p[n - 1]!;
  for (let j = 2; j < n - 2; j++) b[o + 6 + j] = p[j]!;
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

function writeBezier(s: Segment & { kind: 'quad' | 'cubic' }): number {
  const cubic = s.kind === 'cubic';
  if (s.kind === 'cubic') {
    if (isStrictlyMonotone(s.x1 - s.x0, s.x2 - s.x1, s.x3 - s.x2) && isStrictlyMonotone(s.y1 - s.y0, s.y2 - s.y1, s.y3 - s.y2)) {
      const b = SEGMENT_PIECES;
      b[0] = KIND_CUBIC;
      b[4] = s.x0; b[5] = s.y0; b[6] = s.x3; b[7] = s.y3; b[8] = s.x1; b[9] = s.y1; b[10] = s.x2; b[11] = s.y2;
      return 1;
    }
    let a = s.x1 - s.x0, b = s.x2 - s.x1, c = s.x3 - s.x2;
    addDerivativeRoots(a, 2 * (b - a), a - 2 * b + c);
    a = s.y1 - s.y0; b = s.y2 - s.y1; c = s.y3 - s.y2;
    addDerivativeRoots(a, 2 * (b - a), a - 2 * b + c);
  } else {
    addDerivativeRoots(s.x1 - s.x0, s.x0 - 2 * s.x1 + s.x2, 0);
    addDerivativeRoots(s.y1 - s.y0, s.y0 - 2 * s.y1 + s.y2, 0);
  }
  sortCuts();
  const kind = cubic ? KIND_CUBIC : KIND_QUAD;
  const r = cubic ? cubicRest : quadRest;
  r[0] = s.x0; r[1] = s.y0; r[2] = s.x1; r[3] = s.y1; r[4] = s.x2; r[5] = s.y2;
  if (s.kind === 'cubic') { r[6] = s.x3; r[7] = s.y3; }
  let t0 = 0;
  for (let k = 0; k < cutCount; k++) {
    const t = cuts[k]!;
    const [left, right] = cubic ? splitCubic(r, (t - t0) / (1 - t0)) : splitQuad(r, (t - t0) / (1 - t0));
    writeBezierPiece(k, kind, left);
    r.set(right);
    t0 = t;
  }
  writeBezierPiece(cutCount, kind, r);
  return cutCount + 1;
}

/** The last semi-diameters seen by `writeArc` and the angles where x′ and y′ vanish for them: the
 *  arcs of one drawing often share their semi-diameters, and atan2 is a large part of an arc's cost. */
const lastTurns = { ux: Number.NaN, uy: 0, vx: 0, vy: 0, x: 0, y: 0 };

function writeArc(s: Segment & { kind: 'arc' }): number {
  const { ux, uy, vx, vy, theta0, sweep } = s;
  const turns = lastTurns;
  // Object.is: atan2 tells −0 from +0.
  if (!(Object.is(ux, turns.ux) && Object.is(uy, turns.uy) && Object.is(vx, turns.vx) && Object.is(vy, turns.vy))) {
    turns.ux = ux; turns.uy = uy; turns.vx = vx; turns.vy = vy;
    turns.x = Math.atan2(vx, ux); turns.y = Math.atan2(vy, uy);
  }
  for (let axis = 0; axis < 2; axis++) {
    const base = axis === 0 ? turns.x : turns.y;
    for (let k = -4; k <= 4; k++) {
      const f = (base + k * Math.PI - theta0) / sweep;
      if (f > 1e-12 && f < 1 - 1e-12) cuts[cutCount++] = f;
    }
  }
  sortCuts();
  const to = cutCount;
  let prevF = 0;
  let px = s.x0, py = s.y0;
  for (let k = 0; k <= to; k++) {
    const f = k < to ? cuts[k]! : 1;
    const th = theta0 + f * sweep;
    const ex = k < to ? s.cx + ux * Math.cos(th) + vx * Math.sin(th) : s.x1;
    const ey = k < to ? s.cy + uy * Math.cos(th) + vy * Math.sin(th) : s.y1;
    const b = SEGMENT_PIECES, o = k * STRIDE;
    b[o] = KIND_ARC;
    b[o + 4] = px; b[o + 5] = py; b[o + 6] = ex; b[o + 7] = ey;
    b[o + 8] = s.cx; b[o + 9] = s.cy; b[o + 10] = ux; b[o + 11] = uy; b[o + 12] = vx; b[o + 13] = vy;
    b[o + 14] = theta0 + prevF * sweep;
    b[o + 15] = th;
    prevF = f;
    px = ex;
    py = ey;
  }
  return to + 1;
}

/**
 * Writes the monotone pieces of `s` into SEGMENT_PIECES (from position 0) and returns how many:
 * 0 for a segment whose control points all equal its start (buildPieces leaves those out).
 */
export function writeSegmentPieces(s: Segment): number {
  if (isSinglePoint(s)) return 0;
  cutCount = 0;
  switch (s.kind) {
    case 'line':
      writeLinePiece(0, s.x0, s.y0, s.x1, s.y1);
      return 1;
    case 'quad': case 'cubic':
      return writeBezier(s);
    case 'arc':
      if (Math.abs(s.ux * s.vy - s.uy * s.vx) === 0) { writeLinePiece(0, s.x0, s.y0, s.x1, s.y1); return 1; }
      return writeArc(s);
  }
}
