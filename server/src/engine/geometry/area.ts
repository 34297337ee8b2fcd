/**
 * Signed areas by Green's theorem, A = ½∮(x dy − y dx): each segment contributes ½∫(x dy − y dx)
 * in closed form (no flattening), the contributions are summed with compensation. Positive for a
 * loop turning counter-clockwise in y-up axes (see types.ts for what that means on screen).
 */
import type { Segment } from '../types';

/**
 * Neumaier's improved Kahan summation: the running compensation also catches the low bits of a
 * summand larger than the sum so far. Error bound ≈ 2ε·Σ|x_i| + O(nε²)·Σ|x_i|, independent of n to
 * first order. Source: A. Neumaier, ZAMM 54 (1974) 39–51; Higham, *Accuracy and Stability of
 * Numerical Algorithms*, 2nd ed. 2002, §4.3 (REFERENCES §7.4).
 */
export class CompensatedSum {
  private sum = 0;
  private compensation = 0;

  add(x: number): void {
    const t = this.sum + x;
    if (Math.abs(this.sum) >= Math.abs(x)) this.compensation += this.sum - t + x;
    else this.compensation += x - t + this.sum;
    this.sum = t;
  }

  get value(): number {
    // After an overflow the compensation is ∞ − ∞ = NaN; the sum alone is the honest answer then.
    if (!Number.isFinite(this.sum)) return this.sum;
    return this.sum + this.compensation;
  }
}

/**
 * Signed Green contribution ½∫(x dy − y dx) of one segment, measured from the origin (ox, oy)
 * (subtract a point near the contour, e.g. its start, so products stay small: REFERENCES §7.4).
 * Closed forms, with × the 2D cross product and P_i the control points relative to the origin
 * [src: REFERENCES §4.1–4.3, derived there from Bernstein polynomials]:
 * - line: ½ P0×P1
 * - quadratic: (1/6)[2 P0×P1 + P0×P2 + 2 P1×P2]
 * - cubic: (1/20)[6 P0×P1 + 3 P0×P2 + P0×P3 + 3 P1×P2 + 3 P1×P3 + 6 P2×P3]
 * - arc P(θ) = C + U cos θ + V sin θ, θ from θ0 to θ1 = θ0 + sweep: P×P′ = C×P′ + U×V (the U×U and
 *   V×V terms vanish and cos² + sin² = 1), so ½∫P×P′dθ = ½[(U×V)·sweep + C×(P(θ1) − P(θ0))]
 *   [derived here; matches REFERENCES §4.3 with U×V = rx·ry, and the "green" column of §5.5].
 *   The chord P(θ1) − P(θ0) = U(cos θ1 − cos θ0) + V(sin θ1 − sin θ0) is evaluated through
 *   cos θ1 − cos θ0 = −2 sin(μ) sin(h), sin θ1 − sin θ0 = 2 cos(μ) sin(h), μ = θ0 + h, h = sweep/2,
 *   which keeps its relative accuracy for short arcs.
 */
export function getSegmentArea(s: Segment, ox = 0, oy = 0): number {
  const x0 = s.x0 - ox, y0 = s.y0 - oy;
  switch (s.kind) {
    case 'line': {
      const x1 = s.x1 - ox, y1 = s.y1 - oy;
      return (x0 * y1 - y0 * x1) / 2;
    }
    case 'quad': {
      const x1 = s.x1 - ox, y1 = s.y1 - oy;
      const x2 = s.x2 - ox, y2 = s.y2 - oy;
      return (2 * (x0 * y1 - y0 * x1) + (x0 * y2 - y0 * x2) + 2 * (x1 * y2 - y1 * x2)) / 6;
    }
    case 'cubic': {
      const x1 = s.x1 - ox, y1 = s.y1 - oy;
      const x2 = s.x2 - ox, y2 = s.y2 - oy;
      const x3 = s.x3 - ox, y3 = s.y3 - oy;
      return (
        (6 * (x0 * y1 - y0 * x1) +
          3 * (x0 * y2 - y0 * x2) +
          (x0 * y3 - y0 * x3) +
          3 * (x1 * y2 - y1 * x2) +
          3 * (x1 * y3 - y1 * x3) +
          6 * (x2 * y3 - y2 * x3)) /
        20
      );
    }
    case 'arc': {
      const h = s.sweep / 2;
      const mu = s.theta0 + h;
      const sinH = Math.sin(h);
      const dCos = -2 * Math.sin(mu) * sinH;
      const dSin = 2 * Math.cos(mu) * sinH;
      const chordX = s.ux * dCos + s.vx * dSin;
      const chordY = s.uy * dCos + s.vy * dSin;
      const cx = s.cx - ox, cy = s.cy - oy;
      const uxv = s.ux * s.vy - s.uy * s.vx;
      return (uxv * s.sweep + (cx * chordY - cy * chordX)) / 2;
    }
  }
}
