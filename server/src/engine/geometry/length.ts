/**
 * Segment lengths. Lines and circular arcs in closed form, elliptical arcs through the incomplete
 * elliptic integral of the second kind (ellipticIntegrals.ts; short ones by quadrature), Béziers by adaptive 16-point
 * Gauss–Legendre quadrature of the speed |B′(t)| after splitting at the critical parameters.
 */
import { getBezierCriticalParameters } from './bounds';
import { ellipticE } from './ellipticIntegrals';
import { ARC_LENGTH_QUADRATURE_REL_TOL, BEZIER_LENGTH_MAX_DEPTH, BEZIER_LENGTH_REL_TOL } from './tolerances';
import type { Arc, Cubic, Quad, Segment } from '../types';

/** A length with a note on how far to trust it. */
export interface LengthEstimate {
  readonly value: number;
  /**
   * True when the adaptive quadrature (Béziers, short elliptical arcs) stopped at
   * BEZIER_LENGTH_MAX_DEPTH somewhere: the value is then the best estimate reached, not guaranteed to
   * the quadrature's tolerance. Always false for lines, circular arcs and arcs of a quarter turn or more.
   */
  readonly depthCapped: boolean;
}

/**
 * 16-point Gauss–Legendre nodes ±x_i and weights w_i on [−1, 1].
 * Source: Abramowitz & Stegun, Table 25.4, as recomputed in REFERENCES §4.5.
 */
const GL16_NODES = [
  0.09501250983763744019, 0.28160355077925891323, 0.45801677765722738634, 0.61787624440264374845,
  0.7554044083550030339, 0.86563120238783174388, 0.94457502307323257608, 0.9894009349916499326,
];
const GL16_WEIGHTS = [
  0.18945061045506849629, 0.18260341504492358887, 0.16915651939500253819, 0.14959598881657673208,
  0.12462897125553387205, 0.09515851168249278481, 0.06225352393864789286, 0.02715245941175409485,
];

type Speed = (t: number) => number;

function gauss16(speed: Speed, lo: number, hi: number): number {
  const mid = (lo + hi) / 2;
  const half = (hi - lo) / 2;
  let sum = 0;
  for (let i = 0; i < GL16_NODES.length; i++) {
    const dx = half * GL16_NODES[i]!;
    sum += GL16_WEIGHTS[i]! * (speed(mid - dx) + speed(mid + dx));
  }
  return sum * half;
}

interface QuadratureState {
  readonly relTol: number;
  depthCapped: boolean;
}

/**
 * Adaptive bisection (QUADPACK-style, REFERENCES §4.5; Piessens et al. 1983): accept a panel when its
 * G16 value `whole` and the sum of the G16 values of its halves differ by at most
 * state.relTol of that sum, and return the sum. That difference bounds the error of `whole`,
 * which is far larger than the error of the halves for smooth integrands, so the accepted total is
 * within state.relTol relative (each panel is, and all panel values are positive).
 */
function refine(speed: Speed, lo: number, hi: number, whole: number, depth: number, state: QuadratureState): number {
  const mid = (lo + hi) / 2;
  const left = gauss16(speed, lo, mid);
  const right = gauss16(speed, mid, hi);
  const halves = left + right;
  // An overflowed speed (coordinates near the double limit) makes the test NaN: stop, do not bisect 2^20 times.
  if (!Number.isFinite(halves) || Math.abs(halves - whole) <= state.relTol * Math.abs(halves)) return halves;
  if (depth >= BEZIER_LENGTH_MAX_DEPTH) {
    state.depthCapped = true;
    return halves;
  }
  return refine(speed, lo, mid, left, depth + 1, state) + refine(speed, mid, hi, right, depth + 1, state);
}

function getBezierSpeed(s: Quad | Cubic): Speed {
  if (s.kind === 'quad') {
    // B′(t) = 2[(1−t)(P1 − P0) + t(P2 − P1)]
    const ax = s.x1 - s.x0, ay = s.y1 - s.y0, bx = s.x2 - s.x1, by = s.y2 - s.y1;
    return (t) => {
      const u = 1 - t;
      return 2 * Math.sqrt((u * ax + t * bx) ** 2 + (u * ay + t * by) ** 2);
    };
  }
  // B′(t) = 3[(1−t)²d0 + 2(1−t)t·d1 + t²d2], d_i = P_{i+1} − P_i
  const ax = s.x1 - s.x0, ay = s.y1 - s.y0;
  const bx = s.x2 - s.x1, by = s.y2 - s.y1;
  const cx = s.x3 - s.x2, cy = s.y3 - s.y2;
  return (t) => {
    const u = 1 - t;
    const b0 = u * u, b1 = 2 * u * t, b2 = t * t;
    return 3 * Math.sqrt((b0 * ax + b1 * bx + b2 * cx) ** 2 + (b0 * ay + b1 * by + b2 * cy) ** 2);
  };
}

/**
 * Length of a quadratic or cubic Bézier, L = ∫₀¹|B′(t)| dt, to BEZIER_LENGTH_REL_TOL relative.
 * The parameter range is first split at the critical parameters (roots of x′ and y′, see
 * getBezierCriticalParameters): a cusp, B′(t) = 0, is one of them, and there |B′| has a kink that
 * Gauss–Legendre crosses badly (REFERENCES §4.5: error 4.5e-3 on one panel, 1e-23 after the split).
 */
export function getBezierLength(s: Quad | Cubic): LengthEstimate {
  const speed = getBezierSpeed(s);
  const breaks = [0, ...getBezierCriticalParameters(s), 1];
  const state: QuadratureState = { relTol: BEZIER_LENGTH_REL_TOL, depthCapped: false };
  let value = 0;
  for (let i = 0; i + 1 < breaks.length; i++) {
    const lo = breaks[i]!, hi = breaks[i + 1]!;
    value += refine(speed, lo, hi, gauss16(speed, lo, hi), 0, state);
  }
  return { value, depthCapped: state.depthCapped };
}

/**
 * Length of an arc P(θ) = C + U cos θ + V sin θ over its sweep.
 * |P′(θ)|² = |U|² sin²θ − 2(U·V) sinθ cosθ + |V|² cos²θ = a²(1 − m sin²(θ + δ/2)) with
 * a² = (|U|² + |V|²)/2 + R, R = √(((|V|² − |U|²)/2)² + (U·V)²), δ = atan2(U·V, (|V|² − |U|²)/2),
 * m = 2R/a² and 1 − m = b²/a², b² = (U×V)²/a² (a, b the semi-axes) [derived: double-angle
 * identities; checked against REFERENCES §2.4 and §5.5].
 * - Circle (R = 0: U ⊥ V, |U| = |V|, exactly so for arcs built from one radius): r·|sweep|, exact.
 * - |sweep| ≥ π/2: L = a·|E(φ0 + sweep | m) − E(φ0 | m)|, φ0 = theta0 + δ/2 reduced into [−π/2, π/2]
 *   (the integrand has period π), E by Carlson's R_F/R_D (DLMF §19.25.9). Absolute error a few ulps of
 *   a·E(m)·(1 + |sweep|/π), which is ~1e-15 relative for an arc of a quarter turn or more.
 * - |sweep| < π/2: that difference of two E values would lose relative accuracy as the sweep shrinks
 *   (1e-8 at 1e-8 rad), so the speed is integrated directly by the adaptive 16-point Gauss–Legendre
 *   scheme to ARC_LENGTH_QUADRATURE_REL_TOL relative (the integrand is analytic; thin ellipses get
 *   more panels near the ends of the major axis).
 */
export function getArcLengthEstimate(a: Arc): LengthEstimate {
  const uu = a.ux * a.ux + a.uy * a.uy;
  const vv = a.vx * a.vx + a.vy * a.vy;
  const uv = a.ux * a.vx + a.uy * a.vy;
  const half = (vv - uu) / 2;
  const r = Math.hypot(half, uv);
  const a2 = (uu + vv) / 2 + r;
  const sweep = Math.abs(a.sweep);
  if (a2 === 0) return { value: 0, depthCapped: false };
  if (r === 0) return { value: Math.sqrt(a2) * sweep, depthCapped: false };
  if (sweep < Math.PI / 2) {
    // Integrate over the offset u ∈ [0, |sweep|] from theta0, not over [theta0, theta0 + sweep]: the
    // rounding of theta0 + sweep would change the width of a tiny interval (relatively 1e-8 at 1e-8 rad).
    const direction = a.sweep < 0 ? -1 : 1;
    const speed: Speed = (u) => {
      const theta = a.theta0 + direction * u;
      const c = Math.cos(theta), s = Math.sin(theta);
      return Math.hypot(a.vx * c - a.ux * s, a.vy * c - a.uy * s);
    };
    const lo = 0;
    const hi = sweep;
    const state: QuadratureState = { relTol: ARC_LENGTH_QUADRATURE_REL_TOL, depthCapped: false };
    const value = refine(speed, lo, hi, gauss16(speed, lo, hi), 0, state);
    return { value, depthCapped: state.depthCapped };
  }
  const cross = a.ux * a.vy - a.uy * a.vx;
  const m = (2 * r) / a2;
  const mc = (cross * cross) / (a2 * a2);
  let phi0 = a.theta0 + Math.atan2(uv, half) / 2;
  phi0 -= Math.round(phi0 / Math.PI) * Math.PI;
  const phi1 = phi0 + a.sweep;
  return { value: Math.sqrt(a2) * Math.abs(ellipticE(phi1, m, mc) - ellipticE(phi0, m, mc)), depthCapped: false };
}

/** Length of an arc (see getArcLengthEstimate). */
export function getArcLength(a: Arc): number {
  return getArcLengthEstimate(a).value;
}

/** Length of a segment with its trust flag (see LengthEstimate). */
export function getSegmentLengthEstimate(s: Segment): LengthEstimate {
  switch (s.kind) {
    case 'line':
      return { value: Math.hypot(s.x1 - s.x0, s.y1 - s.y0), depthCapped: false };
    case 'arc':
      return getArcLengthEstimate(s);
    case 'quad':
    case 'cubic':
      return getBezierLength(s);
  }
}

/** Length of a segment: exact for lines and circular arcs, see getArcLengthEstimate for elliptical
 *  arcs, to BEZIER_LENGTH_REL_TOL for Béziers. */
export function getSegmentLength(s: Segment): number {
  return getSegmentLengthEstimate(s).value;
}
