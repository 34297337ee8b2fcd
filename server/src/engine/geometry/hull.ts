/**
 * Convex hull of a contour and the contour as a polyline with a stated deviation bound (used by
 * roundness.ts and by the Banchoff–Pohl integral).
 *
 * Flattening: lines are kept exactly; a Bézier piece gets m chords with m from Wang's formula
 * m ≥ √(d(d−1)·M/(8δ)) (REFERENCES.md §4.6), an arc piece m chords with sagitta r(1 − cos(Δθ/2m)) ≤ δ
 * (r = the larger semi-diameter). Every curve point is then within δ of the polyline and vice versa.
 * Hull: Andrew's monotone chain with exact orient2d turns [src: Andrew, Inf. Process. Lett. 9 (1979)
 * 216–219 — from memory; de Berg et al. 2008 §1.1].
 */
import { orient2d } from 'robust-predicates';
import type { Contour } from '../types';
import { buildPieces, getPiecePoint, KIND_ARC, KIND_LINE, KIND_QUAD, STRIDE } from './intersectPieces';

export interface Polyline {
  /** Vertices in drawing order; the loop closes from the last back to the first. */
  readonly points: readonly (readonly [number, number])[];
  /** Largest distance between the contour and the polyline (0 when the contour has only lines). */
  readonly deviationMm: number;
  /** The contour's monotone pieces in order, each with its chords' first vertex in `points`. */
  readonly pieces: readonly PolylinePiece[];
}

export interface PolylinePiece {
  /** Index in `points` of the piece's start; its chords run to the next piece's start (cyclic). */
  readonly first: number;
  /** For an arc whose ellipse is a circle within the flattening tolerance: that circle, with
   *  `deviationMm` the largest distance between the arc and it (half the semi-axes' difference). */
  readonly circle: { readonly cx: number; readonly cy: number; readonly r: number; readonly deviationMm: number } | null;
  /** Largest distance between the piece and its chords. */
  readonly deviationMm: number;
}

/** Most chords for one curved piece: bounds the work on huge curves (the bound δ is then raised and reported). */
const MAX_CHORDS_PER_PIECE = 4096;

/** The contour as a closed polyline within `toleranceMm` of it (see the module comment). */
export function getContourPolyline(contour: Contour, toleranceMm: number): Polyline {
  const P = buildPieces([{ ...contour, closed: true }], 0);
  const b = P.buf;
  const pts: [number, number][] = [];
  const pieces: PolylinePiece[] = [];
  let deviation = 0;
  for (let i = 0; i < P.count; i++) {
    const o = i * STRIDE;
    const kind = b[o]!;
    let m = 1;
    let pieceDeviation = 0;
    let circle: PolylinePiece['circle'] = null;
    if (kind !== KIND_LINE) {
      if (kind === KIND_ARC) {
        const ux = b[o + 10]!, uy = b[o + 11]!, vx = b[o + 12]!, vy = b[o + 13]!;
        // Semi-axes a ≥ b: square roots of the eigenvalues of the Gram matrix of U and V.
        const uu = ux * ux + uy * uy, vv = vx * vx + vy * vy, uv = ux * vx + uy * vy;
        const root = Math.hypot((uu - vv) / 2, uv);
        const a = Math.sqrt((uu + vv) / 2 + root), bMinor = Math.sqrt(Math.max(0, (uu + vv) / 2 - root));
        if (a - bMinor <= toleranceMm) circle = { cx: b[o + 8]!, cy: b[o + 9]!, r: (a + bMinor) / 2, deviationMm: (a - bMinor) / 2 };
        const r = a;
        const dth = Math.abs(b[o + 15]! - b[o + 14]!);
        const half = toleranceMm >= r ? Math.PI : Math.acos(1 - toleranceMm / r);
        m = Math.max(1, Math.ceil(dth / (2 * half)));
        if (m > MAX_CHORDS_PER_PIECE) m = MAX_CHORDS_PER_PIECE;
        pieceDeviation = r * (1 - Math.cos(dth / (2 * m)));
      } else {
        const cps = kind === KIND_QUAD
          ? [b[o + 4]!, b[o + 5]!, b[o + 8]!, b[o + 9]!, b[o + 6]!, b[o + 7]!]
          : [b[o + 4]!, b[o + 5]!, b[o + 8]!, b[o + 9]!, b[o + 10]!, b[o + 11]!, b[o + 6]!, b[o + 7]!];
        const d = cps.length / 2 - 1;
        let M = 0;
        for (let k = 0; k + 4 < cps.length; k += 2) {
          M = Math.max(M, Math.hypot(cps[k]! - 2 * cps[k + 2]! + cps[k + 4]!, cps[k + 1]! - 2 * cps[k + 3]! + cps[k + 5]!));
        }
        m = Math.max(1, Math.ceil(Math.sqrt((d * (d - 1) * M) / (8 * toleranceMm))));
        if (m > MAX_CHORDS_PER_PIECE) m = MAX_CHORDS_PER_PIECE;
        pieceDeviation = (d * (d - 1) * M) / (8 * m * m);
      }
    }
    deviation = Math.max(deviation, pieceDeviation);
    pieces.push({ first: pts.length, circle, deviationMm: pieceDeviation });
    for (let k = 0; k < m; k++) pts.push(getPiecePoint(b, i, k / m));
  }
  return { points: pts, deviationMm: deviation, pieces };
}

/** Convex hull, counter-clockwise in y-up axes, no collinear vertices. */
export function getConvexHull(points: readonly (readonly [number, number])[]): [number, number][] {
  const p = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p.map(([x, y]) => [x, y]);
  // orient2d < 0 ⇔ counter-clockwise in y-up axes (REFERENCES.md §7.2).
  const turnsLeft = (a: readonly number[], b: readonly number[], c: readonly number[]) => orient2d(a[0]!, a[1]!, b[0]!, b[1]!, c[0]!, c[1]!) < 0;
  const lower: (readonly [number, number])[] = [];
  for (const q of p) {
    while (lower.length >= 2 && !turnsLeft(lower[lower.length - 2]!, lower[lower.length - 1]!, q)) lower.pop();
    lower.push(q);
  }
  const upper: (readonly [number, number])[] = [];
  for (let i = p.length - 1; i >= 0; i--) {
    const q = p[i]!;
    while (upper.length >= 2 && !turnsLeft(upper[upper.length - 2]!, upper[upper.length - 1]!, q)) upper.pop();
    upper.push(q);
  }
  lower.pop();
  upper.pop();
  return [...lower, ...upper].map(([x, y]) => [x, y]);
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
  const h = getConvexHull(poly.points);
  let a = 0, per = 0;
  const [ox, oy] = h[0] ?? [0, 0];
  for (let i = 0; i < h.length; i++) {
    const [x0, y0] = h[i]!, [x1, y1] = h[(i + 1) % h.length]!;
    a += (x0 - ox) * (y1 - oy) - (x1 - ox) * (y0 - oy);
    per += Math.hypot(x1 - x0, y1 - y0);
  }
  const d = poly.deviationMm;
  return { areaMm2: Math.abs(a) / 2, perimeterMm: h.length > 1 ? per : 0, areaErrorMm2: d * per + Math.PI * d * d, perimeterErrorMm: 2 * Math.PI * d, points: h };
}
