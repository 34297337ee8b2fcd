import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { arc, circleArcs, contourFromSegments, contoursFromPathData, ellipseArc, getContourPolyline, line, polygonSegments, regularPolygonPoints } from '../../../../test/support/shapes';
import { measureContour } from './measure';
import { getConvexHull, getPolylineHull } from './hull';
import type { Contour } from '../types';
import { findSelfIntersections, MAX_MEETINGS } from './intersect';
import { buildChordTree, createOutlineDistance, getLargestInscribedCircle, getMinimumZone, getRoundness, getSmallestEnclosingCircle, getWindingSquaredArea, type SearchPiece } from './roundness';

const polygon = (pts: readonly (readonly [number, number])[]) => contourFromSegments(polygonSegments(pts, false), true);
/** Roundness and hull of a contour, told whether it crosses itself by the intersection search. */
const figuresOf = (c: Contour) => {
  const crossing = findSelfIntersections(c).intersections.some((x) => x.kind === 'crossing');
  const { roundness, hull } = getRoundness(c, measureContour(c, 'up'), crossing);
  return { ...roundness, hull, convexity: hull.convexity };
};
const roundnessOf = (pts: readonly (readonly [number, number])[]) => figuresOf(polygon(pts));

describe('roundness check values', () => {
  for (const n of [3, 4, 6, 8, 12]) {
    it(`gives a regular ${n}-gon R = 1, ρ = cos(π/n) and t_MZ = 1 − cos(π/n) (REFERENCES.md §2.2)`, () => {
      const r = roundnessOf(regularPolygonPoints(n, 1, 0, 0, 0.3));
      expect(r.circumradius.value!.valueMm).toBeCloseTo(1, 12);
      // Within the stated branch-and-bound bound (polygon: no flattening error).
      expect(Math.abs(r.inradius.value!.valueMm - Math.cos(Math.PI / n))).toBeLessThanOrEqual(r.inradius.value!.errorBoundMm + 1e-12);
      expect(Math.abs(r.minZone.value!.valueMm - (1 - Math.cos(Math.PI / n)))).toBeLessThanOrEqual(r.minZone.value!.errorBoundMm + 1e-12);
      expect(r.minZone.value!.errorBoundMm).toBeLessThanOrEqual(1e-7);
    });
  }

  it('finds the minimum zone of the 8-point set: width 0.092529118610475061 at (−0.00104961, 0.05452228) (REFERENCES.md §3.4)', () => {
    const pts: [number, number][] = [[1, 0], [0, 1.1], [-1, 0.1], [0.1, -0.9], [0.7, 0.7], [-0.72, 0.68], [-0.7, -0.71], [0.69, -0.73]];
    const mz = getMinimumZone(pts, { asPoints: true, tolerance: 1e-12 });
    expect(Math.abs(mz.widthMm - 0.092529118610475061)).toBeLessThanOrEqual(mz.errorBoundMm + 1e-15);
    expect(mz.widthMm).toBeCloseTo(0.092529118610475061, 10);
    expect(mz.centreX).toBeCloseTo(-0.0010496095544327056, 6);
    expect(mz.centreY).toBeCloseTo(0.054522278364722095, 6);
    const mcc = getSmallestEnclosingCircle(pts);
    expect(mcc.r).toBeCloseTo(1.0427688375374198, 12); // §3.4 MCC radius
    expect(mcc.x).toBeCloseTo(0.0061834459860073521, 12);
  });

  it('gives an ellipse 2×1 R = 2, ρ = 1, t_MZ = a − b = 1 within its stated bound (REFERENCES.md §2.4, §3.4)', () => {
    const c = contourFromSegments([ellipseArc(0, 0, 2, 1)], true);
    const r = figuresOf(c);
    expect(Math.abs(r.circumradius.value!.valueMm - 2)).toBeLessThanOrEqual(r.circumradius.value!.errorBoundMm + 1e-12);
    expect(Math.abs(r.inradius.value!.valueMm - 1)).toBeLessThanOrEqual(r.inradius.value!.errorBoundMm + 1e-9);
    expect(Math.abs(r.minZone.value!.valueMm - 1)).toBeLessThanOrEqual(r.minZone.value!.errorBoundMm + 1e-9);
  });

  it('gives the L-shape R = √2 and ρ = 2 − √2 (REFERENCES.md §2.8)', () => {
    const r = roundnessOf([[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]);
    expect(r.circumradius.value!.valueMm).toBeCloseTo(Math.SQRT2, 12);
    expect(Math.abs(r.inradius.value!.valueMm - (2 - Math.SQRT2))).toBeLessThanOrEqual(r.inradius.value!.errorBoundMm + 1e-12);
    expect(r.bonnesenBoundMm.value!).toBeCloseTo(Math.sqrt(26.30088815692248) / Math.PI, 12);
  });

  it('gives the 5-point star (outer 1, inner 0.4) R = 1, ρ = 0.4 and R − ρ within Bonnesen (REFERENCES.md §2.8)', () => {
    const pts: [number, number][] = [];
    for (let k = 0; k < 10; k++) {
      const r = k % 2 === 0 ? 1 : 0.4, a = Math.PI / 2 + (k * Math.PI) / 5;
      pts.push([r * Math.cos(a), r * Math.sin(a)]);
    }
    const r = roundnessOf(pts);
    expect(r.circumradius.value!.valueMm).toBeCloseTo(1, 12);
    expect(Math.abs(r.inradius.value!.valueMm - 0.4)).toBeLessThanOrEqual(r.inradius.value!.errorBoundMm + 1e-12);
    expect(r.radiusGapMm.value!).toBeLessThanOrEqual(r.bonnesenBoundMm.value!);
  });

  it('computes ∬w² dA = 2 for the bow-tie and flags Q/D as meaningless (REFERENCES.md §1.4)', () => {
    const r = roundnessOf([[0, 0], [2, 2], [2, 0], [0, 2]]);
    expect(r.selfCrossing).toBe(true);
    expect(r.windingSquaredAreaMm2.value).toBeCloseTo(2, 12);
    expect(r.bonnesenBoundMm.value).toBeNull();
    expect(r.minZone.value).toBeNull();
  });

  it('leaves ∬w² dA undefined when the polygon crosses itself in more places than the search examines (star {999/499}: n(k − 1) = 999·498 crossings, closed form)', () => {
    // Star polygon {n/k}: each edge crosses 2(k − 1) others, n(k − 1) crossings in all (n, k coprime).
    const n = 999, k = 499;
    expect(n * (k - 1)).toBeGreaterThan(MAX_MEETINGS);
    const r = roundnessOf(Array.from({ length: n }, (_, i) => [Math.cos((2 * Math.PI * k * i) / n), Math.sin((2 * Math.PI * k * i) / n)] as const));
    expect(r.selfCrossing).toBe(true);
    expect(r.windingSquaredAreaMm2).toMatchObject({ value: null, reason: expect.stringContaining('more places than the intersection search examines') });
  });

  it('gives a square hull area 1, perimeter 4 and convexity 1; an L-shape convexity 3/3.5 (by hand)', () => {
    expect(getPolylineHull(getContourPolyline(polygon([[0, 0], [1, 0], [1, 1], [0, 1]]), 0))).toMatchObject({ areaMm2: 1, perimeterMm: 4 });
    const r = roundnessOf([[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]);
    expect(r.convexity.value).toBeCloseTo(3 / 3.5, 12);
  });
});

describe('finely divided outlines (more search pieces than MAX_ROUNDNESS_PIECES: chords reduced, bound widened)', () => {
  it('gives a regular 10 000-gon R = 1, ρ = cos(π/n) and t_MZ = 1 − cos(π/n) within the stated bounds, which stay below 2e-5 (REFERENCES.md §2.2)', () => {
    const n = 10_000;
    const r = roundnessOf(regularPolygonPoints(n, 1, 0, 0, 0.3));
    const rho = r.inradius.value!, mz = r.minZone.value!;
    expect(Math.abs(rho.valueMm - Math.cos(Math.PI / n))).toBeLessThanOrEqual(rho.errorBoundMm + 1e-12);
    expect(Math.abs(mz.valueMm - (1 - Math.cos(Math.PI / n)))).toBeLessThanOrEqual(mz.errorBoundMm + 1e-12);
    expect(rho.errorBoundMm).toBeLessThan(2e-5);
    expect(mz.errorBoundMm).toBeLessThan(2e-5);
    expect(r.circumradius.value!.valueMm).toBeCloseTo(1, 12);
  });

  it('gives a circle of radius 50 drawn as 4000 arcs ρ = R = 50 and t_MZ = 0 within the stated bounds (the arcs\' ends alone exceed the pieces searched, so their chords are reduced; definition of the circle)', () => {
    const n = 4000, r0 = 50;
    const segs = Array.from({ length: n }, (_, i) => arc(0, 0, r0, 0, 0, r0, (2 * Math.PI * i) / n, (2 * Math.PI) / n));
    const r = figuresOf(contourFromSegments(segs, true, [r0, 0]));
    const rho = r.inradius.value!, mz = r.minZone.value!;
    expect(Math.abs(rho.valueMm - r0)).toBeLessThanOrEqual(rho.errorBoundMm + 1e-9);
    expect(mz.valueMm).toBeLessThanOrEqual(mz.errorBoundMm + 1e-9);
    expect(mz.errorBoundMm).toBeLessThan(1e-5 * r0);
  });

  it('gives a stadium a = 20, r = 10 whose straight sides are 3000 short lines each ρ = r = 10 within the stated bound, its two arcs kept exact (REFERENCES.md §2.5)', () => {
    const side = (x0: number, x1: number, y: number) => Array.from({ length: 3000 }, (_, k) => line(x0 + ((x1 - x0) * k) / 3000, y, x0 + ((x1 - x0) * (k + 1)) / 3000, y));
    const c = contourFromSegments([
      ...side(0, 20, -10), arc(20, 0, 10, 0, 0, 10, -Math.PI / 2, Math.PI),
      ...side(20, 0, 10), arc(0, 0, 10, 0, 0, 10, Math.PI / 2, Math.PI),
    ], true, [0, -10]);
    const rho = figuresOf(c).inradius.value!;
    expect(Math.abs(rho.valueMm - 10)).toBeLessThanOrEqual(rho.errorBoundMm + 1e-12);
    // Collinear chords thin to their ends with no deviation, and the arcs stay arcs: the bound is the search's.
    expect(rho.errorBoundMm).toBeLessThan(1e-6);
  });

  it('gives a 100 × 60 rectangle with corners of radius 10, each drawn as 2000 lines, ρ = 30 and R = √(40² + 20²) + 10 within the stated bounds (elementary geometry)', () => {
    const pts: [number, number][] = [];
    const corners: [number, number, number][] = [[40, 20, 0], [-40, 20, Math.PI / 2], [-40, -20, Math.PI], [40, -20, 1.5 * Math.PI]];
    for (const [cx, cy, a0] of corners) for (let i = 0; i <= 2000; i++) {
      const a = a0 + (Math.PI / 2) * (i / 2000);
      pts.push([cx + 10 * Math.cos(a), cy + 10 * Math.sin(a)]);
    }
    const r = roundnessOf(pts);
    const rho = r.inradius.value!, big = r.circumradius.value!;
    expect(Math.abs(rho.valueMm - 30)).toBeLessThanOrEqual(rho.errorBoundMm + 1e-9);
    expect(rho.errorBoundMm).toBeLessThan(1e-4);
    // The vertices lie on the corner arcs, π/4000 apart: the farthest of them falls short of the true
    // farthest point by at most the sagitta of half a step, 10(1 − cos(π/8000)).
    const trueR = Math.hypot(40, 20) + 10;
    expect(big.valueMm).toBeLessThanOrEqual(trueR + 1e-12);
    expect(big.valueMm).toBeGreaterThanOrEqual(trueR - 10 * (1 - Math.cos(Math.PI / 8000)) - 1e-12);
  });
});

describe('smallest enclosing circle', () => {
  // Reference: Welzl's move-to-front iteration (Welzl 1991, REFERENCES.md §3.3) as roundness.ts had
  // it, deciding "inside" with Math.hypot; the fast test must take every decision the same way.
  const welzlWithHypot = (points: readonly (readonly [number, number])[]) => {
    type C = { x: number; y: number; r: number };
    const p = [...points];
    let seed = 12345;
    for (let i = p.length - 1; i > 0; i--) {
      seed = (seed * 1103515245 + 12345) & 0x7fffffff;
      const j = seed % (i + 1);
      [p[i], p[j]] = [p[j]!, p[i]!];
    }
    const inside = (c: C, q: readonly number[]) => Math.hypot(q[0]! - c.x, q[1]! - c.y) <= c.r * (1 + 1e-14) + 1e-300;
    const two = (a: readonly number[], b: readonly number[]): C => {
      const x = (a[0]! + b[0]!) / 2, y = (a[1]! + b[1]!) / 2;
      return { x, y, r: Math.hypot(a[0]! - x, a[1]! - y) };
    };
    const three = (a: readonly number[], b: readonly number[], c: readonly number[]): C | null => {
      const bx = b[0]! - a[0]!, by = b[1]! - a[1]!, cx = c[0]! - a[0]!, cy = c[1]! - a[1]!;
      const d = 2 * (bx * cy - by * cx);
      if (d === 0) return null;
      const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
      const ux = (cy * b2 - by * c2) / d, uy = (bx * c2 - cx * b2) / d;
      return { x: a[0]! + ux, y: a[1]! + uy, r: Math.hypot(ux, uy) };
    };
    let c: C = { x: p[0]![0], y: p[0]![1], r: 0 };
    for (let i = 1; i < p.length; i++) {
      if (inside(c, p[i]!)) continue;
      c = { x: p[i]![0], y: p[i]![1], r: 0 };
      for (let j = 0; j < i; j++) {
        if (inside(c, p[j]!)) continue;
        c = two(p[i]!, p[j]!);
        for (let k = 0; k < j; k++) if (!inside(c, p[k]!)) c = three(p[i]!, p[j]!, p[k]!) ?? c;
      }
    }
    return c;
  };

  it('takes the decisions of the Math.hypot test on near-cocircular, repeated and tiny point sets (reference: Welzl with Math.hypot; fast-check, seed 61)', () => {
    const set = fc.tuple(fc.integer({ min: 1, max: 60 }), fc.double({ min: 1e-200, max: 1e6, noNaN: true }), fc.double({ min: 0, max: 1e-13, noNaN: true }), fc.boolean())
      .map(([n, r, wobble, repeat]) => Array.from({ length: n }, (_, k) => {
        const a = repeat ? k % 7 : k * 0.7, rr = r * (1 + wobble * Math.sin(13 * k));
        return [rr * Math.cos(a), rr * Math.sin(a)] as [number, number];
      }));
    fc.assert(fc.property(set, (pts) => { expect(getSmallestEnclosingCircle(pts)).toEqual(welzlWithHypot(pts)); }), { seed: 61, numRuns: 200 });
  });
});

describe('winding-squared integral', () => {
  // Reference: the slab integral visiting every edge for every slab, in drawing order (REFERENCES.md §1.4).
  const allEdgesSlabs = (points: readonly (readonly [number, number])[]) => {
    const ys = [...new Set(points.map((p) => p[1]))].sort((a, b) => a - b);
    let total = 0;
    for (let k = 0; k + 1 < ys.length; k++) {
      const y = (ys[k]! + ys[k + 1]!) / 2;
      const xs: [number, number][] = [];
      for (let i = 0, j = points.length - 1; i < points.length; j = i++) {
        const a = points[j]!, b = points[i]!;
        if ((a[1] > y) === (b[1] > y)) continue;
        xs.push([a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]), b[1] > a[1] ? 1 : -1]);
      }
      xs.sort((p, q) => p[0] - q[0]);
      let w = xs.reduce((sum, c) => sum + c[1], 0), line = 0;
      for (let i = 0; i + 1 < xs.length; i++) { w -= xs[i]![1]; line += w * w * (xs[i + 1]![0] - xs[i]![0]); }
      total += line * (ys[k + 1]! - ys[k]!);
    }
    return total;
  };

  it('equals the all-edges slab sum to the last bit on random polylines with ties and level edges (reference: all-edges slabs; fast-check, seed 71)', () => {
    const coordinate = fc.oneof(fc.integer({ min: -6, max: 6 }), fc.double({ min: -10, max: 10, noNaN: true }));
    fc.assert(fc.property(fc.array(fc.tuple(coordinate, coordinate), { minLength: 3, maxLength: 60 }), (pts) => {
      expect(Object.is(getWindingSquaredArea(pts), allEdgesSlabs(pts))).toBe(true);
    }), { seed: 71, numRuns: 500 });
  });
});

describe('inequalities on random shapes (fast-check, seeded)', () => {
  // Star-shaped polygons from sorted angles are simple.
  const starPolygon = fc.array(fc.tuple(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.2, max: 5, noNaN: true })), { minLength: 3, maxLength: 16 })
    .map((a) => [...a].sort((p, q) => p[0] - q[0]).map(([t, r]) => [r * Math.cos(t), r * Math.sin(t)] as [number, number]));

  it('L² ≥ 4πA on random simple polygons (REFERENCES.md §1.1; seed 3)', () => {
    fc.assert(fc.property(starPolygon, (pts) => {
      const m = measureContour(polygon(pts), 'up');
      expect(m.lengthMm ** 2).toBeGreaterThanOrEqual(4 * Math.PI * (m.areaMm2.value ?? 0) * (1 - 1e-12));
    }), { seed: 3, numRuns: 300 });
  });

  it('R − ρ ≤ √D/π on random convex polygons (Bonnesen, REFERENCES.md §1.2; seed 5)', () => {
    fc.assert(fc.property(starPolygon, (raw) => {
      const pts = getConvexHull(raw);
      if (pts.length < 3) return;
      const r = roundnessOf(pts);
      expect(r.radiusGapMm.value!).toBeLessThanOrEqual(r.bonnesenBoundMm.value! + r.inradius.value!.errorBoundMm + 1e-9);
    }), { seed: 5, numRuns: 40 });
  });

  it('L² ≥ 4π∬w² dA on random self-crossing polylines (Banchoff–Pohl, REFERENCES.md §1.4; seed 9)', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: -20, max: 20 })), { minLength: 3, maxLength: 12 }), (pts) => {
      const c = polygon(pts);
      const m = measureContour(c, 'up');
      const w2 = getWindingSquaredArea(pts);
      expect(m.lengthMm ** 2).toBeGreaterThanOrEqual(4 * Math.PI * w2 * (1 - 1e-12));
    }), { seed: 9, numRuns: 300 });
  });
});

describe('cell bounds close plateaus and ridges (linear and concave-quadratic programmes)', () => {
  it('gives a circle drawn as two arcs R = ρ = r and t_MZ = 0 to rounding (REFERENCES.md §2.1, §3.1)', () => {
    const r = figuresOf(contourFromSegments(circleArcs(3, -2, 5, 2), true));
    expect(Math.abs(r.inradius.value!.valueMm - 5)).toBeLessThanOrEqual(1e-12);
    expect(r.inradius.value!.errorBoundMm).toBeLessThanOrEqual(1e-12);
    expect(r.minZone.value!.valueMm).toBeLessThanOrEqual(1e-12);
    expect(r.minZone.value!.errorBoundMm).toBeLessThanOrEqual(1e-12);
  });

  it('closes the inradius plateau of a 3×1 rectangle: ρ = 1/2 with a bound under 1e-9 of the size (REFERENCES.md §2.3)', () => {
    const lic = getLargestInscribedCircle([[0, 0], [3, 0], [3, 1], [0, 1]]);
    expect(lic.capped).toBe(false);
    expect(Math.abs(lic.radiusMm - 0.5)).toBeLessThanOrEqual(lic.errorBoundMm + 1e-15);
    expect(lic.errorBoundMm).toBeLessThanOrEqual(1e-9 * Math.hypot(3, 1));
  });

  it('closes the inradius plateau of a stadium a = 2, r = 1: ρ = r = 1 (REFERENCES.md §2.5)', () => {
    const c = contourFromSegments([
      line(0, -1, 2, -1), arc(2, 0, 1, 0, 0, 1, -Math.PI / 2, Math.PI),
      line(2, 1, 0, 1), arc(0, 0, 1, 0, 0, 1, Math.PI / 2, Math.PI),
    ], true);
    const r = figuresOf(c);
    expect(Math.abs(r.inradius.value!.valueMm - 1)).toBeLessThanOrEqual(r.inradius.value!.errorBoundMm + 1e-12);
    expect(r.inradius.value!.errorBoundMm).toBeLessThanOrEqual(1e-8);
  });

  // A convex polygon's largest inscribed circle is its Chebyshev centre, an LP in (x, y, r)
  // (REFERENCES.md §3.3, Boyd & Vandenberghe §8.5.1): its optimum is a vertex where three edge
  // constraints r = bᵢ − nᵢ·x are tight, so trying every triple finds it exactly.
  const chebyshevRadius = (pts: readonly (readonly [number, number])[]) => {
    const edges = pts.map((a, i) => {
      const b = pts[(i + 1) % pts.length]!, l = Math.hypot(b[0] - a[0], b[1] - a[1]);
      const nx = (b[1] - a[1]) / l, ny = -(b[0] - a[0]) / l; // outward for a counter-clockwise loop
      return [nx, ny, nx * a[0] + ny * a[1]] as const;
    });
    let best = -Infinity;
    for (let i = 0; i < edges.length; i++) for (let j = i + 1; j < edges.length; j++) for (let k = j + 1; k < edges.length; k++) {
      const [a1, b1, c1] = edges[i]!, [a2, b2, c2] = edges[j]!, [a3, b3, c3] = edges[k]!;
      // Solve nᵢ·x + r = bᵢ for the three edges (Cramer's rule).
      const det = a1 * (b2 - b3) - b1 * (a2 - a3) + (a2 * b3 - a3 * b2);
      if (Math.abs(det) < 1e-12) continue;
      const x = (c1 * (b2 - b3) - b1 * (c2 - c3) + (c2 * b3 - c3 * b2)) / det;
      const y = (a1 * (c2 - c3) - c1 * (a2 - a3) + (a2 * c3 - a3 * c2)) / det;
      const r = c1 - a1 * x - b1 * y;
      if (edges.every(([a, b, c]) => c - a * x - b * y >= r - 1e-9)) best = Math.max(best, r);
    }
    return best;
  };
  const convexPolygon = fc.array(fc.tuple(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.5, max: 5, noNaN: true })), { minLength: 3, maxLength: 12 })
    .map((a) => getConvexHull(a.map(([t, r]) => [r * Math.cos(t), r * Math.sin(t)] as [number, number])));

  it('matches the exact Chebyshev radius on random convex polygons (REFERENCES.md §3.3; fast-check, seed 11)', () => {
    fc.assert(fc.property(convexPolygon, (pts) => {
      if (pts.length < 3 || getPolylineHull(getContourPolyline(polygon(pts), 0)).areaMm2 < 0.5) return;
      const lic = getLargestInscribedCircle(pts);
      const exact = chebyshevRadius(pts);
      expect(lic.capped).toBe(false);
      expect(Math.abs(lic.radiusMm - exact)).toBeLessThanOrEqual(lic.errorBoundMm + 1e-9);
    }), { seed: 11, numRuns: 150 });
  });

  // Point sets: the minimum-zone centre is a circumcentre of three points or the meeting point of
  // two bisectors (REFERENCES.md §3.3), so trying every candidate inside the enclosing disc is exact.
  const bruteMinimumZone = (pts: readonly (readonly [number, number])[]) => {
    const mec = getSmallestEnclosingCircle(pts);
    const width = (x: number, y: number) => {
      const d = pts.map((p) => Math.hypot(p[0] - x, p[1] - y));
      return Math.max(...d) - Math.min(...d);
    };
    const bisector = (p: readonly number[], q: readonly number[]) =>
      [q[0]! - p[0]!, q[1]! - p[1]!, (q[0]! ** 2 + q[1]! ** 2 - p[0]! ** 2 - p[1]! ** 2) / 2] as const;
    const lines: (readonly [number, number, number])[] = [];
    for (let i = 0; i < pts.length; i++) for (let j = i + 1; j < pts.length; j++) lines.push(bisector(pts[i]!, pts[j]!));
    let best = Infinity;
    for (let i = 0; i < lines.length; i++) for (let j = i + 1; j < lines.length; j++) {
      const [a1, b1, c1] = lines[i]!, [a2, b2, c2] = lines[j]!;
      const det = a1 * b2 - a2 * b1;
      if (Math.abs(det) < 1e-12) continue;
      const x = (c1 * b2 - c2 * b1) / det, y = (a1 * c2 - a2 * c1) / det;
      if (Math.hypot(x - mec.x, y - mec.y) <= mec.r) best = Math.min(best, width(x, y));
    }
    return best;
  };

  it('matches the exact minimum zone of random point sets (REFERENCES.md §3.3; fast-check, seed 13)', () => {
    // Points near a unit circle at distinct twelfths of a turn, so no two coincide.
    const pointSet = fc.uniqueArray(fc.tuple(fc.integer({ min: 0, max: 11 }), fc.double({ min: 0.8, max: 1.2, noNaN: true })), { minLength: 4, maxLength: 7, selector: (p) => p[0] })
      .map((a) => a.map(([k, r]) => [r * Math.cos((k * Math.PI) / 6), r * Math.sin((k * Math.PI) / 6)] as [number, number]));
    fc.assert(fc.property(pointSet, (pts) => {
      const mz = getMinimumZone(pts, { asPoints: true });
      if (mz.onSearchRim) return;
      const exact = bruteMinimumZone(pts);
      expect(Math.abs(mz.widthMm - exact)).toBeLessThanOrEqual(mz.errorBoundMm + 1e-9);
    }), { seed: 13, numRuns: 150 });
  });

  // Soundness of the bounds where no closed form is at hand: no point of a fine grid may beat the
  // stated bound (inradius + bound ≥ grid maximum, zone − bound ≤ grid minimum).
  const gridCheck = (c: Contour) => {
    const r = figuresOf(c);
    const m = measureContour(c, 'up');
    const [x0, y0, x1, y1] = m.bboxMm;
    const size = Math.hypot(x1 - x0, y1 - y0), slack = 1e-6 * size;
    const { xs, ys } = getContourPolyline(c, slack);
    const poly = Array.from(xs, (x, i) => [x, ys[i]!] as const);
    const n = poly.length;
    const dist = (x: number, y: number) => {
      let d = Infinity, inside = false;
      for (let i = 0; i < n; i++) {
        const a = poly[i]!, b = poly[(i + 1) % n]!;
        const dx = b[0] - a[0], dy = b[1] - a[1], l2 = dx * dx + dy * dy;
        const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - a[0]) * dx + (y - a[1]) * dy) / l2));
        d = Math.min(d, Math.hypot(x - a[0] - t * dx, y - a[1] - t * dy));
        if ((a[1] > y) !== (b[1] > y) && x < a[0] + ((y - a[1]) * dx) / dy) inside = !inside;
      }
      return { d, inside };
    };
    const far = (x: number, y: number) => Math.max(...poly.map((p) => Math.hypot(p[0] - x, p[1] - y)));
    const lic = r.inradius.value!, mz = r.minZone.value;
    const steps = 16;
    for (let i = 0; i <= steps; i++) for (let j = 0; j <= steps; j++) {
      const x = x0 + ((x1 - x0) * i) / steps, y = y0 + ((y1 - y0) * j) / steps;
      const { d, inside } = dist(x, y);
      if (inside) expect(d).toBeLessThanOrEqual(lic.valueMm + lic.errorBoundMm + slack);
      const mec = r.circumradius.value!;
      if (mz && Math.hypot(x - mec.centreXMm, y - mec.centreYMm) <= mec.valueMm) expect(far(x, y) - d).toBeGreaterThanOrEqual(mz.valueMm - mz.errorBoundMm - 2 * slack);
    }
  };

  it('states sound bounds on random star polygons and crescents of two arcs (fast-check, seed 17)', () => {
    const starPolygon = fc.array(fc.tuple(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.5, max: 3, noNaN: true })), { minLength: 3, maxLength: 10 })
      .map((a) => [...a].sort((p, q) => p[0] - q[0]).map(([t, r]) => [r * Math.cos(t), r * Math.sin(t)] as [number, number]));
    fc.assert(fc.property(starPolygon, (pts) => {
      const c = polygon(pts);
      if (findSelfIntersections(c).intersections.some((x) => x.kind === 'crossing') || measureContour(c, 'up').areaMm2.value === 0) return;
      gridCheck(c);
    }), { seed: 17, numRuns: 25 });
    // A crescent: two circular arcs through (±8, 0), both bulging the same way (the lamp panel's moon).
    fc.assert(fc.property(fc.double({ min: 8.5, max: 12, noNaN: true }), fc.double({ min: 8.5, max: 12, noNaN: true }), (r1, r2) => {
      if (Math.abs(r1 - r2) < 0.2) return;
      const [big, small] = r1 > r2 ? [r1, r2] : [r2, r1];
      gridCheck(contoursFromPathData(`M -8 0 A ${small} ${small} 0 1 0 8 0 A ${big} ${big} 0 1 1 -8 0 Z`)[0]!);
    }), { seed: 17, numRuns: 10 });
  });
});

describe('chord tree (the searches\' nearest and farthest pieces)', () => {
  /** Brute-force distance from (x, y) to the segment A–B (independent of the module's own). */
  const toSegment = (x: number, y: number, ax: number, ay: number, bx: number, by: number) => {
    const dx = bx - ax, dy = by - ay, l2 = dx * dx + dy * dy;
    const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / l2));
    return Math.hypot(x - ax - t * dx, y - ay - t * dy);
  };

  const specsArb = fc.array(fc.record({
    turn: fc.double({ min: 0.001, max: Math.PI / 2, noNaN: true }),
    r: fc.double({ min: 0.1, max: 50, noNaN: true }),
    arc: fc.boolean(),
  }), { minLength: 1, maxLength: 120 });
  /** A path of pieces, each an arc of radius r turning left by `turn` (counter-clockwise, y up), or its chord. */
  const walk = (specs: readonly { turn: number; r: number; arc: boolean }[]): SearchPiece[] => {
    const pieces: SearchPiece[] = [];
    let x = 0, y = 0, heading = 0;
    for (const { turn, r, arc: isArc } of specs) {
      const cx = x - r * Math.sin(heading), cy = y + r * Math.cos(heading);
      const a0 = Math.atan2(y - cy, x - cx), a1 = a0 + turn;
      const bx = cx + r * Math.cos(a1), by = cy + r * Math.sin(a1);
      pieces.push({ ax: x, ay: y, bx, by, circle: isArc ? { cx, cy, r, ccw: true, span: [x, y, bx, by] } : null });
      x = bx; y = by; heading += turn;
    }
    return pieces;
  };

  it('holds every point of every run within its node\'s ε of the node\'s chord: a wavy loop of lines and arcs of up to a quarter turn, each sampled at 65 points (the strip-tree invariant, Ballard 1981; fast-check, seed 23)', () => {
    fc.assert(fc.property(specsArb, (specs) => {
      const pieces = walk(specs);
      const tree = buildChordTree(pieces);
      for (let k = 0; k < tree.lo.length; k++) {
        if (tree.lo[k]! < 0) continue;
        for (let i = tree.lo[k]!; i < tree.hi[k]!; i++) {
          const p = pieces[i]!, c = p.circle;
          for (let s = 0; s <= 64; s++) {
            let px: number, py: number;
            if (c) {
              const a0 = Math.atan2(p.ay - c.cy, p.ax - c.cx), sweep = specs[i]!.turn, a = a0 + (sweep * s) / 64;
              px = c.cx + c.r * Math.cos(a); py = c.cy + c.r * Math.sin(a);
            } else {
              px = p.ax + ((p.bx - p.ax) * s) / 64; py = p.ay + ((p.by - p.ay) * s) / 64;
            }
            expect(toSegment(px, py, tree.ax[k]!, tree.ay[k]!, tree.bx[k]!, tree.by[k]!)).toBeLessThanOrEqual(tree.eps[k]! * (1 + 1e-12) + 1e-12);
          }
        }
      }
    }), { seed: 23, numRuns: 60 });
  });

  it('finds the same nearest and farthest distances as a scan of every piece, from points in and around random paths of lines and arcs (distances by their definitions; fast-check, seed 29)', () => {
    /** Nearest and farthest distance from (x, y) to a piece, by definition: a segment's farthest point
     *  is an end; an arc's nearest point is the foot of the ray from its centre when that lies in its
     *  sector, its farthest the antipode of that foot when that does, and an end otherwise. */
    const inSector = (p: SearchPiece, dx: number, dy: number) => {
      const c = p.circle!, a0 = Math.atan2(p.ay - c.cy, p.ax - c.cx), a1 = Math.atan2(p.by - c.cy, p.bx - c.cx);
      const sweep = (a1 - a0 + 4 * Math.PI) % (2 * Math.PI), t = (Math.atan2(dy, dx) - a0 + 4 * Math.PI) % (2 * Math.PI);
      return t <= sweep;
    };
    const ends = (p: SearchPiece, x: number, y: number) => [Math.hypot(x - p.ax, y - p.ay), Math.hypot(x - p.bx, y - p.by)];
    const near = (p: SearchPiece, x: number, y: number) => {
      const c = p.circle;
      if (!c) return toSegment(x, y, p.ax, p.ay, p.bx, p.by);
      const d = Math.hypot(x - c.cx, y - c.cy);
      return inSector(p, x - c.cx, y - c.cy) ? Math.abs(d - c.r) : Math.min(...ends(p, x, y));
    };
    const far = (p: SearchPiece, x: number, y: number) => {
      const c = p.circle;
      if (!c) return Math.max(...ends(p, x, y));
      const d = Math.hypot(x - c.cx, y - c.cy);
      return inSector(p, c.cx - x, c.cy - y) ? d + c.r : Math.max(...ends(p, x, y));
    };
    fc.assert(fc.property(specsArb, fc.array(fc.tuple(fc.double({ min: -1.5, max: 1.5, noNaN: true }), fc.double({ min: -1.5, max: 1.5, noNaN: true })), { minLength: 1, maxLength: 8 }), (specs, spots) => {
      const pieces = walk(specs);
      const { width } = createOutlineDistance({ pieces, deviationMm: 0 });
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (const p of pieces) for (const [x, y] of [[p.ax, p.ay], [p.bx, p.by]] as const) {
        minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
      }
      const size = Math.hypot(maxX - minX, maxY - minY) + 1;
      // Points from the box's centre out to half its size beyond it, every piece's start, and points off
      // every piece's middle on both sides (where an arc bulges towards the point past its chord).
      const points = [...spots.map(([u, v]) => [(minX + maxX) / 2 + u * (maxX - minX + 1), (minY + maxY) / 2 + v * (maxY - minY + 1)]), ...pieces.map((p) => [p.ax, p.ay])];
      for (const p of pieces) {
        const c = p.circle;
        const [mx, my, ux, uy] = c
          ? (() => { const a = (Math.atan2(p.ay - c.cy, p.ax - c.cx) + Math.atan2(p.by - c.cy, p.bx - c.cx)) / 2; return [c.cx + c.r * Math.cos(a), c.cy + c.r * Math.sin(a), Math.cos(a), Math.sin(a)]; })()
          : [(p.ax + p.bx) / 2, (p.ay + p.by) / 2, -(p.by - p.ay) / (Math.hypot(p.bx - p.ax, p.by - p.ay) || 1), (p.bx - p.ax) / (Math.hypot(p.bx - p.ax, p.by - p.ay) || 1)];
        for (const o of [-0.3, 0.05, 0.3, 2]) points.push([mx + o * ux, my + o * uy]);
      }
      for (const [x, y] of points) {
        const { width: w, outer } = width(x!, y!);
        expect(Math.abs(outer - Math.max(...pieces.map((p) => far(p, x!, y!))))).toBeLessThanOrEqual(1e-12 * size);
        expect(Math.abs(outer - w - Math.min(...pieces.map((p) => near(p, x!, y!))))).toBeLessThanOrEqual(1e-12 * size);
      }
    }), { seed: 29, numRuns: 200 });
  });

  it('looks inside a run whose chord is far but whose arc bulges close: a half circle r = 10 over (0, 0)–(20, 0) in four arcs, then four lines (by hand)', () => {
    // The arcs run clockwise from (0, 0) over (10, 10) to (20, 0): centre (10, 0), 45° each.
    const arcs: SearchPiece[] = [0, 1, 2, 3].map((k) => {
      const a0 = Math.PI - (k * Math.PI) / 4, a1 = a0 - Math.PI / 4;
      const [ax, ay, bx, by] = [10 + 10 * Math.cos(a0), 10 * Math.sin(a0), 10 + 10 * Math.cos(a1), 10 * Math.sin(a1)];
      return { ax, ay, bx, by, circle: { cx: 10, cy: 0, r: 10, ccw: false, span: [ax, ay, bx, by] } };
    });
    const lines = (pts: [number, number][]): SearchPiece[] => pts.slice(1).map(([bx, by], k) => ({ ax: pts[k]![0], ay: pts[k]![1], bx, by, circle: null }));
    // Nearest from (10, 13): the arcs' top (10, 10) at 3, though their chord is 13 away and the line
    // y = 20 (in the other run) is 7 away.
    const far = createOutlineDistance({ pieces: [...arcs, ...lines([[20, 0], [30, 0], [30, 20], [-10, 20], [0, 0]])], deviationMm: 0 });
    const w = far.width(10, 13);
    expect(w.outer - w.width).toBeCloseTo(3, 12);
    // Farthest from (10, −30): the arcs' top at 40, though their chord's ends are 31.6 away and the
    // other run (lines 3 mm above the chord) reaches 34.5.
    const low = createOutlineDistance({ pieces: [...arcs, ...lines([[20, 0], [20, 3], [10, 3], [0, 3], [0, 0]])], deviationMm: 0 });
    expect(low.width(10, -30).outer).toBeCloseTo(40, 12);
  });
});
