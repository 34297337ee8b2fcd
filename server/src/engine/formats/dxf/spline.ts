/**
 * NURBS curves (DXF SPLINE) to model segments.
 *
 * The B-spline is split into its Bézier pieces by knot insertion (Boehm's algorithm in homogeneous
 * coordinates; Piegl & Tiller, The NURBS Book, 2nd ed., A5.1 "CurveKnotIns" and §5.4 decomposition —
 * from memory), which is exact. Each piece then becomes, where an exact form exists:
 * - degree 1 → `line`; non-rational degree 2 → `quad`; non-rational degree 3 → `cubic` (exact);
 * - rational degree 2 with standard-form weight w = w1/√(w0·w2) < 1 → an elliptical `arc`, exact
 *   (derivation below); w = 1 → `quad` (a parabola), exact.
 * Other pieces (degree > 3, rational cubics, hyperbolas w > 1, degenerate conics) are replaced by cubic
 * Hermite pieces (end points and end derivatives of the curve), split in halves until the parametric
 * distance at 15 interior parameters of every piece is ≤ the tolerance. That is the stated error
 * bound: deviation ≤ tolerance measured at those samples (SPLINE_FIT_TOLERANCE_MM), not a proven bound
 * between samples.
 */
import type { Segment, SourceSpan } from '../../types';
import { getVectorLength } from '../../geometry/length';

export interface SplineInput {
  readonly degree: number;
  readonly knots: readonly number[];
  /** One per control point, or empty when all are 1. */
  readonly weights: readonly number[];
  /** Control points, flat x, y, z. */
  readonly ctrl: readonly number[];
}

export type SplineResult =
  | { readonly ok: true; readonly segments: Segment[]; readonly capped: boolean; readonly clamped: boolean }
  | { readonly ok: false; readonly detail: string };

/** Halving depth cap of the cubic fit (2^16 pieces per Bézier piece): reached only by broken data. */
const MAX_FIT_DEPTH = 16;
/** Interior sample count per fitted piece. */
const FIT_SAMPLES = 15;

/** Multiplicity of value u among the knots. */
function getMultiplicity(U: readonly number[], u: number): number {
  let s = 0;
  for (const k of U) if (k === u) s++;
  return s;
}

/**
 * Raises every distinct knot value in [a, b] to multiplicity ≥ p by inserting it again (Boehm; The
 * NURBS Book A5.1 with r = 1), in increasing order. P is flat homogeneous (xw, yw, w); returns the new
 * points and knots. Inserting u once into the span k (U[k] ≤ u < U[k+1]) where it has multiplicity s
 * replaces points k−p+1 … k−s by Q_i = α_i·P_i + (1 − α_i)·P_{i−1}, α_i = (u − U_i)/(U_{i+p} − U_i),
 * and puts the old P_{k−s} after them. Each insertion changes only the points just left of where it
 * inserts, so the points and knots are moved from the input to the output as the insertions reach them,
 * and an insertion costs O(p), not a copy of every point: O((n + insertions)·p) in all.
 */
function raiseKnots(P: readonly number[], U: readonly number[], p: number, a: number, b: number): { P: number[]; U: number[] } {
  const outP: number[] = [], outU: number[] = [];
  let nextP = 0, nextU = 0;
  /** Knot j of the knot vector as it stands: moved ones, then the input's not yet moved. */
  const knotAt = (j: number) => (j < outU.length ? outU[j] : U[nextU + j - outU.length]);
  let last = Number.NaN;
  for (let at = 0; at < U.length; at++) {
    const u = U[at];
    if (u === last || u < a || u > b) continue;
    last = u;
    // The span of u: k is the last knot ≤ u, and some knot must follow it (true of every u ≤ b whose
    // multiplicity is below p + 1, the only ones inserted).
    while (nextU < U.length && U[nextU] <= u) outU.push(U[nextU++]);
    let s = 0;
    while (s < outU.length && outU[outU.length - 1 - s] === u) s++;
    if (s >= p || nextU === U.length) continue;
    for (; s < p; s++) {
      const k = outU.length - 1;
      // Points 0 … k − s are needed in the output; those after it stay the input's.
      for (; outP.length < 3 * (k - s + 1); nextP++) outP.push(P[3 * nextP], P[3 * nextP + 1], P[3 * nextP + 2]);
      const o = 3 * (k - s);
      const moved = [outP[o], outP[o + 1], outP[o + 2]];
      for (let i = k - s; i >= k - p + 1; i--) {
        const alpha = (u - knotAt(i)) / (knotAt(i + p) - knotAt(i));
        for (let j = 0; j < 3; j++) outP[3 * i + j] = alpha * outP[3 * i + j] + (1 - alpha) * outP[3 * (i - 1) + j];
      }
      outP.splice(o + 3, 0, ...moved);
      outU.push(u);
    }
  }
  for (; 3 * nextP < P.length; nextP++) outP.push(P[3 * nextP], P[3 * nextP + 1], P[3 * nextP + 2]);
  for (; nextU < U.length; nextU++) outU.push(U[nextU]);
  return { P: outP, U: outU };
}

/** Point and derivative of a homogeneous Bézier (flat xw, yw, w; degree p) at t, in Euclidean form. */
function evalRational(H: readonly number[], p: number, t: number, tmp: Float64Array): [number, number, number, number] {
  for (let i = 0; i < H.length; i++) tmp[i] = H[i];
  const s = 1 - t;
  for (let r = 1; r < p; r++) {
    for (let i = 0; i <= p - r; i++) {
      for (let j = 0; j < 3; j++) tmp[3 * i + j] = s * tmp[3 * i + j] + t * tmp[3 * (i + 1) + j];
    }
  }
  // Level p−1 holds Q0, Q1: point = (1−t)Q0 + tQ1, homogeneous derivative = p(Q1 − Q0).
  const ax = s * tmp[0] + t * tmp[3], ay = s * tmp[1] + t * tmp[4], w = s * tmp[2] + t * tmp[5];
  const dax = p * (tmp[3] - tmp[0]), day = p * (tmp[4] - tmp[1]), dw = p * (tmp[5] - tmp[2]);
  const x = ax / w, y = ay / w;
  return [x, y, (dax - x * dw) / w, (day - y * dw) / w];
}

/** Cubic Hermite fit of a homogeneous Bézier piece on [t0, t1], halved until within tolerance. */
function fitCubics(H: readonly number[], p: number, tolerance: number, span: SourceSpan, out: Segment[]): boolean {
  const tmp = new Float64Array(H.length);
  let capped = false;
  const fit = (t0: number, t1: number, e0: [number, number, number, number], e1: [number, number, number, number], depth: number) => {
    const h = t1 - t0;
    const c = {
      kind: 'cubic' as const,
      x0: e0[0], y0: e0[1],
      x1: e0[0] + (h / 3) * e0[2], y1: e0[1] + (h / 3) * e0[3],
      x2: e1[0] - (h / 3) * e1[2], y2: e1[1] - (h / 3) * e1[3],
      x3: e1[0], y3: e1[1], span,
    };
    let worst = 0;
    for (let j = 1; j <= FIT_SAMPLES; j++) {
      const u = j / (FIT_SAMPLES + 1);
      const [x, y] = evalRational(H, p, t0 + h * u, tmp);
      const v = 1 - u;
      const bx = v * v * v * c.x0 + 3 * v * v * u * c.x1 + 3 * v * u * u * c.x2 + u * u * u * c.x3;
      const by = v * v * v * c.y0 + 3 * v * v * u * c.y1 + 3 * v * u * u * c.y2 + u * u * u * c.y3;
      worst = Math.max(worst, getVectorLength(bx - x, by - y));
    }
    if (worst <= tolerance || depth >= MAX_FIT_DEPTH) {
      if (worst > tolerance) capped = true;
      out.push(c);
      return;
    }
    const tm = (t0 + t1) / 2;
    const em = evalRational(H, p, tm, tmp);
    fit(t0, tm, e0, em, depth + 1);
    fit(tm, t1, em, e1, depth + 1);
  };
  fit(0, 1, evalRational(H, p, 0, tmp), evalRational(H, p, 1, tmp), 0);
  return capped;
}

/**
 * Exact arc of a rational quadratic Bézier P0, P1, P2 with weights w0, w1, w2 when it is an ellipse
 * arc, else null. In standard form (weights 1, w, 1 with w = w1/√(w0 w2) < 1) the piece is the affine
 * image of the circular arc of half angle α = acos w with control points (cos α, ∓sin α), (1/cos α, 0)
 * (Piegl & Tiller ch. 7, from memory; REFERENCES.md §4.7 quarter circle). Affine maps keep ratios on
 * lines, so with M = (P0 + P2)/2: centre C = M − (P1 − M)·w²/(1 − w²), U = (M − C)/w,
 * V = (P2 − M)/√(1 − w²), and P(θ) = C + U cos θ + V sin θ runs from P0 (θ = −α) to P2 (θ = α).
 */
function getConicArc(H: readonly number[], span: SourceSpan): Segment | null {
  const w0 = H[2], w1 = H[5], w2 = H[8];
  if (!(w0 > 0 && w1 > 0 && w2 > 0)) return null;
  const w = w1 / Math.sqrt(w0 * w2);
  const x0 = H[0] / w0, y0 = H[1] / w0, x1 = H[3] / w1, y1 = H[4] / w1, x2 = H[6] / w2, y2 = H[7] / w2;
  const cross = (x1 - x0) * (y2 - y0) - (y1 - y0) * (x2 - x0);
  const scale = getVectorLength(x1 - x0, y1 - y0) * getVectorLength(x2 - x0, y2 - y0);
  if (!(Math.abs(cross) > 1e-12 * scale)) return null; // collinear: a degenerate conic
  if (w === 1) return { kind: 'quad', x0, y0, x1, y1, x2, y2, span };
  if (!(w < 1)) return null;
  const mx = (x0 + x2) / 2, my = (y0 + y2) / 2;
  const k = (w * w) / (1 - w * w);
  const cx = mx - (x1 - mx) * k, cy = my - (y1 - my) * k;
  const q = Math.sqrt(1 - w * w);
  const alpha = Math.acos(w);
  return {
    kind: 'arc', x0, y0, x1: x2, y1: y2, cx, cy,
    ux: (mx - cx) / w, uy: (my - cy) / w,
    vx: (x2 - mx) / q, vy: (y2 - my) / q,
    theta0: -alpha, sweep: 2 * alpha, span,
  };
}

/** Converts a NURBS curve to segments (coordinates as given). `tolerance` in the same unit. */
export function getSplineSegments(sp: SplineInput, tolerance: number, span: SourceSpan): SplineResult {
  const p = sp.degree;
  const n = sp.ctrl.length / 3;
  if (!Number.isInteger(p) || p < 1) return { ok: false, detail: `SPLINE degree ${p} is not a positive integer` };
  if (n < p + 1) return { ok: false, detail: `SPLINE of degree ${p} needs at least ${p + 1} control points, has ${n}` };
  if (sp.knots.length !== n + p + 1) {
    return { ok: false, detail: `SPLINE has ${sp.knots.length} knots; ${n} control points of degree ${p} need ${n + p + 1}` };
  }
  for (let i = 0; i < sp.knots.length; i++) {
    if (!Number.isFinite(sp.knots[i]) || (i > 0 && sp.knots[i] < sp.knots[i - 1])) {
      return { ok: false, detail: 'SPLINE knots must be finite and non-decreasing' };
    }
  }
  if (sp.weights.length !== 0 && sp.weights.length !== n) {
    return { ok: false, detail: `SPLINE has ${sp.weights.length} weights for ${n} control points` };
  }
  for (const w of sp.weights) if (!(w > 0) || !Number.isFinite(w)) return { ok: false, detail: 'SPLINE weights must be positive' };
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(sp.ctrl[3 * i]) || !Number.isFinite(sp.ctrl[3 * i + 1])) return { ok: false, detail: 'SPLINE control point is not a number' };
  }
  const rational = sp.weights.some((w) => w !== sp.weights[0]);
  const homogeneous: number[] = [];
  for (let i = 0; i < n; i++) {
    const w = rational ? sp.weights[i] : 1;
    homogeneous.push(sp.ctrl[3 * i] * w, sp.ctrl[3 * i + 1] * w, w);
  }
  const a = sp.knots[p], b = sp.knots[n];
  if (!(a < b)) return { ok: false, detail: 'SPLINE knot vector spans no parameter range' };
  const clamped = getMultiplicity(sp.knots.slice(0, p + 1), a) === p + 1 && getMultiplicity(sp.knots.slice(n), b) === p + 1;
  // Every distinct knot in [a, b] at multiplicity ≥ p: the pieces between them are Bézier curves.
  const { P, U } = raiseKnots(homogeneous, sp.knots, p, a, b);

  const segments: Segment[] = [];
  let capped = false;
  for (let k = p; k < U.length - p - 1; k++) {
    if (!(U[k] < U[k + 1]) || U[k] < a || U[k + 1] > b) continue;
    const H = P.slice(3 * (k - p), 3 * (k + 1));
    if (p === 1) {
      segments.push({ kind: 'line', x0: H[0] / H[2], y0: H[1] / H[2], x1: H[3] / H[5], y1: H[4] / H[5], span });
    } else if (!rational && p === 2) {
      segments.push({ kind: 'quad', x0: H[0], y0: H[1], x1: H[3], y1: H[4], x2: H[6], y2: H[7], span });
    } else if (!rational && p === 3) {
      segments.push({ kind: 'cubic', x0: H[0], y0: H[1], x1: H[3], y1: H[4], x2: H[6], y2: H[7], x3: H[9], y3: H[10], span });
    } else {
      const conic = p === 2 ? getConicArc(H, span) : null;
      if (conic) segments.push(conic);
      else if (fitCubics(H, p, tolerance, span, segments)) capped = true;
    }
  }
  return { ok: true, segments, capped, clamped };
}
