import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { contourFromSegments, ellipseArc, polygonSegments, regularPolygonPoints } from '../../../../test/support/shapes';
import { measureContour } from './measure';
import { getContourPolyline, getConvexHull, getPolylineHull } from './hull';
import type { Contour } from '../types';
import { findSelfIntersections } from './intersect';
import { getMinimumZone, getRoundness, getSmallestEnclosingCircle, getWindingSquaredArea } from './roundness';

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

  it('gives a square hull area 1, perimeter 4 and convexity 1; an L-shape convexity 3/3.5 (by hand)', () => {
    expect(getPolylineHull(getContourPolyline(polygon([[0, 0], [1, 0], [1, 1], [0, 1]]), 0))).toMatchObject({ areaMm2: 1, perimeterMm: 4 });
    const r = roundnessOf([[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]);
    expect(r.convexity.value).toBeCloseTo(3 / 3.5, 12);
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
