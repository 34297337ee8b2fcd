import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints, getArcPoint } from './arc';
import type { Arc } from '../types';

const SPAN = { start: 3, end: 17 };
const deg = (d: number) => (d * Math.PI) / 180;

/** Rows of REFERENCES §5.5 (SVG 1.1 F.6.5 conversion, recomputed there with mpmath). */
const rows: {
  d: string;
  args: [number, number, number, boolean, boolean, number, number];
  centre: [number, number];
  theta1Deg: number;
  dThetaDeg: number;
}[] = [
  { d: 'M0 0 A5 5 0 0 1 10 0', args: [5, 5, 0, false, true, 10, 0], centre: [5, 0], theta1Deg: 180, dThetaDeg: 180 },
  { d: 'M0 0 A5 5 0 0 0 10 0', args: [5, 5, 0, false, false, 10, 0], centre: [5, 0], theta1Deg: 180, dThetaDeg: -180 },
  { d: 'M0 0 A2 2 0 0 1 10 0', args: [2, 2, 0, false, true, 10, 0], centre: [5, 0], theta1Deg: 180, dThetaDeg: 180 },
  { d: 'M0 0 A10 10 0 0 1 10 0', args: [10, 10, 0, false, true, 10, 0], centre: [5, 8.660254037844386], theta1Deg: -120, dThetaDeg: 60 },
  { d: 'M0 0 A10 10 0 1 1 10 0', args: [10, 10, 0, true, true, 10, 0], centre: [5, -8.660254037844386], theta1Deg: 120, dThetaDeg: 300 },
  { d: 'M0 0 A4 2 30 1 0 5 3', args: [4, 2, 30, true, false, 5, 3], centre: [1.7363514101001, 2.63859177966098], theta1Deg: -134.890578159557, dThetaDeg: -266.364907664464 },
  { d: 'M0 0 A4 2 30 0 1 5 3', args: [4, 2, 30, false, true, 5, 3], centre: [1.7363514101001, 2.63859177966098], theta1Deg: -134.890578159557, dThetaDeg: 93.6350923355364 },
];

function convert(args: [number, number, number, boolean, boolean, number, number]) {
  const [rx, ry, phi, large, sweep, x2, y2] = args;
  return arcFromSvgEndpoints(0, 0, rx, ry, phi, large, sweep, x2, y2, SPAN);
}

describe('arcFromSvgEndpoints', () => {
  for (const row of rows) {
    it(`gives the centre, start angle and sweep of REFERENCES §5.5 for ${row.d}`, () => {
      const a = convert(row.args) as Arc;
      expect(a.kind).toBe('arc');
      expect(a.cx).toBeCloseTo(row.centre[0], 11);
      expect(a.cy).toBeCloseTo(row.centre[1], 11);
      expect(a.theta0).toBeCloseTo(deg(row.theta1Deg), 11);
      expect(a.sweep).toBeCloseTo(deg(row.dThetaDeg), 11);
    });

    it(`puts both stored end points on the computed ellipse for ${row.d} (SVG 1.1 F.6.5.3 round trip)`, () => {
      const a = convert(row.args) as Arc;
      const [sx, sy] = getArcPoint(a, a.theta0);
      const [ex, ey] = getArcPoint(a, a.theta0 + a.sweep);
      expect(Math.hypot(sx - a.x0, sy - a.y0)).toBeLessThan(1e-12);
      expect(Math.hypot(ex - a.x1, ey - a.y1)).toBeLessThan(1e-12);
      expect([a.x0, a.y0, a.x1, a.y1]).toEqual([0, 0, row.args[5], row.args[6]]);
      expect(a.span).toBe(SPAN);
    });
  }

  it('scales radii that are too small up to the half chord (REFERENCES §5.5 row 3, Λ = 6.25 → r = 5)', () => {
    const a = convert([2, 2, 0, false, true, 10, 0]) as Arc;
    expect(Math.hypot(a.ux, a.uy)).toBeCloseTo(5, 12);
    expect(Math.hypot(a.vx, a.vy)).toBeCloseTo(5, 12);
  });

  it('builds U = rx(cos φ, sin φ), V = ry(−sin φ, cos φ) (types.ts contract; SVG 1.1 F.6.3)', () => {
    const a = convert([4, 2, 30, false, true, 5, 3]) as Arc;
    expect(a.ux).toBeCloseTo(4 * Math.cos(deg(30)), 14);
    expect(a.uy).toBeCloseTo(4 * Math.sin(deg(30)), 14);
    expect(a.vx).toBeCloseTo(-2 * Math.sin(deg(30)), 14);
    expect(a.vy).toBeCloseTo(2 * Math.cos(deg(30)), 14);
  });

  it('omits an arc whose end points coincide (SVG 1.1 F.6.2)', () => {
    expect(arcFromSvgEndpoints(1, 2, 5, 5, 0, false, true, 1, 2, SPAN)).toBeNull();
  });

  it('treats a zero radius as a straight line (SVG 1.1 F.6.2)', () => {
    expect(arcFromSvgEndpoints(0, 0, 0, 5, 0, false, true, 3, 4, SPAN)).toEqual({
      kind: 'line', x0: 0, y0: 0, x1: 3, y1: 4, span: SPAN,
    });
  });

  it('takes the absolute value of negative radii (SVG 1.1 F.6.6.1)', () => {
    const a = arcFromSvgEndpoints(0, 0, -5, -5, 0, false, true, 10, 0, SPAN) as Arc;
    expect(a.cx).toBeCloseTo(5, 14);
    expect(a.sweep).toBeCloseTo(Math.PI, 14);
  });
});
