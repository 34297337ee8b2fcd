/**
 * Segment lengths. Lines and circular arcs in closed form, elliptical arcs through the incomplete
 * elliptic integral of the second kind (ellipticIntegrals.ts; short ones by adaptive 16-point Gauss–Legendre
 * quadrature), Béziers by Gauss–Legendre panels whose a-priori error bound meets BEZIER_LENGTH_REL_TOL.
 */
import { ellipticE } from './ellipticIntegrals';
import { ARC_LENGTH_QUADRATURE_REL_TOL, BEZIER_LENGTH_MAX_DEPTH, BEZIER_LENGTH_REL_TOL } from './tolerances';
import type { Arc, Cubic, Quad, Segment } from '../types';

/**
 * √(x² + y²) without overflow, bit for bit what Math.hypot(x, y) returns in V8 (its builtin scales by
 * the larger magnitude M and returns M·√(Σ(|v|/M)²); for two numbers one term is exactly 1), at a
 * fraction of the cost of the variadic builtin (~45 ns a call in Node 20, this ~5 ns).
 */
export function getVectorLength(x: number, y: number): number {
  const ax = Math.abs(x), ay = Math.abs(y);
  if (ax === Infinity || ay === Infinity) return Infinity;
  if (ax > ay) {
    const r = ay / ax;
    return Math.sqrt(1 + r * r) * ax;
  }
  if (ay > ax) {
    const r = ax / ay;
    return Math.sqrt(r * r + 1) * ay;
  }
  if (ax !== ax || ay !== ay) return NaN;
  return ax === 0 ? 0 : Math.SQRT2 * ax;
}

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

/**
 * Gauss–Legendre rules for Bézier lengths: positive nodes x_i of the symmetric n-point rule on
 * [−1, 1] and their weights. Source: Abramowitz & Stegun, Table 25.4 (n = 4, 8, 16), recomputed by
 * Newton's method on P_n with weights 2/((1 − x²)P′_n(x)²) (REFERENCES §4.5 does the same for n = 16).
 */
interface GaussRule {
  readonly nodes: readonly number[];
  readonly weights: readonly number[];
}

const GAUSS_RULES: readonly GaussRule[] = [
  {
    nodes: [0.339981043584856264803, 0.861136311594052575224],
    weights: [0.652145154862546142627, 0.347854845137453857373],
  },
  {
    nodes: [0.183434642495649804939, 0.525532409916328985818, 0.796666477413626739592, 0.960289856497536231684],
    weights: [0.362683783378361982965, 0.313706645877887287338, 0.222381034453374470544, 0.101228536290376259153],
  },
  { nodes: GL16_NODES, weights: GL16_WEIGHTS },
];

/**
 * Bernstein-ellipse parameter used when |B′| has no singularity to limit it (a polynomial speed):
 * any ρ is then allowed, and at this one the bound of the 4-point rule is already below 1e-20 of M.
 */
const RHO_MAX = 1e3;

/** A root of w within this distance of the real axis (in t) also splits the range at its real part
 *  (common practice, no source: it only saves halvings around a near-cusp). */
const NEAR_REAL = 0.25;

/**
 * Length of one quadratic or cubic Bézier with an a-priori error bound. The speed is |B′(t)| = k·|w(t)|
 * with w(t) = A t² + B t + C read as a complex polynomial (x + iy): k = 3 for a cubic (A = d0 − 2d1 + d2,
 * B = 2(d1 − d0), C = d0, d_i = P_{i+1} − P_i), k = 2 for a quadratic (A = 0, B = P0 − 2P1 + P2,
 * C = P1 − P0). For real t, |w|² = w·w̄ (w̄: conjugated coefficients), so √(w·w̄) continues |w| into
 * the complex plane, analytic away from the roots τ of w and their conjugates [derived]. The roots
 * come in closed form.
 *
 * Panel bound: on [lo, hi] = m ± h, with s = (t − m)/h, the n-point Gauss–Legendre error is at most
 * h·64M / (15(1 − ρ⁻²)ρ²ⁿ) when the integrand is analytic inside the Bernstein ellipse E_ρ (foci ±1,
 * semi-axes summing to ρ) and bounded by M there (Trefethen, Approximation Theory and Approximation
 * Practice, Thm 19.3; stated for n points at fungrim.org, topic Gaussian_quadrature). A root σ = (τ − m)/h
 * allows ρ = α + √(α² − 1), α = (|σ − 1| + |σ + 1|)/2 (the ellipse through σ); on E_ρ, |s| ≤ R =
 * (ρ + 1/ρ)/2, so with w(m + hs) = a s² + b s + c, M ≤ k(|a|R² + |b|R + |c|) (|w̄| has the same bound).
 *
 * Roots on the real axis: a root τ = x + iy within rounding of it (a cusp, B′ = 0; a control point on
 * its end point) would pin ρ at 1. It is "made real" when that costs little: the bounded integrand g
 * is k|w̃| with w̃ = w with τ moved to x, the range is split at x, and on each side |t − x| = ±(t − x)
 * is a polynomial, so only the other roots limit ρ. Then |f − g| ≤ k|w − w̃| (triangle inequality),
 * and the panel error is E(g) + 2·(hi − lo)·sup|f − g| (the integral and the rule, whose weights sum to
 * hi − lo, each move by at most (hi − lo)·sup|f − g| from f to g). Near-real roots that stay
 * singular also split the range at x (fewer halvings; no effect on the bound).
 *
 * Acceptance: a panel with bound err and rule value Q passes when err ≤ (tol/2)·max(Q − err,
 * L_lo·(hi − lo)); Q − err is at most the panel's length and L_lo at most the segment's length (the
 * polyline through B(0), B(⅓), B(⅔), B(1), or B(½) for a quadratic, which is 0 only for a point), so
 * over all panels the error is at most tol × the length. The smallest rule (4, 8 or 16 points) whose
 * bound passes is used; otherwise the panel is halved, down to BEZIER_LENGTH_MAX_DEPTH. The bound
 * leaves out rounding (~1e-15 relative).
 */
class BezierLengthIntegrator {
  // Number fields start at non-integers so that V8 stores them as doubles from the first call on.
  depthCapped = false;
  private relTol = 0.5;
  private k = 0.5;
  /** w(t) = A t² + B t + C, as read. */
  private ax = 0.5; private ay = 0.5; private bx = 0.5; private by = 0.5; private cx = 0.5; private cy = 0.5;
  /** 1/(largest coefficient of w): the error bounds work on w·scale, where nothing overflows. */
  private scale = 0.5;
  /** w̃·scale (w̃: w with the real-made roots on the real axis; its t² coefficient is A). */
  private gax = 0.5; private gay = 0.5; private gbx = 0.5; private gby = 0.5; private gcx = 0.5; private gcy = 0.5;
  /** sup over [0, 1] of |f − g|, times scale. */
  private perturbation = 0.5;
  /** Roots that limit ρ: how many, and where (t). */
  private singular = 0;
  private r1x = 0.5; private r1y = 0.5; private r2x = 0.5; private r2y = 0.5;
  /** Where the range is split (sorted); NaN when unused. */
  private split1 = 0.5;
  private split2 = 0.5;
  /** A lower bound of the segment's length, times scale. */
  private lengthLowerBound = 0.5;

  measure(s: Quad | Cubic, relTol: number): number {
    this.depthCapped = false;
    this.relTol = relTol;
    let lowerBound: number;
    if (s.kind === 'quad') {
      this.k = 2;
      this.ax = 0; this.ay = 0;
      this.bx = s.x0 - 2 * s.x1 + s.x2; this.by = s.y0 - 2 * s.y1 + s.y2;
      this.cx = s.x1 - s.x0; this.cy = s.y1 - s.y0;
      const mx = (s.x0 + 2 * s.x1 + s.x2) / 4, my = (s.y0 + 2 * s.y1 + s.y2) / 4;
      lowerBound = getVectorLength(mx - s.x0, my - s.y0) + getVectorLength(s.x2 - mx, s.y2 - my);
    } else {
      this.k = 3;
      const dx0 = s.x1 - s.x0, dx1 = s.x2 - s.x1, dx2 = s.x3 - s.x2;
      const dy0 = s.y1 - s.y0, dy1 = s.y2 - s.y1, dy2 = s.y3 - s.y2;
      this.ax = dx0 - 2 * dx1 + dx2; this.ay = dy0 - 2 * dy1 + dy2;
      this.bx = 2 * (dx1 - dx0); this.by = 2 * (dy1 - dy0);
      this.cx = dx0; this.cy = dy0;
      // B(⅓) and B(⅔): Bernstein weights 8, 12, 6, 1 (/27) and reversed.
      const px = (8 * s.x0 + 12 * s.x1 + 6 * s.x2 + s.x3) / 27, py = (8 * s.y0 + 12 * s.y1 + 6 * s.y2 + s.y3) / 27;
      const qx = (s.x0 + 6 * s.x1 + 12 * s.x2 + 8 * s.x3) / 27, qy = (s.y0 + 6 * s.y1 + 12 * s.y2 + 8 * s.y3) / 27;
      lowerBound = getVectorLength(px - s.x0, py - s.y0) + getVectorLength(qx - px, qy - py) + getVectorLength(s.x3 - qx, s.y3 - qy);
    }
    const { ax, ay, bx, by, cx, cy } = this;
    if (ax === 0 && ay === 0 && bx === 0 && by === 0) return this.k * getVectorLength(cx, cy); // constant speed
    const scale = 1 / Math.max(Math.abs(ax), Math.abs(ay), Math.abs(bx), Math.abs(by), Math.abs(cx), Math.abs(cy));
    this.scale = scale;
    this.lengthLowerBound = lowerBound * scale;
    this.findRoots(ax * scale, ay * scale, bx * scale, by * scale, cx * scale, cy * scale);
    let value = 0;
    let lo = 0;
    if (this.split1 > 0 && this.split1 < 1) {
      value += this.integrate(0, this.split1, 0);
      lo = this.split1;
    }
    if (this.split2 > lo && this.split2 < 1) {
      value += this.integrate(lo, this.split2, 0);
      lo = this.split2;
    }
    return value + this.integrate(lo, 1, 0);
  }

  /**
   * Roots of w (given times scale), then which of them are made real: both, else the one nearer the
   * real axis, when sup|f − g| stays within tol/16 of L_lo (a small part of any panel's budget).
   * Roots farther than 1/ε limit nothing.
   */
  private findRoots(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): void {
    this.gax = ax; this.gay = ay; this.gbx = bx; this.gby = by; this.gcx = cx; this.gcy = cy;
    let t1x = NaN, t1y = NaN, t2x = NaN, t2y = NaN;
    if (ax === 0 && ay === 0) {
      const d = bx * bx + by * by; // τ = −C/B, B ≠ 0 here
      t1x = -(cx * bx + cy * by) / d; t1y = -(cy * bx - cx * by) / d;
    } else {
      // q = −(B + √(B² − 4AC))/2 with the sign that avoids cancellation, τ = q/A and C/q
      // (Press et al., Numerical Recipes, 3rd ed. §5.6, complex coefficients).
      const dx = bx * bx - by * by - 4 * (ax * cx - ay * cy);
      const dy = 2 * bx * by - 4 * (ax * cy + ay * cx);
      let sx = Math.sqrt((Math.sqrt(dx * dx + dy * dy) + Math.abs(dx)) / 2), sy = 0;
      if (sx !== 0) {
        if (dx >= 0) {
          sy = dy / (2 * sx);
        } else {
          sy = dy >= 0 ? sx : -sx;
          sx = dy / (2 * sy);
        }
      }
      if (bx * sx + by * sy < 0) {
        sx = -sx;
        sy = -sy;
      }
      const qx = -(bx + sx) / 2, qy = -(by + sy) / 2;
      const qq = qx * qx + qy * qy;
      if (qq === 0) {
        t1x = t1y = t2x = t2y = 0; // w = A t²
      } else {
        const aa = ax * ax + ay * ay;
        t1x = (qx * ax + qy * ay) / aa; t1y = (qy * ax - qx * ay) / aa;
        t2x = (cx * qx + cy * qy) / qq; t2y = (cy * qx - cx * qy) / qq;
      }
    }
    const far = 1 / Number.EPSILON;
    if (!(Math.abs(t2x) + Math.abs(t2y) < far)) t2x = t2y = NaN;
    if (!(Math.abs(t1x) + Math.abs(t1y) < far)) {
      t1x = t2x; t1y = t2y;
      t2x = t2y = NaN;
    }
    if (Math.abs(t2y) < Math.abs(t1y)) {
      const x = t1x, y = t1y;
      t1x = t2x; t1y = t2y; t2x = x; t2y = y;
    }
    this.perturbation = 0;
    this.singular = 0;
    let real = 0;
    if (Math.abs(t1y) < NEAR_REAL) {
      const budget = (this.relTol * this.lengthLowerBound) / 16;
      if (Math.abs(t2y) < NEAR_REAL && this.realify(t1x, t1y, t2x, budget)) real = 2;
      else if (this.realify(t1x, t1y, NaN, budget)) real = 1;
    }
    if (real < 1 && t1x === t1x) this.addSingularRoot(t1x, t1y);
    if (real < 2 && t2x === t2x) this.addSingularRoot(t2x, t2y);
    const x1 = Math.abs(t1y) < NEAR_REAL ? t1x : NaN;
    const x2 = Math.abs(t2y) < NEAR_REAL ? t2x : NaN;
    this.split1 = x2 < x1 ? x2 : x1;
    this.split2 = x2 < x1 ? x1 : x2;
  }

  private addSingularRoot(x: number, y: number): void {
    if (this.singular === 0) {
      this.r1x = x; this.r1y = y;
    } else {
      this.r2x = x; this.r2y = y;
    }
    this.singular++;
  }

  /**
   * Makes root 1 (and root 2 when x2 is a number) real in w̃, when that keeps sup|f − g| over [0, 1]
   * within `budget`. w − w̃ is linear in t in every case.
   */
  private realify(x1: number, y1: number, x2: number, budget: number): boolean {
    const { gax: ax, gay: ay, gbx: bx, gby: by, gcx: cx, gcy: cy } = this;
    let gbx: number, gby: number, gcx: number, gcy: number;
    if (x2 === x2) {
      // w̃ = A(t − x1)(t − x2)
      gbx = -ax * (x1 + x2); gby = -ay * (x1 + x2);
      gcx = ax * x1 * x2; gcy = ay * x1 * x2;
    } else if (ax === 0 && ay === 0) {
      // w = B(t − τ1), w̃ = B(t − x1) = w + i·y1·B
      gbx = bx; gby = by;
      gcx = cx - y1 * by; gcy = cy + y1 * bx;
    } else {
      // w = A(t − τ1)(t − τ2), w̃ = A(t − x1)(t − τ2) = w + i·y1·(A t + B + Aτ1)
      const px = bx + ax * x1 - ay * y1, py = by + ax * y1 + ay * x1;
      gbx = bx - y1 * ay; gby = by + y1 * ax;
      gcx = cx - y1 * py; gcy = cy + y1 * px;
    }
    const d1x = gbx - bx, d1y = gby - by, d0x = gcx - cx, d0y = gcy - cy;
    const e0 = d0x * d0x + d0y * d0y, e1 = (d0x + d1x) ** 2 + (d0y + d1y) ** 2;
    const perturbation = this.k * Math.sqrt(Math.max(e0, e1));
    if (!(perturbation <= budget)) return false;
    this.gbx = gbx; this.gby = gby; this.gcx = gcx; this.gcy = gcy;
    this.perturbation = perturbation;
    return true;
  }

  /** ∫ f over [lo, hi] by the smallest rule whose bound meets the panel's budget, halving as needed. */
  private integrate(lo: number, hi: number, depth: number): number {
    const m = (lo + hi) / 2, h = (hi - lo) / 2;
    let rho = RHO_MAX;
    for (let j = 0; j < this.singular; j++) {
      const sx = ((j === 0 ? this.r1x : this.r2x) - m) / h, sy = (j === 0 ? this.r1y : this.r2y) / h;
      const sy2 = sy * sy;
      const alpha = (Math.sqrt((sx - 1) ** 2 + sy2) + Math.sqrt((sx + 1) ** 2 + sy2)) / 2;
      const r = alpha + Math.sqrt((alpha - 1) * (alpha + 1));
      if (r < rho) rho = r;
    }
    // w̃(m + hs)·scale = a s² + b s + c
    const { gax, gay, gbx, gby } = this;
    const a = Math.sqrt(gax * gax + gay * gay) * h * h;
    const bsx = 2 * gax * m + gbx, bsy = 2 * gay * m + gby;
    const b = Math.sqrt(bsx * bsx + bsy * bsy) * h;
    const csx = (gax * m + gbx) * m + this.gcx, csy = (gay * m + gby) * m + this.gcy;
    const c = Math.sqrt(csx * csx + csy * csy);
    const big = (rho + 1 / rho) / 2;
    const rho2 = rho * rho;
    const rho8 = rho2 * rho2 * rho2 * rho2;
    let bound = (h * 64 * this.k * ((a * big + b) * big + c)) / (15 * (1 - 1 / rho2) * rho8);
    const err0 = 4 * h * this.perturbation;
    const widthShare = this.lengthLowerBound * 2 * h;
    const half = this.relTol / 2;
    // Choose the rule with the midpoint speed standing in for the panel's length; checked below.
    const estimate = Math.max(this.k * c * 2 * h, widthShare);
    let rule = 0;
    while (rule < GAUSS_RULES.length - 1 && !(bound + err0 <= half * estimate)) {
      bound /= rule === 0 ? rho8 : rho8 * rho8;
      rule++;
    }
    const err = bound + err0;
    const canHalve = depth < BEZIER_LENGTH_MAX_DEPTH && err === err;
    if (canHalve && !(err <= half * estimate)) {
      return this.integrate(lo, m, depth + 1) + this.integrate(m, hi, depth + 1);
    }
    const value = this.applyRule(GAUSS_RULES[rule]!, m, h);
    const scaled = value * this.scale;
    if (!Number.isFinite(value) || err <= half * Math.max(scaled - err, widthShare)) return value;
    if (!canHalve) {
      this.depthCapped = true;
      return value;
    }
    return this.integrate(lo, m, depth + 1) + this.integrate(m, hi, depth + 1);
  }

  /** The rule over m ± h applied to the speed k·|w(t)|, w in power form. */
  private applyRule(rule: GaussRule, m: number, h: number): number {
    const { ax, ay, bx, by, cx, cy } = this;
    const { nodes, weights } = rule;
    let sum = 0;
    for (let i = 0; i < nodes.length; i++) {
      const d = h * nodes[i]!;
      const t0 = m - d, t1 = m + d;
      const x0 = (ax * t0 + bx) * t0 + cx, y0 = (ay * t0 + by) * t0 + cy;
      const x1 = (ax * t1 + bx) * t1 + cx, y1 = (ay * t1 + by) * t1 + cy;
      sum += weights[i]! * (Math.sqrt(x0 * x0 + y0 * y0) + Math.sqrt(x1 * x1 + y1 * y1));
    }
    return this.k * sum * h;
  }
}

/** One integrator reused for every Bézier (its fields are scratch state; nothing is kept between calls). */
const bezierLength = new BezierLengthIntegrator();

/**
 * Length of a quadratic or cubic Bézier, L = ∫₀¹|B′(t)| dt, within BEZIER_LENGTH_REL_TOL relative
 * (a proven bound, see BezierLengthIntegrator) unless `depthCapped`.
 */
export function getBezierLength(s: Quad | Cubic): LengthEstimate {
  const value = bezierLength.measure(s, BEZIER_LENGTH_REL_TOL);
  return { value, depthCapped: bezierLength.depthCapped };
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
  const flags = { depthCapped: false };
  const value = getArcLengthFlagged(a, flags);
  return { value, depthCapped: flags.depthCapped };
}

/** getArcLengthEstimate's value; sets `flags.depthCapped` when the quadrature stopped at its cap. */
function getArcLengthFlagged(a: Arc, flags: { depthCapped: boolean }): number {
  const uu = a.ux * a.ux + a.uy * a.uy;
  const vv = a.vx * a.vx + a.vy * a.vy;
  const uv = a.ux * a.vx + a.uy * a.vy;
  const half = (vv - uu) / 2;
  const r = getVectorLength(half, uv);
  const a2 = (uu + vv) / 2 + r;
  const sweep = Math.abs(a.sweep);
  if (a2 === 0) return 0;
  if (r === 0) return Math.sqrt(a2) * sweep;
  if (sweep < Math.PI / 2) {
    // Integrate over the offset u ∈ [0, |sweep|] from theta0, not over [theta0, theta0 + sweep]: the
    // rounding of theta0 + sweep would change the width of a tiny interval (relatively 1e-8 at 1e-8 rad).
    const direction = a.sweep < 0 ? -1 : 1;
    const speed: Speed = (u) => {
      const theta = a.theta0 + direction * u;
      const c = Math.cos(theta), s = Math.sin(theta);
      return getVectorLength(a.vx * c - a.ux * s, a.vy * c - a.uy * s);
    };
    const lo = 0;
    const hi = sweep;
    const state: QuadratureState = { relTol: ARC_LENGTH_QUADRATURE_REL_TOL, depthCapped: false };
    const value = refine(speed, lo, hi, gauss16(speed, lo, hi), 0, state);
    if (state.depthCapped) flags.depthCapped = true;
    return value;
  }
  const cross = a.ux * a.vy - a.uy * a.vx;
  const m = (2 * r) / a2;
  const mc = (cross * cross) / (a2 * a2);
  let phi0 = a.theta0 + Math.atan2(uv, half) / 2;
  phi0 -= Math.round(phi0 / Math.PI) * Math.PI;
  const phi1 = phi0 + a.sweep;
  return Math.sqrt(a2) * Math.abs(ellipticE(phi1, m, mc) - ellipticE(phi0, m, mc));
}

/** Length of an arc (see getArcLengthEstimate). */
export function getArcLength(a: Arc): number {
  return getArcLengthEstimate(a).value;
}

/**
 * Length of a segment (see getSegmentLengthEstimate) without allocating: sets `flags.depthCapped` when
 * the estimate stopped at its depth cap and leaves it alone otherwise, so one flag can cover a contour.
 */
export function getSegmentLengthFlagged(s: Segment, flags: { depthCapped: boolean }): number {
  switch (s.kind) {
    case 'line':
      return getVectorLength(s.x1 - s.x0, s.y1 - s.y0);
    case 'arc':
      return getArcLengthFlagged(s, flags);
    case 'quad':
    case 'cubic': {
      const value = bezierLength.measure(s, BEZIER_LENGTH_REL_TOL);
      if (bezierLength.depthCapped) flags.depthCapped = true;
      return value;
    }
  }
}

/** Length of a segment with its trust flag (see LengthEstimate). */
export function getSegmentLengthEstimate(s: Segment): LengthEstimate {
  const flags = { depthCapped: false };
  const value = getSegmentLengthFlagged(s, flags);
  return { value, depthCapped: flags.depthCapped };
}

/** Length of a segment: exact for lines and circular arcs, see getArcLengthEstimate for elliptical
 *  arcs, to BEZIER_LENGTH_REL_TOL for Béziers. */
export function getSegmentLength(s: Segment): number {
  return getSegmentLengthEstimate(s).value;
}
