import { describe, expect, it } from 'vitest';
import { evaluatePolynomial, getBezierPowerCoefficients, getPolynomialRoots } from './intersectRoots';

describe('getPolynomialRoots', () => {
  it('finds the three simple roots of (t − ¼)(t − ½)(t − ¾) (expanded by hand: t³ − 1.5t² + 0.6875t − 0.09375)', () => {
    const r = getPolynomialRoots([-0.09375, 0.6875, -1.5, 1], 0, 1, 0);
    expect(r).toHaveLength(3);
    [0.25, 0.5, 0.75].forEach((v, i) => expect(r[i]).toBeCloseTo(v, 14));
  });
  it('finds a double root (a tangency) that no sign change reveals: (t − 0.3)² = t² − 0.6t + 0.09', () => {
    const r = getPolynomialRoots([0.09, -0.6, 1], 0, 1, 1e-15);
    expect(r.some((x) => Math.abs(x - 0.3) < 1e-7)).toBe(true);
  });
  it('finds nothing for t² + 1 on [−10, 10] (no real roots)', () => {
    expect(getPolynomialRoots([1, 0, 1], -10, 10, 0)).toEqual([]);
  });
});

describe('getBezierPowerCoefficients', () => {
  it('agrees with the Bernstein form of a cubic at 11 parameters (Bernstein polynomials, by definition)', () => {
    const v = [0.3, -2, 5, 1.5];
    const c = getBezierPowerCoefficients(v);
    for (let k = 0; k <= 10; k++) {
      const t = k / 10, s = 1 - t;
      const bern = v[0]! * s ** 3 + 3 * v[1]! * t * s * s + 3 * v[2]! * t * t * s + v[3]! * t ** 3;
      expect(evaluatePolynomial(c, t)).toBeCloseTo(bern, 13);
    }
  });
});
