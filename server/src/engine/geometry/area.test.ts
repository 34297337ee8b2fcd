import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints } from './arc';
import { CompensatedSum, getSegmentArea } from './area';
import { arc, cubic, line, quad } from '../../../../test/support/shapes';
import type { Arc } from '../types';

describe('getSegmentArea', () => {
  it('gives ½ P0×P1 for a line (REFERENCES §4.2)', () => {
    expect(getSegmentArea(line(1, 2, 3, 5))).toBe((1 * 5 - 2 * 3) / 2);
  });

  it('closes the cubic of REFERENCES §4.2 by its chord to −21/5', () => {
    expect(getSegmentArea(cubic(0, 0, 1, 2, 3, 2, 4, 0)) + getSegmentArea(line(4, 0, 0, 0))).toBeCloseTo(-4.2, 15);
  });

  it('closes the quadratic of REFERENCES §4.2 by its chord to −4/3', () => {
    expect(getSegmentArea(quad(0, 0, 1, 2, 2, 0)) + getSegmentArea(line(2, 0, 0, 0))).toBeCloseTo(-4 / 3, 15);
  });

  it('does not depend on the origin once the loop is closed (Green\'s theorem, REFERENCES §4.1)', () => {
    const loop = [cubic(0, 0, 1, 2, 3, 2, 4, 0), line(4, 0, 0, 0)];
    const about = (ox: number, oy: number) => loop.reduce((s, g) => s + getSegmentArea(g, ox, oy), 0);
    expect(about(7, -3)).toBeCloseTo(-4.2, 13);
    expect(about(-1e3, 2e3)).toBeCloseTo(-4.2, 10);
  });

  const rows: [string, number, number, number, boolean, boolean, number, number, number][] = [
    ['M0 0 A5 5 0 0 1 10 0', 5, 5, 0, false, true, 10, 0, 39.26990816987242],
    ['M0 0 A5 5 0 0 0 10 0', 5, 5, 0, false, false, 10, 0, -39.26990816987242],
    ['M0 0 A2 2 0 0 1 10 0', 2, 2, 0, false, true, 10, 0, 39.26990816987242],
    ['M0 0 A10 10 0 0 1 10 0', 10, 10, 0, false, true, 10, 0, 9.058607370607955],
    ['M0 0 A10 10 0 1 1 10 0', 10, 10, 0, true, true, 10, 0, 305.1006579883714],
    ['M0 0 A4 2 30 1 0 5 3', 4, 2, 30, true, false, 5, 3, -22.58773093606459],
    ['M0 0 A4 2 30 0 1 5 3', 4, 2, 30, false, true, 5, 3, 2.545010292653753],
  ];
  for (const [d, rx, ry, phi, large, sweep, x, y, green] of rows) {
    it(`gives the "green" column of REFERENCES §5.5 for ${d}`, () => {
      const a = arcFromSvgEndpoints(0, 0, rx, ry, phi, large, sweep, x, y, { start: 0, end: 0 }) as Arc;
      expect(getSegmentArea(a)).toBeCloseTo(green, 12);
      // REFERENCES §4.3 centre form: ½[rx·ry·Δθ + cx(y2 − y1) − cy(x2 − x1)] (rx, ry after F.6.6 scaling).
      const rxry = a.ux * a.vy - a.uy * a.vx;
      expect(getSegmentArea(a)).toBeCloseTo((rxry * a.sweep + a.cx * y - a.cy * x) / 2, 12);
    });
  }

  it('matches Simpson quadrature of ½(x y′ − y x′) on a skewed elliptical arc (independent method)', () => {
    const a = arc(3, -1, 5, 1, -0.5, 2, -2.2, 4.1);
    const n = 20000, h = a.sweep / n;
    let s = 0;
    for (let i = 0; i <= n; i++) {
      const t = a.theta0 + i * h;
      const x = a.cx + a.ux * Math.cos(t) + a.vx * Math.sin(t);
      const y = a.cy + a.uy * Math.cos(t) + a.vy * Math.sin(t);
      const dx = -a.ux * Math.sin(t) + a.vx * Math.cos(t);
      const dy = -a.uy * Math.sin(t) + a.vy * Math.cos(t);
      s += (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2) * (x * dy - y * dx);
    }
    expect(getSegmentArea(a)).toBeCloseTo((s * h) / 6, 10);
  });
});

describe('CompensatedSum', () => {
  it('sums 1 + 1e100 + 1 − 1e100 to 2 (Neumaier\'s example, where plain and Kahan summation give 0)', () => {
    const sum = new CompensatedSum();
    for (const x of [1, 1e100, 1, -1e100]) sum.add(x);
    expect(sum.value).toBe(2);
  });

  it('returns Infinity, not NaN, once a summand overflows (IEEE 754 semantics of the plain sum)', () => {
    const sum = new CompensatedSum();
    sum.add(1);
    sum.add(Infinity);
    sum.add(2);
    expect(sum.value).toBe(Infinity);
  });
});
