import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { wrapSvg } from '../../../../test/support/checkCases';
import { contourFromSegments, mapContour, polygonSegments, reverseContour, rotateContourStart } from '../../../../test/support/shapes';
import { AnalysisCancelled, analyze } from '../index';
import type { Contour, MeasuredContour } from '../types';
import { getFileGeometry } from './fileGeometry';
import { measureContour } from './measure';
import { measureContourShapes } from './shapes';

const analyzeSvg = (body: string) => analyze(wrapSvg(body), 'svg');
const never = () => {};

describe('the file geometry in the analysis result', () => {
  it('gives the bow-tie its crossing at (10, 10), no Bonnesen bound and ∬w² dA = 200: two lobes of 100 mm² with w = ±1 (REFERENCES.md §1.4)', () => {
    // Bow-tie 20 × 20: two triangular lobes of area 20·10/2 = 100 each, winding ±1: ∬w² dA = 200.
    const [c] = analyzeSvg('<path d="M0 0 L20 20 L20 0 L0 20 Z"/>').contours;
    expect(c!.geometry.selfIntersections.map(({ xMm, yMm, kind }) => ({ xMm, yMm, kind }))).toEqual([{ xMm: 10, yMm: 10, kind: 'crossing' }]);
    expect(c!.geometry.roundness.selfCrossing).toBe(true);
    expect(c!.geometry.roundness.windingSquaredAreaMm2.value).toBeCloseTo(200, 9);
    expect(c!.geometry.roundness.bonnesenBoundMm.value).toBeNull();
    expect(c!.geometry.hull.convexity.value).toBeNull();
    // Banchoff–Pohl: L² ≥ 4π∬w² dA, L = 2·20 + 2·20√2 (REFERENCES.md §1.4).
    expect(c!.metrics.lengthMm ** 2).toBeGreaterThanOrEqual(4 * Math.PI * 200);
  });

  it('reports a vertex on an edge as a touch and keeps every span on the source text', () => {
    const text = wrapSvg('<path d="M0 0 L40 0 L40 40 L20 0 L0 40 Z"/>');
    const [c] = analyze(text, 'svg').contours;
    const [x] = c!.geometry.selfIntersections;
    expect({ xMm: x!.xMm, yMm: x!.yMm, kind: x!.kind }).toEqual({ xMm: 20, yMm: 0, kind: 'touch' });
    for (const s of [x!.span, x!.otherSpan]) expect(text.slice(s.start, s.end)).toMatch(/^L\d+ \d+$|^L \d+ \d+$|^L\d+ \d+|^Z$/);
  });

  it('gives both contours of a shared 10 mm edge the double cut, each naming the other (by hand)', () => {
    const r = analyzeSvg('<rect width="20" height="10"/><rect x="20" width="20" height="10"/>');
    expect(r.contours.map((c) => c.geometry.overlaps.map((o) => [o.otherContour, o.lengthMm]))).toEqual([[[1, 10]], [[0, 10]]]);
  });

  it('nests a hole and an island, and nets the material: 40² − 20² + 10² (by hand)', () => {
    const r = analyzeSvg('<rect width="40" height="40"/><rect x="10" y="10" width="20" height="20"/><rect x="15" y="15" width="10" height="10"/>');
    expect(r.contours.map((c) => [c.geometry.parent, c.geometry.depth])).toEqual([[null, 0], [0, 1], [1, 2]]);
    expect(r.summary).toEqual({ contours: 3, parts: 2, pierces: 3, cutLengthMm: 160 + 80 + 40, netAreaMm2: 1600 - 400 + 100 });
  });

  it('gives a square ρ = a/2, R = a/√2, zone R − ρ and convexity 1 (REFERENCES.md §2.2, n = 4)', () => {
    const [c] = analyzeSvg('<rect x="10" y="10" width="20" height="20"/>').contours;
    const r = c!.geometry.roundness;
    expect(r.inradius.value!.valueMm).toBeCloseTo(10, 6);
    expect(r.circumradius.value!.valueMm).toBeCloseTo(10 * Math.SQRT2, 12);
    expect([r.circumradius.value!.centreXMm, r.circumradius.value!.centreYMm]).toEqual([20, 20]);
    expect(r.minZone.value!.valueMm).toBeCloseTo(10 * Math.SQRT2 - 10, 6);
    expect(r.radiusGapMm.value!).toBeLessThanOrEqual(r.bonnesenBoundMm.value!); // Bonnesen, §1.2
    expect(c!.geometry.hull).toMatchObject({ areaMm2: 400, perimeterMm: 80, convexity: { value: 1 } });
  });

  it('searches an elongated 4 × 1 rectangle\'s zone inside its enclosing circle: (√17 − 1)/2 · 10 at the centre (REFERENCES.md §3.4)', () => {
    // §3.4: for a 4 × 1 rectangle the centre is only a local minimum; bounded to the enclosing disc, it is the answer.
    const [c] = analyzeSvg('<rect width="40" height="10"/>').contours;
    const z = c!.geometry.roundness.minZone.value!;
    expect(Math.abs(z.valueMm - ((Math.sqrt(17) - 1) / 2) * 10)).toBeLessThanOrEqual(z.errorBoundMm + 1e-9);
    expect(z.centreXMm).toBeCloseTo(20, 5);
    expect(z.centreYMm).toBeCloseTo(5, 5);
  });

  it('leaves an open contour without roundness, with a reason, and never NaN anywhere', () => {
    const r = analyzeSvg('<path d="M0 0 L10 0 L10 10"/><path d="M5 5"/><rect width="40" height="40"/>');
    expect(r.contours[0]!.geometry.roundness.inradius).toEqual({ value: null, reason: 'the contour is not closed' });
    expect(r.contours[0]!.geometry.parent).toBe(2);
    expect(JSON.stringify(r, (_, v) => (typeof v === 'number' && !Number.isFinite(v) ? 'NOT FINITE' : v))).not.toContain('NOT FINITE');
  });

  it('gives contours that meet nothing one shared, frozen empty list each, and the others their own', () => {
    // A bow-tie (crossing at its centre), two squares sharing an edge, and a lone square.
    const r = analyzeSvg('<path d="M0 0 L20 20 L20 0 L0 20 Z"/><rect x="30" width="10" height="10"/><rect x="40" width="10" height="10"/><rect x="60" width="10" height="10"/>');
    const [bowTie, left, right, lone] = r.contours.map((c) => c.geometry);
    expect(bowTie!.selfIntersections).toHaveLength(1);
    expect([left!.overlaps.length, right!.overlaps.length]).toEqual([1, 1]);
    expect(Object.isFrozen(bowTie!.selfIntersections)).toBe(false);
    for (const list of [bowTie!.overlaps, left!.selfIntersections, lone!.selfIntersections, lone!.overlaps]) {
      expect(list).toEqual([]);
      expect(Object.isFrozen(list)).toBe(true);
    }
    expect(lone!.selfIntersections).toBe(left!.selfIntersections);
    expect(lone!.overlaps).toBe(bowTie!.overlaps);
  });

  it('stops between stages when cancelled (AnalysisOptions.isCancelled)', () => {
    let polls = 0;
    // Polls 1 and 2 come after reading and measuring; the third is the first inside the geometry.
    const isCancelled = () => ++polls >= 3;
    expect(() => analyze(wrapSvg('<rect width="20" height="10"/><rect x="20" width="20" height="10"/>'), 'svg', { isCancelled })).toThrow(AnalysisCancelled);
  });
});

// ---- Property tests (seeded): the geometry does not depend on how a contour is written or placed ----

const measured = (contours: readonly Contour[]): MeasuredContour[] => contours.map((contour) => ({ contour, metrics: measureContour(contour, 'up') }));
const geometryOf = (c: Contour) => getFileGeometry(measured([c]), never).contours[0]!;
/** The contour's roundness and hull, measured as the analysis does after its findings. */
const shapeOf = (c: Contour) => {
  const [m] = measured([c]);
  return measureContourShapes([{ ...m!, geometry: geometryOf(c) }], never)[0]!;
};
const counts = (c: Contour) => {
  const g = geometryOf(c);
  // Overlap runs may split where the loop starts, so their total length is compared, not their number.
  const overlapMm = g.overlaps.reduce((s, o) => s + o.lengthMm, 0);
  return { crossings: g.selfIntersections.filter((x) => x.kind === 'crossing').length, touches: g.selfIntersections.filter((x) => x.kind === 'touch').length, overlapMm };
};

/** Closed polylines on a small integer grid: many crossings, touches and collinear runs. */
const gridPolygon = fc.array(fc.tuple(fc.integer({ min: 0, max: 8 }), fc.integer({ min: 0, max: 8 })), { minLength: 3, maxLength: 9 })
  .filter((pts) => pts.every((p, i) => { const q = pts[(i + 1) % pts.length]!; return p[0] !== q[0] || p[1] !== q[1]; }))
  .map((pts) => contourFromSegments(polygonSegments(pts, true), true)); // a loop: rotateContourStart needs last end = start

describe('self-intersection counts are invariant (fast-check)', () => {
  it('under start-vertex rotation, reversal, translation, 90° rotation and scaling by 2 (seed 606)', () => {
    fc.assert(fc.property(gridPolygon, fc.nat(), (c, k) => {
      const base = counts(c);
      const same = (v: Contour, scale = 1) => {
        const { overlapMm, ...rest } = counts(v);
        expect(rest).toEqual({ crossings: base.crossings, touches: base.touches });
        expect(overlapMm).toBeCloseTo(scale * base.overlapMm, 6);
      };
      same(rotateContourStart(c, k % c.segments.length));
      same(reverseContour(c));
      same(mapContour(c, [1, 0, 0, 1, 1000, -250]));
      same(mapContour(c, [0, 1, -1, 0, 0, 0]));
      same(mapContour(c, [2, 0, 0, 2, 0, 0]), 2);
    }), { seed: 606, numRuns: 150 });
  });
});

describe('roundness scales with the contour and ignores its placement (fast-check)', () => {
  // Star-shaped polygons from sorted angles are simple.
  // Vertices at distinct multiples of 2π/24 (so no two coincide and no sliver is thinner than the
  // grid), radii 0.5–5.
  const star = fc.uniqueArray(fc.integer({ min: 0, max: 23 }), { minLength: 3, maxLength: 10 })
    .chain((steps) => fc.tuple(fc.constant([...steps].sort((a, b) => a - b)), fc.array(fc.double({ min: 0.5, max: 5, noNaN: true }), { minLength: steps.length, maxLength: steps.length })))
    .map(([steps, radii]) => steps.map((k, i) => [radii[i]! * Math.cos((k * Math.PI) / 12), radii[i]! * Math.sin((k * Math.PI) / 12)] as [number, number]))
    .filter((pts) => measureContour(contourFromSegments(polygonSegments(pts, true), true), 'up').areaMm2.value! > 1e-3);

  it('R, ρ and √D/π scale by k, convexity stays, under rotation of the start, reversal, translation and scaling by 3 (seed 707)', () => {
    fc.assert(fc.property(star, fc.nat(), (pts, k) => {
      const c = contourFromSegments(polygonSegments(pts, true), true);
      const a = shapeOf(c);
      const tol = (g: typeof a) => g.roundness.inradius.value!.errorBoundMm + 1e-9;
      for (const [variant, scale] of [
        [rotateContourStart(c, k % c.segments.length), 1],
        [reverseContour(c), 1],
        [mapContour(c, [1, 0, 0, 1, 500, -300]), 1],
        [mapContour(c, [3, 0, 0, 3, 0, 0]), 3],
      ] as const) {
        const b = shapeOf(variant);
        expect(b.roundness.circumradius.value!.valueMm).toBeCloseTo(scale * a.roundness.circumradius.value!.valueMm, 9);
        expect(Math.abs(b.roundness.inradius.value!.valueMm - scale * a.roundness.inradius.value!.valueMm)).toBeLessThanOrEqual(tol(b) + scale * tol(a));
        expect(b.roundness.bonnesenBoundMm.value!).toBeCloseTo(scale * a.roundness.bonnesenBoundMm.value!, 6);
        expect(b.hull.convexity.value!).toBeCloseTo(a.hull.convexity.value!, 9);
      }
    }), { seed: 707, numRuns: 15 });
  });
});
