import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints } from './arc';
import { getArcLength, getArcLengthEstimate, getBezierLength, getSegmentLength, getSegmentLengthEstimate } from './length';
import { arc, circleArcs, CIRCLE_CUBIC_K, cubic, ellipseArc, line, quad } from '../../../../test/support/shapes';
import type { Arc } from '../types';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('getSegmentLength', () => {
  it('is exact for a line (3-4-5 triangle, Pythagoras)', () => {
    expect(getSegmentLength(line(1, 1, 4, 5))).toBe(5);
  });

  it('gives r·|sweep| for circular arcs (REFERENCES §2.1: L = 2πr)', () => {
    expect(getSegmentLength(circleArcs(0, 0, 3, 1)[0]!)).toBe(3 * 2 * Math.PI);
    expect(getSegmentLength(arc(1, 2, 3, 0, 0, 3, 0.4, -1.3))).toBeCloseTo(3 * 1.3, 14);
  });

  it('measures the cubic and quadratic of REFERENCES §4.2 to 1e-12', () => {
    expect(rel(getSegmentLength(cubic(0, 0, 1, 2, 3, 2, 4, 0)), 5.268365543018514145)).toBeLessThan(1e-12);
    expect(rel(getSegmentLength(quad(0, 0, 1, 2, 2, 0)), 2.957885715089194868)).toBeLessThan(1e-12);
  });

  it('measures the cusp cubic (0,0),(1,1),(0,1),(1,0) as 2√2 − 1 (REFERENCES §4.5)', () => {
    const estimate = getSegmentLengthEstimate(cubic(0, 0, 1, 1, 0, 1, 1, 0));
    expect(rel(estimate.value, 2 * Math.SQRT2 - 1)).toBeLessThan(1e-12);
    expect(estimate.depthCapped).toBe(false);
  });

  it('measures the quarter-circle cubic as 1.571016698073855651 (REFERENCES §2.10)', () => {
    const k = CIRCLE_CUBIC_K;
    expect(rel(getSegmentLength(cubic(1, 0, 1, k, k, 1, 0, 1)), 1.571016698073855651)).toBeLessThan(1e-12);
  });

  it('measures a degenerate quadratic that doubles back on itself (B′ = 0 inside) as out and back (by hand)', () => {
    // P0 = 0, P1 = 2, P2 = 0.5 on the x axis: x(t) = 4t − 3.5t², turning at t = 4/7 where x = 8/7.
    expect(getSegmentLength(quad(0, 0, 2, 0, 0.5, 0))).toBeCloseTo(8 / 7 + (8 / 7 - 0.5), 13);
  });

  it('is 0 for a Bézier with all points equal, without hitting the depth cap', () => {
    expect(getBezierLength(cubic(2, 2, 2, 2, 2, 2, 2, 2))).toEqual({ value: 0, depthCapped: false });
  });
});

describe('getArcLength', () => {
  const table: [number, number, number][] = [
    [2, 1, 9.6884482205476761984],
    [10, 3, 43.859100695689089153],
    [100, 1, 400.10983297226518607],
    [4, 2, 19.376896441095352397],
    [1, 0, 4],
  ];
  for (const [a, b, perimeter] of table) {
    it(`gives the ellipse perimeter 4aE(m) of REFERENCES §2.4 for a = ${a}, b = ${b}`, () => {
      expect(rel(getArcLength(ellipseArc(0, 0, a, b)), perimeter)).toBeLessThan(1e-13);
      // Same ellipse with the axes swapped and with non-orthogonal conjugate diameters
      // U = (a cos α, b sin α), V = (−a sin α, b cos α) (an affine image of the unit circle).
      expect(rel(getArcLength(ellipseArc(0, 0, b, a)), perimeter)).toBeLessThan(1e-13);
      const al = 0.7;
      const skew = arc(0, 0, a * Math.cos(al), b * Math.sin(al), -a * Math.sin(al), b * Math.cos(al), 0.3, 2 * Math.PI);
      expect(rel(getArcLength(skew), perimeter)).toBeLessThan(1e-13);
    });
  }

  it('splits an ellipse into complementary arcs whose lengths sum to the perimeter (REFERENCES §5.5 last rows)', () => {
    const span = { start: 0, end: 0 };
    const large = arcFromSvgEndpoints(0, 0, 4, 2, 30, true, false, 5, 3, span) as Arc;
    const small = arcFromSvgEndpoints(0, 0, 4, 2, 30, false, true, 5, 3, span) as Arc;
    expect(rel(getArcLength(large), 13.35457867458234)).toBeLessThan(1e-13);
    expect(rel(getArcLength(small), 6.022317766513015)).toBeLessThan(1e-13);
  });

  const rows: [string, number, number, number, boolean, boolean, number][] = [
    ['M0 0 A5 5 0 0 1 10 0', 5, 5, 0, false, true, 15.70796326794897],
    ['M0 0 A5 5 0 0 0 10 0', 5, 5, 0, false, false, 15.70796326794897],
    ['M0 0 A2 2 0 0 1 10 0', 2, 2, 0, false, true, 15.70796326794897],
    ['M0 0 A10 10 0 0 1 10 0', 10, 10, 0, false, true, 10.47197551196598],
    ['M0 0 A10 10 0 1 1 10 0', 10, 10, 0, true, true, 52.35987755982989],
  ];
  for (const [d, rx, ry, phi, large, sweep, length] of rows) {
    it(`gives the length column of REFERENCES §5.5 for ${d}`, () => {
      const a = arcFromSvgEndpoints(0, 0, rx, ry, phi, large, sweep, 10, 0, { start: 0, end: 0 }) as Arc;
      expect(rel(getArcLength(a), length)).toBeLessThan(1e-14);
    });
  }

  for (const sweep of [1e-2, 1e-5, 1e-8, -1e-8, 1.5]) {
    it(`keeps its relative accuracy on a short elliptical arc of ${sweep} rad (reference: Simpson, 2000 panels)`, () => {
      const a = arc(0, 0, 10, 0, 0, 3, 1.1, sweep);
      const n = 2000, h = Math.abs(sweep) / n, dir = Math.sign(sweep);
      let s = 0;
      for (let i = 0; i <= n; i++) {
        const t = 1.1 + dir * i * h;
        s += (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2) * Math.hypot(10 * Math.sin(t), 3 * Math.cos(t));
      }
      const estimate = getArcLengthEstimate(a);
      expect(rel(estimate.value, (s * h) / 3)).toBeLessThan(1e-12);
      expect(estimate.depthCapped).toBe(false);
    });
  }

  it('agrees with Bézier-style quadrature of |P′(θ)| on a partial skewed arc (independent method: Simpson, 2e4 panels)', () => {
    const a = arc(3, -1, 5, 1, -0.5, 2, -2.2, 4.1);
    const n = 20000, h = a.sweep / n;
    let s = 0;
    for (let i = 0; i <= n; i++) {
      const t = a.theta0 + i * h;
      const w = i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2;
      s += w * Math.hypot(-a.ux * Math.sin(t) + a.vx * Math.cos(t), -a.uy * Math.sin(t) + a.vy * Math.cos(t));
    }
    expect(rel(getArcLength(a), Math.abs((s * h) / 3))).toBeLessThan(1e-12);
  });
});
