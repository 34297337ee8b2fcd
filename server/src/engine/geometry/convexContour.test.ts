import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { arc, circleArcs, contourFromSegments, cubic, ellipseArc, fourCubicCircle, line, quad, polygonSegments, regularPolygonPoints } from '../../../../test/support/shapes';
import type { Arc, Contour, Segment } from '../types';
import { getConvexContourHull, MAX_KINK_RAD } from './convexContour';
import { getContourHullMeasures } from './hull';
import { getRoundness } from './roundness';
import { measureContour } from './measure';

const size = (c: Contour) => {
  const [a, b, cc, d] = measureContour(c, 'up').bboxMm;
  return Math.hypot(cc - a, d - b);
};
const hullOf = (c: Contour) => getConvexContourHull(c, measureContour(c, 'up'));

/**
 * A w × h rectangle with corners rounded to radius r, counter-clockwise from the bottom edge, each
 * corner a quarter arc whose end points come from cos/sin (so they miss the lines' ends by rounding).
 */
function roundedRectangle(x: number, y: number, w: number, h: number, r: number): Segment[] {
  const q = Math.PI / 2;
  const corner = (cx: number, cy: number, k: number) => arc(cx, cy, r, 0, 0, r, k * q - q, q);
  return [
    line(x + r, y, x + w - r, y), corner(x + w - r, y + r, 0),
    line(x + w, y + r, x + w, y + h - r), corner(x + w - r, y + h - r, 1),
    line(x + w - r, y + h, x + r, y + h), corner(x + r, y + h - r, 2),
    line(x, y + h - r, x, y + r), corner(x + r, y + r, 3),
  ];
}

/** The segments run the other way. */
function reversed(segments: readonly Segment[]): Segment[] {
  return segments.slice().reverse().map((s): Segment => {
    if (s.kind === 'line') return line(s.x1, s.y1, s.x0, s.y0);
    if (s.kind === 'arc') return { ...s, x0: s.x1, y0: s.y1, x1: s.x0, y1: s.y0, theta0: s.theta0 + s.sweep, sweep: -s.sweep };
    throw new Error('lines and arcs only');
  });
}

/** Shoelace area and edge lengths of a polygon [src: the surveyor's formula, any surveying handbook]. */
function shoelace(points: readonly (readonly [number, number])[]) {
  let a = 0, p = 0;
  for (let i = 0; i < points.length; i++) {
    const [x0, y0] = points[i]!, [x1, y1] = points[(i + 1) % points.length]!;
    a += x0 * y1 - x1 * y0;
    p += Math.hypot(x1 - x0, y1 - y0);
  }
  return { area: Math.abs(a) / 2, perimeter: p };
}

describe('getConvexContourHull: contours that turn one way are their own hull', () => {
  // Rounded rectangle: the rectangle less four r × r corners plus four quarter discs, A = wh − (4 − π)r²,
  // P = 2(w + h) − (8 − 2π)r [derived: composite areas and arc lengths, any geometry handbook].
  const w = 40, h = 20, r = 5;
  const area = w * h - (4 - Math.PI) * r * r, perimeter = 2 * (w + h) - (8 - 2 * Math.PI) * r;
  for (const [name, segments] of [
    ['counter-clockwise', roundedRectangle(0, 0, w, h, r)],
    ['clockwise', reversed(roundedRectangle(0, 0, w, h, r))],
    ['far from the origin (1e6 mm)', roundedRectangle(1e6, -1e6, w, h, r)],
  ] as const) {
    it(`gives a ${name} rounded rectangle's area wh − (4 − π)r² and perimeter 2(w + h) − (8 − 2π)r, with tangential joints (composite-area formula)`, () => {
      const hull = hullOf(contourFromSegments(segments, true))!;
      expect(hull).not.toBeNull();
      expect(hull.areaMm2).toBeCloseTo(area, name.startsWith('far') ? 6 : 11);
      expect(hull.perimeterMm).toBeCloseTo(perimeter, name.startsWith('far') ? 8 : 12);
      // Only rounding allowances at the tangential joints and the arcs' rounded ends: far below the
      // flattened hull's δ·P.
      expect(hull.areaErrorMm2).toBeLessThan(1e-6);
      expect(hull.perimeterErrorMm).toBeLessThan(1e-6);
      const flat = getContourHullMeasures(contourFromSegments(segments, true), 1e-5 * size(contourFromSegments(segments, true)));
      expect(flat.areaErrorMm2).toBeGreaterThan(1e3 * hull.areaErrorMm2);
    });
  }

  it('gives a circle πr² and 2πr exactly, as one full arc or two half arcs (handbook values)', () => {
    for (const pieces of [1, 2] as const) {
      const hull = hullOf(contourFromSegments(circleArcs(3, -2, 7, pieces), true))!;
      expect(hull.areaMm2).toBeCloseTo(Math.PI * 49, 12);
      expect(hull.perimeterMm).toBeCloseTo(14 * Math.PI, 12);
    }
  });

  it("gives a full ellipse πab and the perimeter 4a·E(e) (Simpson's rule on the speed √(a² sin²θ + b² cos²θ), 2·10⁵ panels)", () => {
    const a = 30, b = 12;
    const speed = (t: number) => Math.sqrt(a * a * Math.sin(t) ** 2 + b * b * Math.cos(t) ** 2);
    const n = 200000, step = (2 * Math.PI) / n;
    let simpson = speed(0) + speed(2 * Math.PI);
    for (let k = 1; k < n; k++) simpson += (k % 2 ? 4 : 2) * speed(k * step);
    const hull = hullOf(contourFromSegments([ellipseArc(0, 0, a, b)], true))!;
    expect(hull.areaMm2).toBeCloseTo(Math.PI * a * b, 10);
    expect(Math.abs(hull.perimeterMm - (simpson * step) / 3)).toBeLessThan(1e-9 * hull.perimeterMm);
  });

  it('gives a regular 100 000-gon the handbook area (n/2)R² sin(2π/n) and perimeter 2nR sin(π/n), its turns all tiny', () => {
    const n = 100000, R = 500;
    const hull = hullOf(contourFromSegments(polygonSegments(regularPolygonPoints(n, R), true), true))!;
    expect(hull.areaMm2).toBeCloseTo((n / 2) * R * R * Math.sin((2 * Math.PI) / n), 6);
    expect(hull.perimeterMm).toBeCloseTo(2 * n * R * Math.sin(Math.PI / n), 8);
  });

  it('gives an open outline the hull of the curve its chord closes: a 15 mm square with a gap in its bottom edge and a rounded corner (composite areas)', () => {
    // The outline of the DXF benchmark: corner arc, right, top and left edges; the chord (0,0)–(10,0) closes it.
    const corner: Arc = arc(10, 5, 5, 0, 0, 5, -Math.PI / 2, Math.PI / 2);
    const open = contourFromSegments([corner, line(15, 5, 15, 15), line(15, 15, 0, 15), line(0, 15, 0, 0)], false);
    const hull = hullOf(open)!;
    expect(hull.areaMm2).toBeCloseTo(225 - 25 + (25 * Math.PI) / 4, 12);
    expect(hull.perimeterMm).toBeCloseTo(10 + 15 + 15 + 10 + 2.5 * Math.PI, 12);
  });

  it('gives the four-cubic circle its own area and length, A = 3.142472332656507 and L = 6.284066792295423 for r = 1 (REFERENCES.md §2.10)', () => {
    for (const r of [1, 25]) {
      const hull = hullOf(contourFromSegments(fourCubicCircle(3, 4, r), true))!;
      expect(hull.areaMm2 / (r * r)).toBeCloseTo(3.142472332656506927, 12);
      // Bézier lengths carry BEZIER_LENGTH_REL_TOL = 1e-9; the true perimeter lies in [value, value + error].
      expect(hull.perimeterErrorMm).toBeLessThanOrEqual(2.1e-9 * 6.3 * r);
      expect(6.284066792295422605 * r).toBeGreaterThanOrEqual(hull.perimeterMm - 1e-12 * r);
      expect(6.284066792295422605 * r).toBeLessThanOrEqual(hull.perimeterMm + hull.perimeterErrorMm + 1e-12 * r);
    }
  });

  it('gives a D shape of a quadratic Bézier and its chord the area (2/3)·base·height (Archimedes, quadrature of the parabola)', () => {
    const hull = hullOf(contourFromSegments([quad(0, 0, 2, 4, 4, 0), line(4, 0, 0, 0)], false))!;
    // Parabolic segment under the apex (2, 2): (2/3)·4·2.
    expect(hull.areaMm2).toBeCloseTo(16 / 3, 12);
  });

  it('agrees with the flattened hull within both bounds on random convex polygons, either way round (shoelace formula; fast-check, seed 83)', () => {
    const polygon = fc.tuple(fc.array(fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), { minLength: 3, maxLength: 40 }),
      fc.double({ min: 0.1, max: 1e4, noNaN: true }), fc.boolean());
    let declined = 0;
    fc.assert(fc.property(polygon, ([angles, radius, clockwise]) => {
      // Points on a circle in angular order: a convex polygon (repeated angles give repeated points).
      const sorted = angles.slice().sort((x, y) => x - y);
      const pts = sorted.map((t) => [radius * Math.cos(t), radius * Math.sin(t)] as [number, number]);
      if (clockwise) pts.reverse();
      const ref = shoelace(pts);
      if (ref.area < 1e-6 * radius * radius) return;
      const c = contourFromSegments(polygonSegments(pts, true), true);
      const hull = hullOf(c);
      if (!hull) {
        declined++;
        return;
      }
      expect(hull.areaMm2).toBeCloseTo(ref.area, 6);
      expect(Math.abs(hull.perimeterMm - ref.perimeter)).toBeLessThan(1e-9 * ref.perimeter);
      const flat = getContourHullMeasures(c, 0);
      expect(Math.abs(hull.areaMm2 - flat.areaMm2)).toBeLessThanOrEqual(1e-12 * ref.area + hull.areaErrorMm2);
    }), { seed: 83, numRuns: 300 });
    // Declining is always safe (the flattened hull follows); it should be rare.
    expect(declined).toBeLessThan(15);
  });

  it('agrees with the flattened hull within both bounds where the edges of random convex polygons bow outwards as quadratic Béziers (Andrew\'s hull of the flattening; fast-check, seed 89)', () => {
    const shape = fc.tuple(fc.array(fc.integer({ min: 0, max: 3599 }), { minLength: 3, maxLength: 12 }),
      fc.double({ min: 0, max: 0.3, noNaN: true }));
    let taken = 0, declined = 0;
    fc.assert(fc.property(shape, ([angles, bow]) => {
      // Vertices on a circle at tenths of a degree, in order.
      const pts = [...new Set(angles)].sort((x, y) => x - y)
        .map((d) => [100 * Math.cos((d * Math.PI) / 1800), 100 * Math.sin((d * Math.PI) / 1800)] as const);
      if (pts.length < 3 || shoelace(pts).area < 1) return;
      // Each edge a quadratic whose control point sits `bow` of the edge's length outside its midpoint.
      const segments = pts.map(([x0, y0], i) => {
        const [x1, y1] = pts[(i + 1) % pts.length]!;
        return quad(x0, y0, (x0 + x1) / 2 + bow * (y1 - y0), (y0 + y1) / 2 - bow * (x1 - x0), x1, y1);
      });
      const c = contourFromSegments(segments, true);
      const hull = hullOf(c);
      if (!hull) { declined++; return; }
      taken++;
      const flat = getContourHullMeasures(c, 1e-5 * size(c));
      // Both intervals hold the true hull's figures, so they meet.
      expect(hull.areaMm2).toBeLessThanOrEqual(flat.areaMm2 + flat.areaErrorMm2 + 1e-9);
      expect(flat.areaMm2).toBeLessThanOrEqual(hull.areaMm2 + hull.areaErrorMm2 + 1e-9);
      expect(hull.perimeterMm).toBeLessThanOrEqual(flat.perimeterMm + flat.perimeterErrorMm + 1e-9);
      expect(flat.perimeterMm).toBeLessThanOrEqual(hull.perimeterMm + hull.perimeterErrorMm + 1e-9);
    }), { seed: 89, numRuns: 300 });
    // Declining is safe but should be the exception: a joint turns against the others only where a bow outruns the corner's turn.
    expect(taken).toBeGreaterThan(declined);
  });

  it('declines every contour that has a notch, a Bézier it cannot tell, a cusp or turns twice', () => {
    const cases: [string, Contour][] = [
      ['an L-shaped hexagon', contourFromSegments(polygonSegments([[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]], true), true)],
      // The top edge is an arc of the circle about (1, 3) through (2, 2) and (0, 2), bulging inwards.
      ['a square whose top edge is an arc bulging inwards', contourFromSegments([
        line(0, 0, 2, 0), line(2, 0, 2, 2), arc(1, 3, Math.SQRT2, 0, 0, Math.SQRT2, -Math.PI / 4, -Math.PI / 2), line(0, 2, 0, 0),
      ], true)],
      ['an S-shaped cubic closed by a line', contourFromSegments([cubic(0, 0, 1, 1, 2, -1, 3, 0), line(3, 0, 0, 0)], true)],
      ['a cubic whose control polygon turns more than a half turn, closed by a line', contourFromSegments([cubic(0, 0, 2, 0, 2, 2, 0, 1), line(0, 1, 0, 0)], true)],
      ['a circle drawn twice round', contourFromSegments([...circleArcs(0, 0, 5, 1), ...circleArcs(0, 0, 5, 1)], true)],
      ['a there-and-back line', contourFromSegments([line(0, 0, 5, 0), line(5, 0, 0, 0)], true)],
      [`a square with a reflex vertex of 2e-6 rad (above MAX_KINK_RAD = ${MAX_KINK_RAD})`, contourFromSegments(polygonSegments(
        [[0, 0], [1, 1e-6], [2, 0], [2, 2], [0, 2]].map(([x, y]) => [x!, y!] as [number, number]), true), true)],
    ];
    for (const [name, c] of cases) expect(hullOf(c), name).toBeNull();
    // A convex polygon beside them is taken.
    expect(hullOf(contourFromSegments(polygonSegments(regularPolygonPoints(7, 3), true), true))).not.toBeNull();
  });

  it('takes short gaps between pieces as joints and widens the bounds by them (a rounded rectangle whose arcs end 1e-9 mm off the lines)', () => {
    const nudged = roundedRectangle(0, 0, w, h, r).map((s) => s.kind === 'arc' ? { ...s, x1: s.x1 + 1e-9, y0: s.y0 - 1e-9 } : s);
    const hull = hullOf(contourFromSegments(nudged, true))!;
    expect(hull).not.toBeNull();
    // Eight gaps of ~1e-9 mm (give or take the arcs' own rounding): the perimeter's bound has 2G ≈ 1.6e-8, the area's P·G ≈ P·8e-9.
    expect(hull.perimeterErrorMm).toBeGreaterThan(1.5e-8);
    expect(hull.areaErrorMm2).toBeGreaterThan(perimeter * 7.5e-9);
    expect(Math.abs(hull.areaMm2 - area)).toBeLessThan(hull.areaErrorMm2 + 1e-9);
  });
});

describe('getRoundness uses the closed form for a convex contour', () => {
  it("reports a rounded rectangle's hull as its own area and length, convexity 1, bounds far below flattening's (composite-area formula)", () => {
    const c = contourFromSegments(roundedRectangle(0, 0, 40, 20, 5), true);
    const metrics = measureContour(c, 'up');
    const { hull } = getRoundness(c, metrics, false);
    expect(hull.areaMm2).toBeCloseTo(metrics.areaMm2.value!, 12);
    expect(hull.perimeterMm).toBeCloseTo(metrics.perimeterMm.value!, 12);
    expect(hull.convexity.value).toBe(1);
    expect(hull.areaErrorMm2).toBeLessThan(1e-6);
  });
});
