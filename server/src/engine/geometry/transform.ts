import type { Segment } from '../types';

/**
 * A 2D affine map as the six numbers of SVG's `matrix(a b c d e f)`:
 * x′ = a·x + c·y + e, y′ = b·x + d·y + f (SVG 1.1 §7.15.3 / §7.6; REFERENCES §5.7).
 */
export type Matrix = readonly [a: number, b: number, c: number, d: number, e: number, f: number];

export const IDENTITY_MATRIX: Matrix = [1, 0, 0, 1, 0, 0];

/**
 * The product m1·m2: the map that applies m2 first, then m1. A transform list `M1 M2` and a parent's
 * CTM times a child's transform both compose this way (REFERENCES §5.7).
 */
export function multiplyMatrices(m1: Matrix, m2: Matrix): Matrix {
  const [a1, b1, c1, d1, e1, f1] = m1;
  const [a2, b2, c2, d2, e2, f2] = m2;
  return [
    a1 * a2 + c1 * b2,
    b1 * a2 + d1 * b2,
    a1 * c2 + c1 * d2,
    b1 * c2 + d1 * d2,
    a1 * e2 + c1 * f2 + e1,
    b1 * e2 + d1 * f2 + f1,
  ];
}

export function getTranslationMatrix(tx: number, ty: number): Matrix {
  return [1, 0, 0, 1, tx, ty];
}

export function getScalingMatrix(sx: number, sy: number): Matrix {
  return [sx, 0, 0, sy, 0, 0];
}

/** Determinant of the linear part; negative for a mirroring map, |det| is the area scale. */
export function getDeterminant(m: Matrix): number {
  return m[0] * m[3] - m[1] * m[2];
}

export function isIdentityMatrix(m: Matrix): boolean {
  return m[0] === 1 && m[1] === 0 && m[2] === 0 && m[3] === 1 && m[4] === 0 && m[5] === 0;
}

/** Image of the point (x, y). */
export function transformPoint(m: Matrix, x: number, y: number): [number, number] {
  return [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
}

/**
 * Image of a segment under an affine map, exact up to one rounding per coordinate:
 * Bézier curves are affine-invariant (map the control points); an `Arc` C + U·cos θ + V·sin θ maps to
 * M·C + (L·U)·cos θ + (L·V)·sin θ with L the linear part, so the centre maps as a point, U and V as
 * vectors, and θ0 and the sweep stay (types.ts, `Arc`). A mirroring map (det < 0) reverses the turning
 * sense of U→V, so the arc's direction on screen flips with no change to the sweep's sign.
 * The span is kept.
 */
export function transformSegment(seg: Segment, m: Matrix): Segment {
  const [a, b, c, d, e, f] = m;
  switch (seg.kind) {
    case 'line':
      return {
        kind: 'line',
        x0: a * seg.x0 + c * seg.y0 + e, y0: b * seg.x0 + d * seg.y0 + f,
        x1: a * seg.x1 + c * seg.y1 + e, y1: b * seg.x1 + d * seg.y1 + f,
        span: seg.span,
      };
    case 'quad':
      return {
        kind: 'quad',
        x0: a * seg.x0 + c * seg.y0 + e, y0: b * seg.x0 + d * seg.y0 + f,
        x1: a * seg.x1 + c * seg.y1 + e, y1: b * seg.x1 + d * seg.y1 + f,
        x2: a * seg.x2 + c * seg.y2 + e, y2: b * seg.x2 + d * seg.y2 + f,
        span: seg.span,
      };
    case 'cubic':
      return {
        kind: 'cubic',
        x0: a * seg.x0 + c * seg.y0 + e, y0: b * seg.x0 + d * seg.y0 + f,
        x1: a * seg.x1 + c * seg.y1 + e, y1: b * seg.x1 + d * seg.y1 + f,
        x2: a * seg.x2 + c * seg.y2 + e, y2: b * seg.x2 + d * seg.y2 + f,
        x3: a * seg.x3 + c * seg.y3 + e, y3: b * seg.x3 + d * seg.y3 + f,
        span: seg.span,
      };
    case 'arc':
      return {
        kind: 'arc',
        x0: a * seg.x0 + c * seg.y0 + e, y0: b * seg.x0 + d * seg.y0 + f,
        x1: a * seg.x1 + c * seg.y1 + e, y1: b * seg.x1 + d * seg.y1 + f,
        cx: a * seg.cx + c * seg.cy + e, cy: b * seg.cx + d * seg.cy + f,
        ux: a * seg.ux + c * seg.uy, uy: b * seg.ux + d * seg.uy,
        vx: a * seg.vx + c * seg.vy, vy: b * seg.vx + d * seg.vy,
        theta0: seg.theta0,
        sweep: seg.sweep,
        span: seg.span,
      };
  }
}

/** Images of all segments; the identity returns the same array (no copy of large paths). */
export function transformSegments(segments: readonly Segment[], m: Matrix): readonly Segment[] {
  if (isIdentityMatrix(m)) return segments;
  const out = new Array<Segment>(segments.length);
  for (let i = 0; i < segments.length; i++) out[i] = transformSegment(segments[i]!, m);
  return out;
}
