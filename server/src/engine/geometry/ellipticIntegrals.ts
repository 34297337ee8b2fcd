/**
 * Carlson's symmetric elliptic integrals R_F and R_D and, built on them, Legendre's integral of the
 * second kind E(φ | m) = ∫₀^φ √(1 − m sin²θ) dθ for every real φ. Used for the exact length of
 * elliptical arcs.
 *
 * Source: B. C. Carlson, "Numerical computation of real or complex elliptic integrals",
 * Numerical Algorithms 10 (1995) 13–26 — duplication algorithms for R_F (§2) and R_D (§3) with
 * the fifth-order series; DLMF §19.25.9 (E(φ|m) in terms of R_F and R_D) and §19.20 (properties).
 * Parameter convention: m = k² (the "parameter", as in DLMF and mpmath `ellipe`), not the modulus k.
 */
import { CARLSON_REL_TOL } from './tolerances';

/**
 * Carlson's R_F(x, y, z) = ½∫₀^∞ dt / √((t+x)(t+y)(t+z)) for x, y, z ≥ 0, at most one of them 0.
 * Relative error about CARLSON_REL_TOL (Carlson 1995, §2: the neglected terms of the series are
 * below r when the loop stops). Returns Infinity when two arguments are 0 (the integral diverges).
 */
export function carlsonRF(x: number, y: number, z: number): number {
  if ((x === 0 && y === 0) || (x === 0 && z === 0) || (y === 0 && z === 0)) return Infinity;
  const a0 = (x + y + z) / 3;
  // Q = (3r)^(−1/6) · max |A0 − x_i|; stop when 4^−n Q < |A_n|.
  const q = Math.pow(3 * CARLSON_REL_TOL, -1 / 6) * Math.max(Math.abs(a0 - x), Math.abs(a0 - y), Math.abs(a0 - z));
  let xn = x, yn = y, zn = z, an = a0;
  let scale = 1; // 4^−n
  while (scale * q >= Math.abs(an)) {
    const sx = Math.sqrt(xn), sy = Math.sqrt(yn), sz = Math.sqrt(zn);
    const lambda = sx * sy + sx * sz + sy * sz;
    xn = (xn + lambda) / 4;
    yn = (yn + lambda) / 4;
    zn = (zn + lambda) / 4;
    an = (an + lambda) / 4;
    scale /= 4;
  }
  const X = ((a0 - x) * scale) / an;
  const Y = ((a0 - y) * scale) / an;
  const Z = -X - Y;
  const e2 = X * Y - Z * Z;
  const e3 = X * Y * Z;
  return (1 - e2 / 10 + e3 / 14 + (e2 * e2) / 24 - (3 * e2 * e3) / 44) / Math.sqrt(an);
}

/**
 * Carlson's R_D(x, y, z) = (3/2)∫₀^∞ dt / ((t+z)√((t+x)(t+y)(t+z))) for x, y ≥ 0 (not both 0), z > 0.
 * Relative error about CARLSON_REL_TOL (Carlson 1995, §3). Returns Infinity where it diverges.
 */
export function carlsonRD(x: number, y: number, z: number): number {
  if (z === 0 || (x === 0 && y === 0)) return Infinity;
  const a0 = (x + y + 3 * z) / 5;
  // Q = (r/4)^(−1/6) · max |A0 − x_i|.
  const q = Math.pow(CARLSON_REL_TOL / 4, -1 / 6) * Math.max(Math.abs(a0 - x), Math.abs(a0 - y), Math.abs(a0 - z));
  let xn = x, yn = y, zn = z, an = a0;
  let scale = 1; // 4^−n
  let sum = 0; // Σ 4^−k / (√z_k (z_k + λ_k))
  while (scale * q >= Math.abs(an)) {
    const sx = Math.sqrt(xn), sy = Math.sqrt(yn), sz = Math.sqrt(zn);
    const lambda = sx * sy + sx * sz + sy * sz;
    sum += scale / (sz * (zn + lambda));
    xn = (xn + lambda) / 4;
    yn = (yn + lambda) / 4;
    zn = (zn + lambda) / 4;
    an = (an + lambda) / 4;
    scale /= 4;
  }
  const X = ((a0 - x) * scale) / an;
  const Y = ((a0 - y) * scale) / an;
  const Z = -(X + Y) / 3;
  const xy = X * Y;
  const z2 = Z * Z;
  const e2 = xy - 6 * z2;
  const e3 = (3 * xy - 8 * z2) * Z;
  const e4 = 3 * (xy - z2) * z2;
  const e5 = xy * z2 * Z;
  const series =
    1 - (3 * e2) / 14 + e3 / 6 + (9 * e2 * e2) / 88 - (3 * e4) / 22 - (9 * e2 * e3) / 52 + (3 * e5) / 26;
  return (scale * series) / (an * Math.sqrt(an)) + 3 * sum;
}

/**
 * Complete integral of the second kind E(m) = E(π/2 | m), 0 ≤ m ≤ 1, with mc = 1 − m passed
 * separately when the caller knows it more accurately than 1 − m (thin ellipses).
 * DLMF §19.25.1: E(m) = R_F(0, 1−m, 1) − (m/3)·R_D(0, 1−m, 1).
 */
export function completeEllipticE(m: number, mc: number = 1 - m): number {
  if (mc === 0) return 1;
  return carlsonRF(0, mc, 1) - (m / 3) * carlsonRD(0, mc, 1);
}

/**
 * Incomplete integral of the second kind E(φ | m) = ∫₀^φ √(1 − m sin²θ) dθ, any real φ, 0 ≤ m ≤ 1
 * (mc = 1 − m, see completeEllipticE).
 * For |φ| ≤ π/2, DLMF §19.25.9: E = s·R_F(c², Δ², 1) − (m/3)·s³·R_D(c², Δ², 1), s = sin φ,
 * c = cos φ, Δ² = 1 − m s² = c² + mc·s². Outside, the integrand has period π and is even, so
 * E(kπ + φ | m) = 2k·E(m) + E(φ | m) (DLMF §19.2.10 with §19.7 for the odd extension).
 * For m = 1 the integrand is |cos θ| and E(φ | 1) = sin φ on [−π/2, π/2].
 * Absolute error ≈ (2|k| + 1)·CARLSON_REL_TOL·E(m) plus the rounding of φ − kπ.
 */
export function ellipticE(phi: number, m: number, mc: number = 1 - m): number {
  const k = Math.round(phi / Math.PI);
  const r = phi - k * Math.PI; // in [−π/2, π/2] up to rounding
  const whole = k === 0 ? 0 : 2 * k * completeEllipticE(m, mc);
  const s = Math.sin(r);
  if (mc === 0) return whole + s;
  if (m === 0) return whole + r;
  const c = Math.cos(r);
  const c2 = c * c;
  const delta2 = c2 + mc * s * s;
  return whole + s * carlsonRF(c2, delta2, 1) - (m / 3) * s * s * s * carlsonRD(c2, delta2, 1);
}
