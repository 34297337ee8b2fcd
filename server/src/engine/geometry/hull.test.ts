import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { orient2d } from 'robust-predicates';
import { arc, contourFromSegments, cubic, getContourPolyline, line, quad } from '../../../../test/support/shapes';
import type { Contour, Segment } from '../types';
import { getArcCircle, getContourHullMeasures, getConvexHull, getPolylineHull, getTransientPolyline } from './hull';
import { buildPieces, getPiecePoint, KIND_ARC, KIND_LINE, KIND_QUAD, STRIDE } from './intersectPieces';

type Pt = readonly [number, number];

/** Reference: Andrew's monotone chain over every point (Andrew, Inf. Process. Lett. 9 (1979) 216–219),
 *  with exact orient2d turns. */
function andrew(points: readonly Pt[]): [number, number][] {
  const p = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p.map(([x, y]) => [x, y]);
  const left = (a: Pt, b: Pt, c: Pt) => orient2d(a[0], a[1], b[0], b[1], c[0], c[1]) < 0;
  const chain = (order: readonly Pt[]) => {
    const out: Pt[] = [];
    for (const q of order) {
      while (out.length >= 2 && !left(out[out.length - 2]!, out[out.length - 1]!, q)) out.pop();
      out.push(q);
    }
    out.pop();
    return out;
  };
  return [...chain(p), ...chain([...p].reverse())].map(([x, y]) => [x, y]);
}

/** A wavy circle r = 1000 + 2 sin 37θ in drawing order, rounded to 4 decimals (the benchmark's outline). */
const wavy = (n: number): Pt[] => Array.from({ length: n }, (_, k) => {
  const a = (2 * Math.PI * k) / n, r = 1000 + 2 * Math.sin(37 * a);
  return [Number((r * Math.cos(a)).toFixed(4)), Number((r * Math.sin(a)).toFixed(4))];
});

describe('getConvexHull', () => {
  const cases: [string, Pt[]][] = [
    ['20000 vertices of the benchmark wavy circle', wavy(20000)],
    ['5000 points on a circle, all of them hull vertices', Array.from({ length: 5000 }, (_, k) => [Math.cos(k), Math.sin(k)] as Pt)],
    ['6000 points of a 20 × 20 grid, with repeats and collinear runs', Array.from({ length: 6000 }, (_, k) => [(k * 7) % 20, (k * 13) % 20] as Pt)],
    ['5000 collinear points', Array.from({ length: 5000 }, (_, k) => [k % 97, 2 * (k % 97)] as Pt)],
    ['5000 copies of one point', Array.from({ length: 5000 }, () => [3, 4] as Pt)],
    ['a square with 5000 points on its sides and inside', Array.from({ length: 5000 }, (_, k) => [k % 4 === 0 ? 0 : (k * 0.37) % 1, k % 4 === 1 ? 1 : (k * 0.61) % 1] as Pt)],
  ];
  for (const [name, points] of cases) {
    it(`gives Andrew's hull over all points for ${name} (reference: Andrew's chain)`, () => {
      expect(getConvexHull(points)).toEqual(andrew(points));
    });
  }

  it("gives Andrew's hull over all points for random point sets of up to 9000 points (reference: Andrew's chain; fast-check, seed 51)", () => {
    const cloud = fc.tuple(fc.integer({ min: 0, max: 9000 }), fc.integer({ min: 1, max: 1e6 }), fc.boolean()).map(([n, seed, round]) => {
      let s = seed;
      const next = () => { s = (s * 1103515245 + 12345) & 0x7fffffff; return s / 0x7fffffff; };
      // Points in a disc, optionally snapped to a grid so that ties and collinear points abound.
      return Array.from({ length: n }, () => {
        const a = 2 * Math.PI * next(), r = Math.sqrt(next());
        const x = r * Math.cos(a), y = r * Math.sin(a);
        return (round ? [Math.round(40 * x), Math.round(40 * y)] : [x, y]) as Pt;
      });
    });
    fc.assert(fc.property(cloud, (points) => { expect(getConvexHull(points)).toEqual(andrew(points)); }), { seed: 51, numRuns: 40 });
  });

  it("gives Andrew's hull for small point sets in runs, with repeats, collinear points, signed zeros and infinities (reference: Andrew's chain; fast-check, seed 57)", () => {
    // Runs up and down in (x, y) order, as a polyline's monotone pieces give them, drawn from few
    // values so that ties abound; toEqual tells −0 from 0, so even the kept copy of a repeat must match.
    const value = fc.oneof(fc.constantFrom(0, -0, 1, 2.5, -3), fc.integer({ min: -6, max: 6 }), fc.double({ min: -10, max: 10, noNaN: true }));
    const run = fc.tuple(fc.array(fc.tuple(value, value), { maxLength: 40 }), fc.constantFrom('up', 'down', 'as drawn'))
      .map(([pts, how]) => (how === 'as drawn' ? pts : andrewSorted(pts, how === 'down')));
    const set = fc.tuple(fc.array(run, { maxLength: 6 }), fc.boolean())
      .map(([runs, infinite]) => [...runs.flat(), ...(infinite ? [[Infinity, 1], [2, -Infinity]] as Pt[] : [])]);
    fc.assert(fc.property(set, (points) => { expect(getConvexHull(points)).toEqual(andrew(points)); }), { seed: 57, numRuns: 600 });
  });

  it("gives Andrew's hull when a coordinate is NaN (reference: Andrew's chain, whose comparator then decides the order)", () => {
    const points: Pt[] = [[0, 0], [3, 1], [Number.NaN, 2], [1, 4], [2, Number.NaN], [4, 4], [1, 1]];
    expect(getConvexHull(points)).toEqual(andrew(points));
  });
});

/** Points sorted by (x, y), ascending or descending (the order Andrew's chain sorts by). */
function andrewSorted(points: readonly Pt[], down: boolean): Pt[] {
  const p = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  return down ? p.reverse() : p;
}

/**
 * Reference flattening, as hull.ts did it before it took segments one at a time: every piece of
 * intersectPieces.ts `buildPieces` over the whole closed contour, cut into m chords (Wang's formula
 * for Béziers, the sagitta for arcs) and evaluated with getPiecePoint.
 */
function referencePolyline(contour: Contour, tol: number) {
  const P = buildPieces([{ ...contour, closed: true }], 0);
  const b = P.buf;
  const xs: number[] = [], ys: number[] = [];
  let deviation = 0, offCircle = 0;
  const onCircle: number[] = [];
  for (let i = 0; i < P.count; i++) {
    const o = i * STRIDE, kind = b[o]!;
    let m = 1, dev = 0, circle = false;
    if (kind === KIND_ARC) {
      const ux = b[o + 10]!, uy = b[o + 11]!, vx = b[o + 12]!, vy = b[o + 13]!;
      const uu = ux * ux + uy * uy, vv = vx * vx + vy * vy, uv = ux * vx + uy * vy;
      const root = Math.hypot((uu - vv) / 2, uv);
      const a = Math.sqrt((uu + vv) / 2 + root), bMinor = Math.sqrt(Math.max(0, (uu + vv) / 2 - root));
      circle = a - bMinor <= tol;
      const dth = Math.abs(b[o + 15]! - b[o + 14]!);
      const half = tol >= a ? Math.PI : Math.acos(1 - tol / a);
      m = Math.min(4096, Math.max(1, Math.ceil(dth / (2 * half))));
      dev = a * (1 - Math.cos(dth / (2 * m)));
    } else if (kind !== KIND_LINE) {
      const cps = kind === KIND_QUAD
        ? [b[o + 4]!, b[o + 5]!, b[o + 8]!, b[o + 9]!, b[o + 6]!, b[o + 7]!]
        : [b[o + 4]!, b[o + 5]!, b[o + 8]!, b[o + 9]!, b[o + 10]!, b[o + 11]!, b[o + 6]!, b[o + 7]!];
      const d = cps.length / 2 - 1;
      let M = 0;
      for (let k = 0; k + 4 < cps.length; k += 2) M = Math.max(M, Math.hypot(cps[k]! - 2 * cps[k + 2]! + cps[k + 4]!, cps[k + 1]! - 2 * cps[k + 3]! + cps[k + 5]!));
      m = Math.min(4096, Math.max(1, Math.ceil(Math.sqrt((d * (d - 1) * M) / (8 * tol)))));
      dev = (d * (d - 1) * M) / (8 * m * m);
    }
    deviation = Math.max(deviation, dev);
    if (!circle) offCircle = Math.max(offCircle, dev);
    onCircle.push(circle ? 1 : 0);
    for (let k = 0; k < m; k++) { const [x, y] = getPiecePoint(b, i, k / m); xs.push(x); ys.push(y); }
  }
  return { xs, ys, deviation, offCircle, onCircle };
}

function expectReferencePolyline(contour: Contour, tol: number): void {
  const ref = referencePolyline(contour, tol);
  const poly = getContourPolyline(contour, tol);
  expect(Array.from(poly.xs)).toEqual(ref.xs);
  expect(Array.from(poly.ys)).toEqual(ref.ys);
  expect(poly.deviationMm).toBe(ref.deviation);
  expect(poly.offCircleDeviationMm).toBe(ref.offCircle);
  expect(Array.from(poly.pieceOnCircle)).toEqual(ref.onCircle);
}

describe('getTransientPolyline (copied by the tests\' getContourPolyline)', () => {
  const coordinate = fc.oneof(fc.integer({ min: -4, max: 4 }), fc.double({ min: -100, max: 100, noNaN: true }));
  const point = fc.tuple(coordinate, coordinate);
  const segment: fc.Arbitrary<Segment> = fc.oneof(
    fc.tuple(point, point).map(([a, b]) => line(a[0], a[1], b[0], b[1])),
    fc.tuple(point, point, point).map(([a, b, c]) => quad(a[0], a[1], b[0], b[1], c[0], c[1])),
    fc.tuple(point, point, point, point).map(([a, b, c, d]) => cubic(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1])),
    fc.tuple(point, fc.double({ min: 0.5, max: 50, noNaN: true }), fc.double({ min: 0.9, max: 1.1, noNaN: true }), fc.double({ min: -7, max: 7, noNaN: true }), fc.double({ min: -2 * Math.PI, max: 2 * Math.PI, noNaN: true }))
      .map(([c, r, ratio, t0, sweep]) => arc(c[0], c[1], r, 0, 0, r * ratio, t0, sweep)),
  );

  it('gives the vertices and deviations of the buildPieces flattening, to the last bit (reference: flattening over buildPieces; fast-check, seed 53)', () => {
    const contour = fc.tuple(fc.array(segment, { minLength: 0, maxLength: 12 }), fc.double({ min: 1e-4, max: 1, noNaN: true }));
    fc.assert(fc.property(contour, ([segments, tol]) => expectReferencePolyline(contourFromSegments(segments, true, [1, 2]), tol)), { seed: 53, numRuns: 400 });
  });

  it('gives the buildPieces flattening of 3000 wavy cubics, whose pieces ask the exact M near steps of the chord count (reference: flattening over buildPieces)', () => {
    const pts = wavy(3000);
    const segments = pts.map((p, k) => {
      const q = pts[(k + 1) % pts.length]!, dx = q[0] - p[0], dy = q[1] - p[1];
      return cubic(p[0], p[1], p[0] + dx / 3 + dy * 0.05, p[1] + dy / 3 - dx * 0.05, p[0] + (2 * dx) / 3 + dy * 0.05, p[1] + (2 * dy) / 3 - dx * 0.05, q[0], q[1]);
    });
    for (const tol of [1e-4, 3e-3, 0.0283]) expectReferencePolyline(contourFromSegments(segments, true), tol);
  });

  it('gives the buildPieces flattening of arcs that repeat their angles at other centres, and of more angle sets than are kept (reference: flattening over buildPieces)', () => {
    // Ten rounded corners, each drawn at three centres in turn, then again in reverse: the chord
    // angles of a repeat come from the kept sets, and the ten sets outnumber them.
    const corners = Array.from({ length: 10 }, (_, k) => [3 + k, (k * Math.PI) / 5, Math.PI / 2 + k / 7] as const);
    const order = [...corners, ...corners.slice().reverse()];
    for (const [k, [r, t0, sweep]] of order.entries()) {
      for (const [cx, cy] of [[0, 0], [20.5, -3], [1e4 / 3, 7]] as const) {
        const contour = contourFromSegments([arc(cx, cy, r, 0, 0, r, t0, sweep)], false);
        expectReferencePolyline(contour, 1e-4 * (1 + (k % 3)));
      }
    }
  });

  it('gives a polyline whose arrays a later flattening leaves alone, and the same numbers as the transient one (reference: flattening over buildPieces)', () => {
    const a = contourFromSegments([arc(0, 0, 5, 0, 0, 5, 0, 1), line(5, 0, 0, 0)], true);
    const b = contourFromSegments([cubic(0, 0, 1, 3, 4, -2, 6, 1)], false);
    const kept = getContourPolyline(a, 1e-3);
    const transient = getTransientPolyline(a, 1e-3);
    expect(kept).toEqual(transient);
    getTransientPolyline(b, 1e-3);
    const ref = referencePolyline(a, 1e-3);
    expect(Array.from(kept.xs)).toEqual(ref.xs);
    expect(Array.from(kept.ys)).toEqual(ref.ys);
  });

  it('marks an arc piece as on a circle when its semi-axes differ by at most the tolerance, with that circle (by hand)', () => {
    const s = arc(1, 2, 3, 0, 0, 3.01, 0, Math.PI);
    const poly = getContourPolyline(contourFromSegments([s], true), 0.02);
    expect(Array.from(poly.pieceOnCircle)).toEqual([1, 1, 0]);
    expect(getArcCircle(s, 0.02)).toEqual({ cx: 1, cy: 2, r: 3.005, deviationMm: expect.closeTo(0.005, 15) });
    expect(getArcCircle(s, 0.005)).toBeNull();
  });
});

describe('getPolylineHull', () => {
  it('gives a regular hexagon of circumradius 1 the area 3√3/2 and perimeter 6 (handbook formula)', () => {
    const pts = Array.from({ length: 6 }, (_, k) => [Math.cos((k * Math.PI) / 3), Math.sin((k * Math.PI) / 3)] as const);
    const h = getPolylineHull(getContourPolyline(contourFromSegments(pts.map((p, k) => line(p[0], p[1], pts[(k + 1) % 6]![0], pts[(k + 1) % 6]![1])), true), 0));
    expect(h.areaMm2).toBeCloseTo((3 * Math.sqrt(3)) / 2, 14);
    expect(h.perimeterMm).toBeCloseTo(6, 14);
    expect(h.areaErrorMm2).toBe(0);
  });

  it("gives the shoelace area and the edge lengths of Andrew's hull of the flattening, and getContourHullMeasures the same numbers (reference: Andrew's chain, shoelace formula; fast-check, seed 59)", () => {
    const point = fc.tuple(fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }));
    const segment: fc.Arbitrary<Segment> = fc.oneof(
      fc.tuple(point, point).map(([a, b]) => line(a[0], a[1], b[0], b[1])),
      fc.tuple(point, point, point, point).map(([a, b, c, d]) => cubic(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1])),
      fc.tuple(point, fc.double({ min: 0.5, max: 20, noNaN: true }), fc.double({ min: -7, max: 7, noNaN: true }), fc.double({ min: -2 * Math.PI, max: 2 * Math.PI, noNaN: true }))
        .map(([c, r, t0, sweep]) => arc(c[0], c[1], r, 0, 0, r, t0, sweep)),
    );
    const contour = fc.tuple(fc.array(segment, { maxLength: 6 }), fc.boolean(), fc.double({ min: 1e-4, max: 0.1, noNaN: true }));
    fc.assert(fc.property(contour, ([segments, closed, tol]) => {
      const c = contourFromSegments(segments, closed, [1, 2]);
      const poly = getContourPolyline(c, tol);
      const hull = andrew(Array.from(poly.xs, (x, i) => [x, poly.ys[i]!] as const));
      let area = 0, perimeter = 0;
      const [ox, oy] = hull[0] ?? [0, 0];
      for (let i = 0; i < hull.length; i++) {
        const [x0, y0] = hull[i]!, [x1, y1] = hull[(i + 1) % hull.length]!;
        area += (x0 - ox) * (y1 - oy) - (x1 - ox) * (y0 - oy);
        perimeter += Math.hypot(x1 - x0, y1 - y0);
      }
      const d = poly.deviationMm;
      const expected = {
        areaMm2: Math.abs(area) / 2, perimeterMm: hull.length > 1 ? perimeter : 0,
        areaErrorMm2: d * perimeter + Math.PI * d * d, perimeterErrorMm: 2 * Math.PI * d,
      };
      expect(getPolylineHull(poly)).toEqual({ ...expected, points: hull });
      expect(getContourHullMeasures(c, tol)).toEqual(expected);
    }), { seed: 59, numRuns: 300 });
  });
});
