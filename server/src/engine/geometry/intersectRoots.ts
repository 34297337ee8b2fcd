/**
 * Real roots of a polynomial on an interval, for the analytic curve–curve cases of intersect.ts
 * (line–Bézier, arc–Bézier, line–arc, arc–arc all reduce to one polynomial in one parameter).
 *
 * Method: isolate by recursion on the derivative — the roots of p′ split [lo, hi] into intervals on
 * which p is monotone, so each holds at most one root, found by bisection on a sign change.
 * A local extremum c with |p(c)| ≤ `touchTol` is also a root (a tangency: p touches zero without
 * changing sign, which no sign test can see). [src: standard; e.g. Press et al., *Numerical Recipes*
 * 3rd ed., §9.1 (bracketing and bisection) and the derivative-sequence isolation idea behind
 * Sturm/Descartes methods, §5.6 — the plain recursive form here is common practice, no source]
 */

/** Largest number of bisection steps for one root. 64 halvings shrink any double interval inside
 *  [−1e3, 1e3] below one ulp, so the cap only stops a run that cannot make progress. */
const MAX_BISECTION_STEPS = 64;

/** p(x) for coefficients in ascending powers (Horner). */
export function evaluatePolynomial(c: ArrayLike<number>, x: number): number {
  let v = 0;
  for (let i = c.length - 1; i >= 0; i--) v = v * x + c[i]!;
  return v;
}

function derivative(c: readonly number[]): number[] {
  const d: number[] = [];
  for (let i = 1; i < c.length; i++) d.push(c[i]! * i);
  return d;
}

/** Drops leading coefficients that are exactly zero (the degree is what is really there). */
function trim(c: readonly number[]): number[] {
  let n = c.length;
  while (n > 1 && c[n - 1] === 0) n--;
  return c.slice(0, n);
}

function bisect(c: readonly number[], a: number, b: number, fa: number): number {
  for (let i = 0; i < MAX_BISECTION_STEPS; i++) {
    const m = 0.5 * (a + b);
    if (m <= a || m >= b) break;
    const fm = evaluatePolynomial(c, m);
    if (fm === 0) return m;
    if ((fm < 0) === (fa < 0)) {
      a = m;
      fa = fm;
    } else {
      b = m;
    }
  }
  return 0.5 * (a + b);
}

/**
 * Roots of the polynomial with ascending coefficients `c` in [lo, hi], sorted, including touching
 * roots (|p| ≤ touchTol at a local extremum). Returns the sorted roots; duplicates closer than
 * the bisection resolution may appear once per monotone piece and are left to the caller to merge.
 */
export function getPolynomialRoots(coefficients: readonly number[], lo: number, hi: number, touchTol: number): number[] {
  const c = trim(coefficients);
  const out: number[] = [];
  if (c.length < 2) return out;
  if (c.length === 2) {
    const r = -c[0]! / c[1]!;
    if (r >= lo && r <= hi) out.push(r);
    return out;
  }
  const crit = getPolynomialRoots(derivative(c), lo, hi, 0);
  const knots = [lo, ...crit.filter((x) => x > lo && x < hi), hi];
  let prev = Number.NaN;
  const push = (x: number) => {
    if (x !== prev) out.push(x);
    prev = x;
  };
  let fa = evaluatePolynomial(c, lo);
  if (Math.abs(fa) <= touchTol) push(lo);
  for (let i = 1; i < knots.length; i++) {
    const a = knots[i - 1]!;
    const b = knots[i]!;
    const fb = evaluatePolynomial(c, b);
    if (fa !== 0 && fb !== 0 && (fa < 0) !== (fb < 0)) push(bisect(c, a, b, fa));
    if (fb === 0 || Math.abs(fb) <= touchTol) push(b);
    fa = fb;
  }
  return out;
}

/**
 * Appends to `out` what `getPolynomialRoots([c[0], c[1], c[2]], 0, 1, 0)` returns, with the same
 * floating-point operations in the same order and no allocation (buildPieces calls it twice per
 * Bézier segment; the coefficients come in a typed array because doubles passed as arguments to a
 * call that is not inlined are boxed).
 */
export function addQuadraticRootsInUnitInterval(out: number[], c: Float64Array): void {
  const c0 = c[0]!, c1 = c[1]!, c2 = c[2]!;
  if (c2 === 0) {
    if (c1 === 0) return;
    const r = -c0 / c1;
    if (r >= 0 && r <= 1) out.push(r);
    return;
  }
  // The critical point, the root of the derivative [c1·1, c2·2], splits [0, 1] when strictly inside.
  const crit = -(c1 * 1) / (c2 * 2);
  const inside = crit > 0 && crit < 1;
  let prev = Number.NaN;
  // p(x) written out as evaluatePolynomial's Horner steps: ((0·x + c2)·x + c1)·x + c0, where
  // 0·x + c2 = c2 exactly for x ≥ 0 and c2 ≠ 0.
  let fa = (c2 * 0 + c1) * 0 + c0;
  if (fa === 0) { out.push(0); prev = 0; }
  let a = 0;
  for (let k = inside ? 0 : 1; k < 2; k++) {
    const b = k === 0 ? crit : 1;
    const fb = (c2 * b + c1) * b + c0;
    if (fa !== 0 && fb !== 0 && (fa < 0) !== (fb < 0)) {
      // bisect(c, a, b, fa), inlined.
      let lo = a, hi = b, flo = fa;
      let x = Number.NaN;
      for (let i = 0; i < MAX_BISECTION_STEPS; i++) {
        const m = 0.5 * (lo + hi);
        if (m <= lo || m >= hi) break;
        const fm = (c2 * m + c1) * m + c0;
        if (fm === 0) { x = m; break; }
        if ((fm < 0) === (flo < 0)) { lo = m; flo = fm; } else { hi = m; }
      }
      if (Number.isNaN(x)) x = 0.5 * (lo + hi);
      if (x !== prev) out.push(x);
      prev = x;
    }
    if (fb === 0) {
      if (b !== prev) out.push(b);
      prev = b;
    }
    fa = fb;
    a = b;
  }
}

/**
 * Power-basis coefficients of one coordinate of a Bézier curve of degree 1–3 given its Bernstein
 * control values. [src: standard Bernstein-to-monomial conversion, e.g. Farin, *Curves and Surfaces
 * for CAGD*, §5 — from memory; checked by evaluating both forms in the tests]
 */
export function getBezierPowerCoefficients(v: readonly number[]): number[] {
  if (v.length === 2) return [v[0]!, v[1]! - v[0]!];
  if (v.length === 3) return [v[0]!, 2 * (v[1]! - v[0]!), v[0]! - 2 * v[1]! + v[2]!];
  const [p0, p1, p2, p3] = v as [number, number, number, number];
  return [p0, 3 * (p1 - p0), 3 * (p0 - 2 * p1 + p2), p3 - p0 + 3 * (p1 - p2)];
}
