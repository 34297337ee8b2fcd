import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import paper from 'paper';
import { svgPathProperties } from 'svg-path-properties';
import { findContourCrossings, findIntersections, findSelfIntersections } from './intersect';
import {
  arc, circleArcs, contourFromSegments, contoursFromPathData, cubic, line, polygonSegments, reverseContour, reverseSegment,
  rotateContourStart,
} from '../../../../test/support/shapes';
import type { Contour, Segment, SourceSpan } from '../types';

const polygon = (pts: readonly (readonly [number, number])[]) => contourFromSegments(polygonSegments(pts, false), true);
const points = (c: Contour) => findSelfIntersections(c).intersections.map((x) => [x.kind, x.x, x.y] as const);

describe('findSelfIntersections on polygons', () => {
  it('finds the bow-tie crossing at (1, 1) (REFERENCES.md §1.4 check value)', () => {
    expect(points(polygon([[0, 0], [2, 2], [2, 0], [0, 2]]))).toEqual([['crossing', 1, 1]]);
  });

  it('reports nothing for a convex square: consecutive segments meeting at their shared end are not intersections (REFERENCES.md §4.8)', () => {
    expect(points(polygon([[0, 0], [1, 0], [1, 1], [0, 1]]))).toEqual([]);
  });

  it('reports a vertex lying on another edge as a touch, not a crossing (common practice, no source)', () => {
    expect(points(polygon([[0, 0], [4, 0], [4, 4], [2, 0], [0, 4]]))).toEqual([['touch', 2, 0]]);
  });

  it('reports a contour passing twice through one vertex with interleaved directions as one crossing (common practice, no source)', () => {
    // Passes SW→NE and SE→NW through (1, 1).
    expect(points(polygon([[0, 0], [1, 1], [2, 2], [2, 0], [1, 1], [0, 2]]))).toEqual([['crossing', 1, 1]]);
  });

  it('reports a contour passing twice through one vertex without interleaving as one touch (common practice, no source)', () => {
    // Passes SW→SE and NE→NW through (1, 1): both stay on their own side.
    expect(points(polygon([[0, 0], [1, 1], [2, 0], [2, 2], [1, 1], [0, 2]]))).toEqual([['touch', 1, 1]]);
  });

  it('reports a spike doubling back on the previous segment as an overlap with its length (REFERENCES.md §4.8)', () => {
    const r = findSelfIntersections(polygon([[0, 0], [4, 0], [2, 0], [2, 3]]));
    expect(r.intersections).toEqual([]);
    expect(r.overlaps.map((o) => o.length)).toEqual([2]); // the 2 mm from (4,0) back to (2,0), by hand
  });

  it('ignores collinear runs, repeated points and zero-length segments (REFERENCES.md §4.8)', () => {
    expect(points(polygon([[0, 0], [1, 0], [1, 0], [2, 0], [3, 0], [3, 3], [3, 3], [0, 3]]))).toEqual([]);
  });

  it('keeps sub-micron detail at coordinates near 1e7 mm: a 0.25 µm bow-tie still crosses at its centre (REFERENCES.md §7.1–7.2)', () => {
    const o = 1e7, d = 2 ** -22; // 2.4e-7 mm, exactly representable offsets
    const r = points(polygon([[o, o], [o + d, o + d], [o + d, o], [o, o + d]]));
    expect(r).toEqual([['crossing', o + d / 2, o + d / 2]]);
    expect(points(polygon([[o, o], [o + d, o], [o + d, o + d], [o, o + d]]))).toEqual([]);
  });
});

describe('findSelfIntersections on curves', () => {
  it('finds the loop of a self-looping cubic and nothing at its ends (solved by hand from the Bernstein form)', () => {
    // (0,0),(3,3),(−1,3),(2,0): x(t) = 9t − 21t² + 14t³, y(t) = 9t(1 − t) = y(1 − t); the loop closes
    // where x(t) = x(1 − t): 2(2t − 1)(7t² − 7t + 1) = 0 ⇒ t = (7 ± √21)/14, t(1 − t) = 1/7, y = 9/7.
    const c = contourFromSegments([cubic(0, 0, 3, 3, -1, 3, 2, 0)], false);
    const r = findSelfIntersections(c).intersections;
    expect(r).toHaveLength(1);
    expect(r[0]!.kind).toBe('crossing');
    expect(r[0]!.y).toBeCloseTo(9 / 7, 12);
    const t = (7 - Math.sqrt(21)) / 14;
    expect(r[0]!.x).toBeCloseTo(9 * t - 21 * t * t + 14 * t ** 3, 12);
  });

  it('reports an S-curve and its mirror image meeting at their common inflection with a vertical tangent as a crossing (odd-order contact; paper.js reports none here)', () => {
    // C1 and its mirror in x = 50 both pass (50, 50) with tangent (0, 1): x − 50 changes sign with
    // opposite signs on the two curves, so they cross there (third-order contact).
    const [c] = contoursFromPathData('M10 10 C 90 10 10 90 90 90 L 90 10 C 10 10 90 90 10 90 Z');
    const r = findSelfIntersections(c!).intersections;
    expect(r).toHaveLength(1);
    expect(r[0]!.kind).toBe('crossing');
    expect(r[0]!.x).toBeCloseTo(50, 6);
    expect(r[0]!.y).toBeCloseTo(50, 6);
  });

  it('finds a line crossing a circle of two arcs at the exact circle points (circle equation, by hand)', () => {
    const circle = contourFromSegments(circleArcs(0, 0, 5, 2), true);
    const chord = contourFromSegments([line(3, -10, 3, 10)], false);
    const r = findContourCrossings([circle, chord]).intersections;
    expect(r.map((x) => x.kind)).toEqual(['crossing', 'crossing']);
    for (const x of r) expect(Math.abs(x.y)).toBeCloseTo(4, 12); // 3-4-5 triangle
  });

  it('reports a line tangent to an arc as a touch (circle equation, by hand)', () => {
    const circle = contourFromSegments(circleArcs(0, 0, 5, 2), true);
    const tangent = contourFromSegments([line(5, -10, 5, 10)], false);
    const r = findContourCrossings([circle, tangent]).intersections;
    expect(r).toHaveLength(1);
    expect(r[0]!.kind).toBe('touch');
    expect(r[0]!.x).toBeCloseTo(5, 12);
    expect(r[0]!.y).toBeCloseTo(0, 6);
  });

  it('finds two circles crossing where the radical line meets them (circle–circle, by hand)', () => {
    const a = contourFromSegments(circleArcs(0, 0, 5, 2), true);
    const b = contourFromSegments([arc(8, 0, 5, 0, 0, 5, 0, 2 * Math.PI)], true);
    const r = findContourCrossings([a, b]).intersections;
    expect(r.map((x) => x.kind)).toEqual(['crossing', 'crossing']);
    for (const x of r) {
      expect(x.x).toBeCloseTo(4, 9); // radical line x = 8/2
      expect(Math.abs(x.y)).toBeCloseTo(3, 9);
    }
  });

  it('reports duplicate whole contours, forward and reversed, as double cuts of their full length (REFERENCES.md §2.1: L = 2πr)', () => {
    const cs = contoursFromPathData('M0 0 A5 5 0 0 1 10 0 A5 5 0 0 1 0 0Z M0 0 A5 5 0 0 1 10 0 A5 5 0 0 1 0 0Z M0 0 A5 5 0 0 0 10 0 A5 5 0 0 0 0 0Z');
    const r = findIntersections(cs);
    expect(r.intersections).toEqual([]);
    expect(r.overlaps.map((o) => [o.a.contour, o.b.contour])).toEqual([[0, 1], [0, 2], [1, 2]]);
    for (const o of r.overlaps) expect(o.length).toBeCloseTo(10 * Math.PI, 9);
  });

  it('reports a reversed duplicate cubic contour as one double cut (identical curves either direction)', () => {
    const r = findIntersections(contoursFromPathData('M0 0 C3 3 7 3 10 0Z M10 0 C7 3 3 3 0 0Z'));
    expect(r.overlaps).toHaveLength(1);
    expect(r.intersections).toEqual([]);
  });

  it('reports collinear overlapping lines of two contours with their overlap length (by hand)', () => {
    const r = findIntersections([polygon([[0, 0], [10, 0], [10, 5], [0, 5]]), polygon([[4, 0], [14, 0], [14, -5], [4, -5]])]);
    expect(r.overlaps.map((o) => o.length)).toEqual([6]);
    expect(r.intersections).toEqual([]);
  });
});

// ---------------------------------------------------------------- double cuts and where a loop starts

/** The contour with segment i given the source span [base + 10i, base + 10i + 5]. */
const withSpans = (c: Contour, base: number): Contour => ({
  ...c,
  segments: c.segments.map((s, i) => ({ ...s, span: { start: base + 10 * i, end: base + 10 * i + 5 } })),
});
/** The smallest span holding the spans of segments `indices` of a contour numbered by withSpans(…, 0). */
const hullOfSpans = (indices: readonly number[]): SourceSpan => ({ start: 10 * Math.min(...indices), end: 10 * Math.max(...indices) + 5 });

describe('double cuts do not depend on where a loop starts or which way it runs', () => {
  it('reports a square of side s drawn twice as one double cut of length 4s wherever the copy starts (each corner, each edge midpoint) and whichever way it runs (perimeter of a square, elementary geometry)', () => {
    const s = 10;
    const corners: [number, number][] = [[0, 0], [s, 0], [s, s], [0, s]];
    const square = withSpans(contourFromSegments(polygonSegments(corners, true), true), 0);
    const starts: [number, number][][] = [];
    for (let k = 0; k < 4; k++) {
      const turned = [...corners.slice(k), ...corners.slice(0, k)];
      const [[x0, y0], [x1, y1]] = turned as [[number, number], [number, number]];
      starts.push(turned, [[(x0 + x1) / 2, (y0 + y1) / 2], ...turned.slice(1), turned[0]!]);
    }
    for (const pts of starts) {
      for (const back of [false, true]) {
        const drawn = contourFromSegments(polygonSegments(pts, true), true);
        const copy = withSpans(back ? reverseContour(drawn) : drawn, 100);
        const r = findIntersections([square, copy]);
        expect(r.intersections).toEqual([]);
        expect(r.overlaps).toHaveLength(1);
        const o = r.overlaps[0]!;
        expect(o.length).toBeCloseTo(4 * s, 12);
        // The run covers every segment of both contours: its spans hold all of them.
        expect(o.a.span).toEqual({ start: 0, end: 35 });
        expect(o.b.span).toEqual({ start: 100, end: 100 + 10 * (copy.segments.length - 1) + 5 });
        // A run round the whole loop is reported from the start of contour a (this module's convention).
        expect([o.x, o.y, o.a.firstSegment, o.a.lastSegment]).toEqual([0, 0, 0, 3]);
      }
    }
  });

  it('reports a slot cut out along two edges and back as one double cut of length 4 wherever the contour starts, also when the run crosses the start vertex, either way round (by hand)', () => {
    // Out (0,0)→(2,0)→(4,0), back to (0,0), then round the triangle (0,0), (0,3), (−3,0).
    const loop = contourFromSegments(polygonSegments([[0, 0], [2, 0], [4, 0], [2, 0], [0, 0], [0, 3], [-3, 0]], true), true);
    for (const back of [false, true]) {
      for (let k = 0; k < loop.segments.length; k++) {
        const c = withSpans(rotateContourStart(back ? reverseContour(loop) : loop, k), 0);
        const r = findSelfIntersections(c);
        expect(r.overlaps.map((o) => o.length)).toEqual([4]);
        // One side of the run is the way out (+x along y = 0, x ≥ 0), the other the way back.
        const leg = (dir: number) => c.segments.flatMap((g, i) => (g.y0 === 0 && g.y1 === 0 && Math.min(g.x0, g.x1) >= 0 && Math.sign(g.x1 - g.x0) === dir ? [i] : []));
        const o = r.overlaps[0]!;
        const bySpan = (p: SourceSpan, q: SourceSpan) => p.start - q.start || p.end - q.end;
        expect([o.a.span, o.b.span].sort(bySpan)).toEqual([hullOfSpans(leg(1)), hullOfSpans(leg(-1))].sort(bySpan));
      }
    }
  });

  // Loops through 3–7 points of a circle of radius 50 (multiples of 5°), each step a chord, the arc
  // of the circle or a cubic S-curve off the chord; each with its length from an outside reference.
  const R = 50;
  const loopArb = fc
    .tuple(
      fc.uniqueArray(fc.integer({ min: 0, max: 71 }), { minLength: 3, maxLength: 7 }),
      fc.array(fc.tuple(fc.constantFrom('line', 'arc', 'cubic'), fc.constantFrom(-3, -2, -1, 1, 2, 3)), { minLength: 7, maxLength: 7 }),
    )
    .map(([steps, kinds]) => {
      const angles = [...steps].sort((p, q) => p - q).map((d) => (d * 5 * Math.PI) / 180);
      const v = angles.map((a) => [R * Math.cos(a), R * Math.sin(a)] as const);
      const segments: Segment[] = [];
      const lengths: number[] = [];
      for (let i = 0; i < v.length; i++) {
        const [x0, y0] = v[i]!, [x1, y1] = v[(i + 1) % v.length]!;
        const [kind, bulge] = kinds[i]!;
        const dx = x1 - x0, dy = y1 - y0, h = bulge / 10;
        if (kind === 'line') {
          segments.push(line(x0, y0, x1, y1));
          lengths.push(Math.hypot(dx, dy)); // Pythagoras
        } else if (kind === 'arc') {
          const sweep = i + 1 < v.length ? angles[i + 1]! - angles[i]! : angles[0]! + 2 * Math.PI - angles[i]!;
          segments.push({ ...arc(0, 0, R, 0, 0, R, angles[i]!, sweep), x0, y0, x1, y1 });
          lengths.push(R * sweep); // REFERENCES.md §2.1: L = r·θ
        } else {
          const c = cubic(x0, y0, x0 + dx / 3 - h * dy, y0 + dy / 3 + h * dx, x0 + (2 * dx) / 3 + h * dy, y0 + (2 * dy) / 3 - h * dx, x1, y1);
          segments.push(c);
          // svg-path-properties integrates numerically (its own Legendre–Gauss).
          lengths.push(new svgPathProperties(`M${c.x0} ${c.y0} C${c.x1} ${c.y1} ${c.x2} ${c.y2} ${c.x3} ${c.y3}`).getTotalLength());
        }
      }
      return { loop: contourFromSegments(segments, true), lengths };
    });

  /**
   * The contour started midway along its first segment when that is an arc, else null. (Not lines:
   * a rounded midpoint is off the line by an ulp, and whether lines are collinear is decided exactly;
   * the square above starts copies at exact midpoints.)
   */
  const startMidway = (c: Contour): Contour | null => {
    const [s, ...rest] = c.segments;
    if (s!.kind !== 'arc') return null;
    const half = arc(s!.cx, s!.cy, s!.ux, s!.uy, s!.vx, s!.vy, s!.theta0, s!.sweep / 2);
    const second = { ...arc(s!.cx, s!.cy, s!.ux, s!.uy, s!.vx, s!.vy, s!.theta0 + s!.sweep / 2, s!.sweep / 2), x0: half.x1, y0: half.y1, x1: s!.x1, y1: s!.y1 };
    return contourFromSegments([second, ...rest, { ...half, x0: s!.x0, y0: s!.y0 }], true);
  };

  const rel = (a: number, b: number) => Math.abs(a - b) / b;

  it('reports a loop of chords, arcs and cubics drawn twice as one double cut of its perimeter for every start vertex (also midway along an arc) and both directions of the copy (Pythagoras, L = r·θ of REFERENCES.md §2.1, svg-path-properties for cubics; seed 71)', () => {
    fc.assert(
      fc.property(loopArb, ({ loop, lengths }) => {
        const perimeter = lengths.reduce((p, q) => p + q, 0);
        const found: number[] = [];
        for (const back of [false, true]) {
          for (let k = 0; k < loop.segments.length; k++) {
            const copy = rotateContourStart(back ? reverseContour(loop) : loop, k);
            for (const c of [copy, startMidway(copy)]) {
              if (c === null) continue;
              const r = findIntersections([loop, c]);
              expect(r.overlaps).toHaveLength(1);
              found.push(r.overlaps[0]!.length);
            }
          }
        }
        for (const l of found) {
          expect(rel(l, perimeter)).toBeLessThan(1e-6);
          expect(rel(l, found[0]!)).toBeLessThan(1e-9);
        }
      }),
      { seed: 71, numRuns: 60 },
    );
  });

  it('reports a contour that runs along a path of chords, arcs and cubics and back as one double cut of the path\'s length for every start vertex and both directions (Pythagoras, L = r·θ of REFERENCES.md §2.1, svg-path-properties for cubics; seed 72)', () => {
    fc.assert(
      fc.property(loopArb, ({ loop, lengths }) => {
        const path = loop.segments.slice(0, -1);
        const pathLength = lengths.slice(0, -1).reduce((p, q) => p + q, 0);
        const fold = contourFromSegments([...path, ...[...path].reverse().map(reverseSegment)], true);
        const found: number[] = [];
        for (const back of [false, true]) {
          for (let k = 0; k < fold.segments.length; k++) {
            const r = findSelfIntersections(rotateContourStart(back ? reverseContour(fold) : fold, k));
            expect(r.overlaps).toHaveLength(1);
            found.push(r.overlaps[0]!.length);
          }
        }
        for (const l of found) {
          expect(rel(l, pathLength)).toBeLessThan(1e-6);
          expect(rel(l, found[0]!)).toBeLessThan(1e-9);
        }
      }),
      { seed: 72, numRuns: 60 },
    );
  });
});

// ---------------------------------------------------------------- exact reference (REFERENCES.md §7)

type Q = [bigint, bigint]; // numerator, denominator > 0
const orientExact = (a: bigint[], b: bigint[], c: bigint[]) => {
  const d = (b[0]! - a[0]!) * (c[1]! - a[1]!) - (b[1]! - a[1]!) * (c[0]! - a[0]!);
  return d > 0n ? 1 : d < 0n ? -1 : 0;
};
const gcd = (a: bigint, b: bigint): bigint => { a = a < 0n ? -a : a; b = b < 0n ? -b : b; while (b) [a, b] = [b, a % b]; return a; };
const norm = ([n, d]: Q): Q => { if (d < 0n) { n = -n; d = -d; } const g = gcd(n, d) || 1n; return [n / g, d / g]; };

/**
 * Brute-force O(n²) reference: distinct meeting points of non-neighbouring edges of a closed polygon
 * with integer vertices, in exact rational arithmetic; null when some edges overlap collinearly.
 */
function referencePoints(pts: bigint[][]): string[] | null {
  const n = pts.length;
  const out = new Set<string>();
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const p = pts[i]!, q = pts[(i + 1) % n]!, r = pts[j]!, s = pts[(j + 1) % n]!;
      const adjacent = j === i + 1 || (i === 0 && j === n - 1);
      const o1 = orientExact(p, q, r), o2 = orientExact(p, q, s), o3 = orientExact(r, s, p), o4 = orientExact(r, s, q);
      if (o1 === 0 && o2 === 0) {
        const ax = p[0] !== q[0] ? 0 : 1;
        const lo = [p[ax]!, q[ax]!].sort((a, b) => (a < b ? -1 : 1)), lo2 = [r[ax]!, s[ax]!].sort((a, b) => (a < b ? -1 : 1));
        const a = lo[0]! > lo2[0]! ? lo[0]! : lo2[0]!, b = lo[1]! < lo2[1]! ? lo[1]! : lo2[1]!;
        if (a < b) return null;
        if (a === b && !adjacent) {
          const pt = [p, q, r, s].find((v) => v[ax] === a)!;
          out.add(`${pt[0]}/1,${pt[1]}/1`);
        }
        continue;
      }
      if (adjacent) continue;
      if ((o1 !== 0 && o1 === o2) || (o3 !== 0 && o3 === o4)) continue;
      // P + t(Q − P), t = cross(R − P, S − R) / cross(Q − P, S − R).
      const cross = (a: bigint[], b: bigint[]) => a[0]! * b[1]! - a[1]! * b[0]!;
      const qp = [q[0]! - p[0]!, q[1]! - p[1]!], sr = [s[0]! - r[0]!, s[1]! - r[1]!], rp = [r[0]! - p[0]!, r[1]! - p[1]!];
      const den = cross(qp, sr), num = cross(rp, sr);
      const x = norm([p[0]! * den + qp[0]! * num, den]), y = norm([p[1]! * den + qp[1]! * num, den]);
      out.add(`${x[0]}/${x[1]},${y[0]}/${y[1]}`);
    }
  }
  return [...out].sort();
}

/** The same points from floats: snapped to the nearest rational with denominator ≤ 2^20. */
function distinctPoints(c: Contour, scale: number): string[] {
  const keys = new Set<string>();
  const snap = (v: number) => {
    // Continued-fraction best rational approximation of v·scale.
    let [h0, h1, k0, k1] = [0n, 1n, 1n, 0n];
    let x = v * scale;
    for (let k = 0; k < 40; k++) {
      const a = BigInt(Math.floor(x));
      [h0, h1] = [h1, a * h1 + h0];
      [k0, k1] = [k1, a * k1 + k0];
      const f = x - Math.floor(x);
      if (Math.abs(Number(h1) / Number(k1) - v * scale) <= 1e-9 * Math.max(1, Math.abs(v * scale)) || f === 0) break;
      x = 1 / f;
    }
    const [n, d] = norm([h1, k1]);
    return `${n}/${d}`;
  };
  const r = findSelfIntersections(c);
  for (const x of r.intersections) keys.add(`${snap(x.x)},${snap(x.y)}`);
  return [...keys].sort();
}

describe('findSelfIntersections against an exact brute-force reference (REFERENCES.md §7)', () => {
  it('finds the same distinct points as exact BigInt arithmetic on 3000 random grid polygons with many touches and collinear runs (seed 7)', () => {
    let compared = 0;
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 6 })), { minLength: 3, maxLength: 12 }), (raw) => {
        const pts = raw.filter((p, i) => i === 0 || p[0] !== raw[i - 1]![0] || p[1] !== raw[i - 1]![1]);
        while (pts.length > 1 && pts[0]![0] === pts[pts.length - 1]![0] && pts[0]![1] === pts[pts.length - 1]![1]) pts.pop();
        if (pts.length < 3) return;
        const ref = referencePoints(pts.map(([x, y]) => [BigInt(x), BigInt(y)]));
        if (ref === null) return;
        compared++;
        expect(distinctPoints(polygon(pts), 1)).toEqual(ref);
      }),
      { seed: 7, numRuns: 3000 },
    );
    expect(compared).toBeGreaterThan(1000);
  });

  it('agrees with the exact reference on 2000 near-collinear polygons with vertices 2^-40 apart at 1e3 mm (seed 11)', () => {
    const unit = 2 ** -40;
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 40 }), fc.integer({ min: -2, max: 2 })), { minLength: 4, maxLength: 10 }), (raw) => {
        // Points on the line y = x (1e3 mm out) bent by a few units of 2^-40 mm.
        const ints = raw.map(([i, j]) => [BigInt(i) * 1024n, BigInt(i) * 1024n + BigInt(j)]);
        const pts = ints.filter((p, k) => k === 0 || p[0] !== ints[k - 1]![0] || p[1] !== ints[k - 1]![1]);
        while (pts.length > 1 && pts[0]![0] === pts[pts.length - 1]![0] && pts[0]![1] === pts[pts.length - 1]![1]) pts.pop();
        if (pts.length < 3) return;
        const ref = referencePoints(pts);
        if (ref === null) return;
        const c = polygon(pts.map(([x, y]) => [1000 + Number(x) * unit, 1000 + Number(y) * unit]));
        const got = findSelfIntersections(c).intersections.length > 0;
        expect(got).toBe(ref.length > 0);
      }),
      { seed: 11, numRuns: 2000 },
    );
  });
});

// ---------------------------------------------------------------- paper.js as outside reference

describe('intersection points against paper.js (npm `paper`)', () => {
  paper.setup(new paper.Size(100, 100));
  const cases = [
    'M10 10 C 90 10 10 90 90 90 L 90 10 C 20 10 80 90 10 90 Z',
    'M0 0 Q 50 100 100 0 Q 50 -40 0 60 L 100 60 Z',
    'M5 5 C 95 5 95 95 5 95 C 60 70 60 30 95 50 L 5 50 Z',
    'M20 80 L 80 20 C 120 60 40 120 20 20 Q 60 0 100 80 Z',
  ];
  for (const d of cases) {
    it(`finds the crossings paper finds within 1e-7 of the outline size in "${d.slice(0, 24)}…"`, () => {
      const [contour] = contoursFromPathData(d);
      const mine = findSelfIntersections(contour!).intersections.filter((x) => x.kind === 'crossing');
      const path = new paper.Path(d);
      const theirs = path.getIntersections(path).filter((l) => l.isCrossing());
      const size = Math.hypot(path.bounds.width, path.bounds.height);
      const unique: { x: number; y: number }[] = [];
      for (const l of theirs) if (!unique.some((u) => Math.hypot(u.x - l.point.x, u.y - l.point.y) < 1e-6 * size)) unique.push({ x: l.point.x, y: l.point.y });
      expect(mine.length).toBe(unique.length);
      for (const u of unique) {
        const d2 = Math.min(...mine.map((m) => Math.hypot(m.x - u.x, m.y - u.y)));
        expect(d2).toBeLessThanOrEqual(1e-7 * size);
      }
    });
  }
});

describe('piece buffers kept from one file-wide search for the next (reuseBuffers)', () => {
  /** A star polygon with n spikes, some edges of each crossing another, plus an arc drawn twice. */
  const drawing = (n: number, shift: number): Contour[] => {
    const pts: [number, number][] = [];
    for (let k = 0; k < n; k++) {
      const a = (2 * Math.PI * k) / n;
      const r = k % 2 ? 40 : 100 + (k % 7) * 3;
      pts.push([shift + r * Math.cos(a), r * Math.sin(a)]);
    }
    pts.splice(5, 0, [shift - 50, 0]); // one edge across the star
    const twice = arc(shift, 0, 60, 0, 0, 60, 0, Math.PI);
    return [polygon(pts), contourFromSegments([twice, twice], false, [shift + 60, 0])];
  };

  it('gives a search after a larger and after a smaller one the result of a search with fresh buffers (the spare is not cleared: pieces are written whole; reference: the same search without reuse)', () => {
    // The larger drawing starts with curves, so the smaller one's line pieces land where curve fields were.
    const curls = contourFromSegments(Array.from({ length: 300 }, (_, k) => cubic(k, 0, k + 0.2, 3, k + 0.8, -3, k + 1, 0)), false);
    const small = drawing(600, 0), large = [curls, ...drawing(2000, 7)];
    const fresh = findIntersections(small);
    expect(fresh.intersections.length).toBeGreaterThan(0);
    expect(fresh.overlaps.length).toBeGreaterThan(0);
    // 2000 spikes' pieces are within 4 times the 600's, so the second search takes the first one's buffers.
    findIntersections(large, { reuseBuffers: true });
    expect(findIntersections(small, { reuseBuffers: true })).toEqual(fresh);
    expect(findIntersections(small, { reuseBuffers: true })).toEqual(fresh);
    expect(findIntersections(large, { reuseBuffers: true })).toEqual(findIntersections(large));
  });
});
