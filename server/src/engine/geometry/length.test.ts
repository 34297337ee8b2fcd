import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints } from './arc';
import { getBezierCriticalParameters } from './bounds';
import { getArcLength, getArcLengthEstimate, getBezierLength, getSegmentLength, getSegmentLengthEstimate, getVectorLength } from './length';
import { BEZIER_LENGTH_REL_TOL } from './tolerances';
import { arc, circleArcs, CIRCLE_CUBIC_K, cubic, ellipseArc, line, quad } from '../../../../test/support/shapes';
import type { Arc, Cubic, Quad } from '../types';

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

describe('getVectorLength', () => {
  it('returns exactly what Math.hypot returns (the JavaScript builtin as reference; seed 99)', () => {
    const special = [0, -0, 1, -1, 3, 4, 5e-324, 2.2250738585072014e-308, 1e-300, 1e300, 1.7976931348623157e308, Infinity, -Infinity, NaN];
    for (const x of special) for (const y of special) expect(Object.is(getVectorLength(x, y), Math.hypot(x, y))).toBe(true);
    fc.assert(
      fc.property(fc.double(), fc.double(), (x, y) => Object.is(getVectorLength(x, y), Math.hypot(x, y))),
      { seed: 99, numRuns: 20000 },
    );
  });
});

/** High-order reference: 16-point Gauss–Legendre on 1024 panels between the critical parameters. */
function referenceLength(s: Quad | Cubic): number {
  const nodes = [0.0950125098376374402, 0.2816035507792589132, 0.4580167776572273863, 0.6178762444026437484,
    0.7554044083550030339, 0.8656312023878317439, 0.9445750230732325761, 0.9894009349916499326];
  const weights = [0.1894506104550684963, 0.1826034150449235889, 0.1691565193950025382, 0.1495959888165767321,
    0.1246289712555338721, 0.0951585116824927848, 0.0622535239386478929, 0.0271524594117540949];
  const speed = (t: number): number => {
    const u = 1 - t;
    if (s.kind === 'quad') return 2 * Math.hypot(u * (s.x1 - s.x0) + t * (s.x2 - s.x1), u * (s.y1 - s.y0) + t * (s.y2 - s.y1));
    const b0 = u * u, b1 = 2 * u * t, b2 = t * t;
    return 3 * Math.hypot(b0 * (s.x1 - s.x0) + b1 * (s.x2 - s.x1) + b2 * (s.x3 - s.x2), b0 * (s.y1 - s.y0) + b1 * (s.y2 - s.y1) + b2 * (s.y3 - s.y2));
  };
  const breaks = [0, ...getBezierCriticalParameters(s), 1];
  let total = 0;
  for (let i = 0; i + 1 < breaks.length; i++) {
    const lo = breaks[i]!, hi = breaks[i + 1]!, panels = 1024;
    for (let p = 0; p < panels; p++) {
      const a = lo + ((hi - lo) * p) / panels, b = lo + ((hi - lo) * (p + 1)) / panels;
      const m = (a + b) / 2, h = (b - a) / 2;
      let sum = 0;
      for (let k = 0; k < 8; k++) sum += weights[k]! * (speed(m - h * nodes[k]!) + speed(m + h * nodes[k]!));
      total += sum * h;
    }
  }
  return total;
}

describe('getBezierLength error bound', () => {
  it('is exact on straight cubics, whose length is the total variation along the line (by hand)', () => {
    expect(getBezierLength(cubic(0, 0, 1, 0, 2, 0, 3, 0)).value).toBeCloseTo(3, 15);
    expect(getBezierLength(cubic(0, 0, 0, 0, 0, 0, 3, 4)).value).toBeCloseTo(5, 15);
    // x(t) = 3t(1 − t)(1 − 2t) runs 0 → √3/6 → −√3/6 → 0: length 4·√3/6 = 2/√3.
    expect(rel(getBezierLength(cubic(0, 0, 1, 0, -1, 0, 0, 0)).value, 2 / Math.sqrt(3))).toBeLessThan(1e-14);
    // Control points on the end points: a straight quarter-speed start and stop.
    expect(rel(getBezierLength(cubic(0, 0, 0, 0, 4, 0, 4, 0)).value, 4)).toBeLessThan(1e-15);
  });

  it('stays within BEZIER_LENGTH_REL_TOL of a 1024-panel reference quadrature on random cubics and quads (seed 31337)', () => {
    const coord = fc.integer({ min: -100000, max: 100000 }).map((v) => v / 1000);
    fc.assert(
      fc.property(fc.array(coord, { minLength: 8, maxLength: 8 }), fc.boolean(), (p, isQuad) => {
        const s = isQuad ? quad(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!) : cubic(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!, p[6]!, p[7]!);
        const estimate = getBezierLength(s);
        const reference = referenceLength(s);
        expect(estimate.depthCapped).toBe(false);
        expect(Math.abs(estimate.value - reference)).toBeLessThanOrEqual(BEZIER_LENGTH_REL_TOL * reference);
      }),
      { seed: 31337, numRuns: 1000 },
    );
  });

  for (const e of [1e-2, 1e-6, 1e-10, 1e-14]) {
    it(`stays within BEZIER_LENGTH_REL_TOL near the cusp of REFERENCES §4.5, control point moved by ${e} (reference: 1024-panel quadrature)`, () => {
      const s = cubic(0, 0, 1, 1 + e, 0, 1, 1, 0);
      expect(rel(getBezierLength(s).value, referenceLength(s))).toBeLessThan(BEZIER_LENGTH_REL_TOL);
    });
  }

  it('measures a closed loop (chord 0) within BEZIER_LENGTH_REL_TOL of the reference quadrature', () => {
    const s = cubic(0, 0, 2, 2, -2, 2, 0, 0);
    const estimate = getBezierLength(s);
    expect(estimate.depthCapped).toBe(false);
    expect(rel(estimate.value, referenceLength(s))).toBeLessThan(BEZIER_LENGTH_REL_TOL);
  });

  it('measures a gentle benchmark-like cubic to 1e-14 of the reference quadrature', () => {
    const s = cubic(1000, 0, 1000.0047, 0.0207, 1000.0062, 0.0417, 1000.0046, 0.0628);
    expect(rel(getBezierLength(s).value, referenceLength(s))).toBeLessThan(1e-14);
  });
});
