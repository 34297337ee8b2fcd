import { describe, expect, it } from 'vitest';
import { addQuadraticRootsInUnitInterval, evaluatePolynomial, getBezierPowerCoefficients, getPolynomialRoots } from './intersectRoots';

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

describe('addQuadraticRootsInUnitInterval', () => {
  it('returns exactly what getPolynomialRoots returns on [0, 1] with no touch tolerance (its allocation-free twin)', () => {
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 2 - 1;
    const values = [0, -0, 1, -1, 0.5, 1e-300, -1e300, 3];
    const cases: [number, number, number][] = [[0.09, -0.6, 1], [0.25, -1, 1], [0, 0, 0], [0, 0, 1], [1, 0, 0], [0, 1, 0], [-1, 2, 0]];
    for (const a of values) for (const b of values) for (const c of values) cases.push([a, b, c]);
    for (let k = 0; k < 2000; k++) cases.push([random(), random() * 2, random() * 3]);
    for (const [c0, c1, c2] of cases) {
      const out = [7];
      addQuadraticRootsInUnitInterval(out, Float64Array.of(c0, c1, c2));
      expect(out).toEqual([7, ...getPolynomialRoots([c0, c1, c2], 0, 1, 0)]);
    }
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
