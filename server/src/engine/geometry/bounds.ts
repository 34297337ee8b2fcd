/**
 * Points, end points and exact bounding boxes of segments. A box is [minX, minY, maxX, maxY] of the
 * drawn curve itself: Bézier extrema come from the roots of the derivative, arc extrema from the
 * angles where x or y is extremal — never from control points (a control polygon's box is larger).
 */
import { getArcPoint } from './arc';
import { getVectorLength } from './length';
import type { Arc, Cubic, Quad, Segment } from '../types';

export type Box = [minX: number, minY: number, maxX: number, maxY: number];

/** Start point as stored (exact file values). */
export function getSegmentStart(s: Segment): [number, number] {
  return [s.x0, s.y0];
}

/** End point as stored (exact file values; for an arc the file's end point, not C + U cos + V sin). */
export function getSegmentEnd(s: Segment): [number, number] {
  switch (s.kind) {
    case 'line':
    case 'arc':
      return [s.x1, s.y1];
    case 'quad':
      return [s.x2, s.y2];
    case 'cubic':
      return [s.x3, s.y3];
  }
}

/**
 * Point at parameter t ∈ [0, 1]. Béziers in Bernstein form (exact at t = 0 and 1); lines by
 * interpolation; arcs at θ = theta0 + t·sweep (evaluated, so the ends may differ from the stored end
 * points by rounding — use getSegmentStart/End for those).
 */
export function getSegmentPoint(s: Segment, t: number): [number, number] {
  const u = 1 - t;
  switch (s.kind) {
    case 'line':
      return [u * s.x0 + t * s.x1, u * s.y0 + t * s.y1];
    case 'quad': {
      const b0 = u * u, b1 = 2 * u * t, b2 = t * t;
      return [b0 * s.x0 + b1 * s.x1 + b2 * s.x2, b0 * s.y0 + b1 * s.y1 + b2 * s.y2];
    }
    case 'cubic': {
      const b0 = u * u * u, b1 = 3 * u * u * t, b2 = 3 * u * t * t, b3 = t * t * t;
      return [
        b0 * s.x0 + b1 * s.x1 + b2 * s.x2 + b3 * s.x3,
        b0 * s.y0 + b1 * s.y1 + b2 * s.y2 + b3 * s.y3,
      ];
    }
    case 'arc':
      return getArcPoint(s, s.theta0 + t * s.sweep);
  }
}

/** True when angle θ lies on the arc's sweep from theta0 (ends included). */
function isAngleOnArc(a: Arc, theta: number): boolean {
  const turn = 2 * Math.PI;
  if (Math.abs(a.sweep) >= turn) return true;
  const offset = a.sweep >= 0 ? theta - a.theta0 : a.theta0 - theta;
  // ((offset % turn) + turn) % turn, with the remainders (exact, but a slow library call) taken only
  // where they change something: x % turn is x for |x| < turn, and s % turn is s − turn (exact) for
  // turn ≤ s < 2·turn.
  const shifted = (Math.abs(offset) < turn ? offset : offset % turn) + turn;
  const normalised = shifted < turn ? shifted : shifted < 2 * turn ? shifted - turn : shifted % turn;
  return normalised <= Math.abs(a.sweep);
}

/** Writes the arc's exact box into `box`. */
function setArcBounds(a: Arc, box: Box): void {
  box[0] = Math.min(a.x0, a.x1); box[1] = Math.min(a.y0, a.y1);
  box[2] = Math.max(a.x0, a.x1); box[3] = Math.max(a.y0, a.y1);
  // x(θ) = cx + ux cos θ + vx sin θ is largest, cx + √(ux² + vx²), at θ = atan2(vx, ux) and
  // smallest, cx − √(ux² + vx²), half a turn later; the same for y with (uy, vy).
  const rx = getVectorLength(a.ux, a.vx);
  const ry = getVectorLength(a.uy, a.vy);
  const thetaMaxX = Math.atan2(a.vx, a.ux);
  const thetaMaxY = Math.atan2(a.vy, a.uy);
  if (isAngleOnArc(a, thetaMaxX)) box[2] = Math.max(box[2], a.cx + rx);
  if (isAngleOnArc(a, thetaMaxX + Math.PI)) box[0] = Math.min(box[0], a.cx - rx);
  if (isAngleOnArc(a, thetaMaxY)) box[3] = Math.max(box[3], a.cy + ry);
  if (isAngleOnArc(a, thetaMaxY + Math.PI)) box[1] = Math.min(box[1], a.cy - ry);
}

/** Critical parameters of the last Bézier given to fillCriticalScratch (at most four), unsorted. */
const criticalScratch: number[] = [0, 0, 0, 0];

/**
 * Adds to the scratch list the candidate parameters in (0, 1) of one coordinate of a Bézier whose
 * derivative is a·t² + b·t + c (a = 0 for a quadratic): the real roots (where that coordinate is
 * extremal) and, when the discriminant is ≤ 0, the vertex −b/(2a) (where |derivative| is smallest — a
 * double root that rounding pushed off the real axis lands there). Roots by the cancellation-free
 * form q = −½(b + sign(b)√disc), t = q/a, c/q [src: Press et al., Numerical Recipes, 3rd ed. §5.6].
 */
function addDerivativeRoots(a: number, b: number, c: number, count: number): number {
  let r0: number, r1 = NaN;
  if (a === 0) {
    if (b === 0) return count;
    r0 = -c / b;
  } else {
    const disc = b * b - 4 * a * c;
    if (disc <= 0) {
      r0 = -b / (2 * a);
    } else {
      const q = -0.5 * (b + (b >= 0 ? 1 : -1) * Math.sqrt(disc));
      r0 = q / a;
      r1 = c / q; // disc > 0, so q ≠ 0
    }
  }
  if (r0 > 0 && r0 < 1) criticalScratch[count++] = r0;
  if (r1 > 0 && r1 < 1) criticalScratch[count++] = r1;
  return count;
}

/** Writes a quad's or cubic's critical parameters (x′ then y′, unsorted) to the scratch list and returns how many. */
function fillCriticalScratch(s: Quad | Cubic): number {
  if (s.kind === 'quad') {
    // B′/2 = (P1 − P0) + t·(P0 − 2P1 + P2)
    const count = addDerivativeRoots(0, s.x0 - 2 * s.x1 + s.x2, s.x1 - s.x0, 0);
    return addDerivativeRoots(0, s.y0 - 2 * s.y1 + s.y2, s.y1 - s.y0, count);
  }
  // B′/3 = (1−t)²d0 + 2(1−t)t·d1 + t²d2 = (d0 − 2d1 + d2)t² + 2(d1 − d0)t + d0, d_i = P_{i+1} − P_i
  const dx0 = s.x1 - s.x0, dx1 = s.x2 - s.x1, dx2 = s.x3 - s.x2;
  const dy0 = s.y1 - s.y0, dy1 = s.y2 - s.y1, dy2 = s.y3 - s.y2;
  const count = addDerivativeRoots(dx0 - 2 * dx1 + dx2, 2 * (dx1 - dx0), dx0, 0);
  return addDerivativeRoots(dy0 - 2 * dy1 + dy2, 2 * (dy1 - dy0), dy0, count);
}

/**
 * Parameters t ∈ (0, 1), sorted and distinct, where x′(t) = 0 or y′(t) = 0 for a quad or cubic, plus
 * the vertices described at addDerivativeRoots. They contain the coordinate extrema and every cusp
 * (B′(t) = 0 is a common root of x′ and y′); a near-cusp lies between the x′ and y′ roots. Empty for
 * lines and arcs.
 */
export function getBezierCriticalParameters(s: Segment): number[] {
  if (s.kind !== 'quad' && s.kind !== 'cubic') return [];
  return criticalScratch
    .slice(0, fillCriticalScratch(s))
    .sort((p, q) => p - q)
    .filter((t, i, all) => i === 0 || t !== all[i - 1]);
}

/**
 * Writes a quad's or cubic's exact box into `box`: the end points, then the curve at each critical
 * parameter in increasing order (getBezierCriticalParameters, with no arrays made).
 */
function setBezierBounds(s: Quad | Cubic, box: Box): void {
  const ex = s.kind === 'quad' ? s.x2 : s.x3, ey = s.kind === 'quad' ? s.y2 : s.y3;
  const count = fillCriticalScratch(s);
  box[0] = Math.min(s.x0, ex); box[1] = Math.min(s.y0, ey);
  box[2] = Math.max(s.x0, ex); box[3] = Math.max(s.y0, ey);
  const ts = criticalScratch;
  for (let i = 1; i < count; i++) {
    const t = ts[i]!;
    let j = i - 1;
    while (j >= 0 && ts[j]! > t) {
      ts[j + 1] = ts[j]!;
      j--;
    }
    ts[j + 1] = t;
  }
  for (let i = 0; i < count; i++) {
    const t = ts[i]!;
    const u = 1 - t;
    let x: number, y: number;
    if (s.kind === 'quad') {
      const b0 = u * u, b1 = 2 * u * t, b2 = t * t;
      x = b0 * s.x0 + b1 * s.x1 + b2 * s.x2;
      y = b0 * s.y0 + b1 * s.y1 + b2 * s.y2;
    } else {
      const b0 = u * u * u, b1 = 3 * u * u * t, b2 = 3 * u * t * t, b3 = t * t * t;
      x = b0 * s.x0 + b1 * s.x1 + b2 * s.x2 + b3 * s.x3;
      y = b0 * s.y0 + b1 * s.y1 + b2 * s.y2 + b3 * s.y3;
    }
    if (x < box[0]) box[0] = x;
    if (y < box[1]) box[1] = y;
    if (x > box[2]) box[2] = x;
    if (y > box[3]) box[3] = y;
  }
}

/**
 * Writes the exact bounding box [minX, minY, maxX, maxY] of a segment into `box` (see
 * getSegmentBounds); for callers that box many segments without making an array for each.
 */
export function setSegmentBounds(s: Segment, box: Box): void {
  switch (s.kind) {
    case 'line':
      box[0] = Math.min(s.x0, s.x1); box[1] = Math.min(s.y0, s.y1);
      box[2] = Math.max(s.x0, s.x1); box[3] = Math.max(s.y0, s.y1);
      return;
    case 'arc':
      setArcBounds(s, box);
      return;
    default:
      setBezierBounds(s, box);
  }
}

/**
 * Exact bounding box [minX, minY, maxX, maxY] of a segment: its end points plus the curve at its
 * critical parameters (Béziers) or its extremal angles (arcs). Critical parameters carry the
 * rounding of a quadratic's roots, so a box edge may sit a few ulps inside the true extremum.
 */
export function getSegmentBounds(s: Segment): Box {
  const box: Box = [0, 0, 0, 0];
  setSegmentBounds(s, box);
  return box;
}
