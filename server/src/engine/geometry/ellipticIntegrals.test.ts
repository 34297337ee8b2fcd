import { describe, expect, it } from 'vitest';
import { carlsonRD, carlsonRF, completeEllipticE, ellipticE } from './ellipticIntegrals';

/** Composite Simpson rule with n (even) panels — an independent check of E(φ | m) (from memory: h⁴ error). */
function simpson(f: (x: number) => number, a: number, b: number, n = 20000): number {
  const h = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (s * h) / 3;
}

describe('Carlson R_F and R_D', () => {
  it('match the test values of Carlson 1995 (Numer. Algorithms 10, §2–3) — from memory', () => {
    expect(carlsonRF(1, 2, 0)).toBeCloseTo(1.3110287771461, 12);
    expect(carlsonRF(2, 3, 4)).toBeCloseTo(0.58408284167715, 13);
    expect(carlsonRD(0, 2, 1)).toBeCloseTo(1.7972103521034, 12);
    expect(carlsonRD(2, 3, 4)).toBeCloseTo(0.16510527294261, 13);
  });

  it('give R_F(x, x, x) = x^(−1/2) and R_D(x, x, x) = x^(−3/2) (DLMF §19.20.1, §19.20.18)', () => {
    expect(carlsonRF(4, 4, 4)).toBeCloseTo(0.5, 15);
    expect(carlsonRD(4, 4, 4)).toBeCloseTo(0.125, 15);
  });

  it('are infinite where the integral diverges (DLMF §19.20)', () => {
    expect(carlsonRF(0, 0, 1)).toBe(Infinity);
    expect(carlsonRD(0, 0, 1)).toBe(Infinity);
  });
});

describe('ellipticE', () => {
  it('gives the ellipse perimeters 4a·E(m) of REFERENCES §2.4', () => {
    expect(4 * 2 * completeEllipticE(0.75)).toBeCloseTo(9.6884482205476761984, 13);
    expect(4 * 10 * completeEllipticE(1 - 0.09)).toBeCloseTo(43.859100695689089153, 12);
    expect(4 * 100 * completeEllipticE(1 - 1e-4, 1e-4)).toBeCloseTo(400.10983297226518607, 11);
    expect(completeEllipticE(1)).toBe(1); // DLMF §19.6.1: E(1) = 1
    expect(completeEllipticE(0)).toBeCloseTo(Math.PI / 2, 15); // DLMF §19.6.1: E(0) = π/2
  });

  for (const m of [0.1, 0.5, 0.9, 0.999]) {
    for (const phi of [0.3, 1.2, Math.PI / 2, 2.5, 7.1, -4]) {
      it(`agrees with Simpson quadrature of √(1 − m sin²θ) for φ = ${phi}, m = ${m} (DLMF §19.2.5)`, () => {
        const reference = simpson((t) => Math.sqrt(1 - m * Math.sin(t) ** 2), 0, phi);
        expect(ellipticE(phi, m)).toBeCloseTo(reference, 12);
      });
    }
  }

  it('is odd and quasi-periodic: E(φ + π) = E(φ) + 2E(m) (DLMF §19.2.10)', () => {
    expect(ellipticE(-0.7, 0.6)).toBeCloseTo(-ellipticE(0.7, 0.6), 15);
    expect(ellipticE(0.7 + Math.PI, 0.6)).toBeCloseTo(ellipticE(0.7, 0.6) + 2 * completeEllipticE(0.6), 14);
  });

  it('reduces to φ for m = 0 and to sin φ for m = 1 on [−π/2, π/2] (DLMF §19.6.9)', () => {
    expect(ellipticE(1.1, 0)).toBe(1.1);
    expect(ellipticE(1.1, 1)).toBe(Math.sin(1.1));
    expect(ellipticE(1.1 + Math.PI, 1)).toBeCloseTo(2 + Math.sin(1.1), 15);
  });
});
