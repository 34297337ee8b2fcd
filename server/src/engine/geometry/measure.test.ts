import paper from 'paper';
import fc from 'fast-check';
import { svgPathProperties } from 'svg-path-properties';
import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints } from './arc';
import { measureContour, measureContourDetailed } from './measure';
import {
  circleArcs, contourFromSegments, contoursFromPathData, cubic, ellipseArc, fourCubicCircle, line,
  mapContour, polygonSegments, quad, rectangleSegments, regularPolygonPoints, reverseContour, rotateContourStart,
} from '../../../../test/support/shapes';
import type { ContourMetrics, Measured, Segment } from '../types';

paper.setup(new paper.Size(100, 100));

const value = (m: Measured): number => {
  if (m.value === null) throw new Error(`undefined metric: ${m.reason}`);
  return m.value;
};
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

function expectFigures(m: ContourMetrics, L: number, A: number, Q: number, D: number, tol = 1e-12) {
  expect(rel(m.lengthMm, L)).toBeLessThan(tol);
  expect(rel(value(m.perimeterMm), L)).toBeLessThan(tol);
  expect(rel(value(m.areaMm2), A)).toBeLessThan(tol);
  expect(rel(value(m.q), Q)).toBeLessThan(tol);
  expect(Math.abs(value(m.deficitMm2) - D)).toBeLessThan(tol * L * L * 10);
}

describe('measureContour on check shapes', () => {
  for (const pieces of [1, 2] as const) {
    it(`gives L = 2πr, A = πr², Q = 1, D = 0 for a circle of ${pieces} arc(s) (REFERENCES §2.1)`, () => {
      const m = measureContour(contourFromSegments(circleArcs(3, -2, 2.5, pieces), true), 'up');
      expectFigures(m, 2 * Math.PI * 2.5, Math.PI * 2.5 ** 2, 1, 0, 1e-14);
      expect(m.bboxMm).toEqual([0.5, -4.5, 5.5, 0.5]);
      expect(m.orientation).toBe('ccw');
    });
  }

  const ngons: [number, number, number, number, number][] = [
    [3, 5.196152422706632, 1.299038105676658, 0.6045997880780726, 10.67580572189204],
    [4, 5.65685424949238, 2, 0.7853981633974483, 6.867258771281654],
    [5, 5.877852522924731, 2.377641290737884, 0.86480626597721, 4.670828633837069],
    [6, 6, 2.598076211353316, 0.9068996821171089, 3.351611443784079],
    [8, 6.122934917841436, 2.82842712474619, 0.9480594489685199, 1.947268502854987],
    [12, 6.211657082460498, 3, 0.9770486166568533, 0.8855718670041509],
    [100, 6.282151815625659, 3.139525976465669, 0.9996709915381308, 0.0129844608932921],
  ];
  for (const [n, L, A, Q, D] of ngons) {
    it(`matches the regular ${n}-gon row of REFERENCES §2.2 (R = 1), closed by its chord or by a last line`, () => {
      const pts = regularPolygonPoints(n, 1);
      expect(rel(Q, Math.PI / (n * Math.tan(Math.PI / n)))).toBeLessThan(1e-14); // §2.2 closed form
      expectFigures(measureContour(contourFromSegments(polygonSegments(pts, true), true), 'up'), L, A, Q, D);
      expectFigures(measureContour(contourFromSegments(polygonSegments(pts, false), true), 'up'), L, A, Q, D);
    });
  }

  const rects: [number, number, number, number][] = [
    [2, 1, 0.6981317007977318, 10.86725877128165],
    [3, 1, 0.5890486225480862, 26.30088815692248],
    [10, 1, 0.2596357564950242, 358.3362938564083],
  ];
  for (const [a, b, Q, D] of rects) {
    it(`matches the ${a}×${b} rectangle of REFERENCES §2.3`, () => {
      expectFigures(measureContour(contourFromSegments(rectangleSegments(5, 7, a, b), true), 'down'), 2 * (a + b), a * b, Q, D);
    });
  }

  const ellipses: [number, number, number, number, number][] = [
    [2, 1, 9.6884482205476761984, 0.8411651810063191, 14.90919371351856],
    [10, 3, 43.859100695689089153, 0.6156892154533958, 739.2681857038721],
    [100, 1, 400.10983297226518607, 0.02466046648177922, 156140.0366806582],
  ];
  for (const [a, b, P, Q, D] of ellipses) {
    it(`matches the a = ${a}, b = ${b} ellipse of REFERENCES §2.4 (one arc, U = (a, 0), V = (0, b))`, () => {
      expectFigures(measureContour(contourFromSegments([ellipseArc(0, 0, a, b)], true), 'up'), P, Math.PI * a * b, Q, D);
    });
  }

  it('gives the four-cubic circle L, A, Q, D of REFERENCES §2.10', () => {
    const m = measureContour(contourFromSegments(fourCubicCircle(0, 0, 1), true), 'up');
    expectFigures(m, 6.284066792295422605, 3.142472332656506927, 0.9999994056014552159, 2.347249863e-5, 1e-12);
    expect(Math.abs(value(m.deficitMm2) - 2.347249863e-5)).toBeLessThan(1e-13);
    expect(m.bboxMm).toEqual([-1, -1, 1, 1]);
  });

  it('closes the §4.2 cubic and quadratic by their chords: A = −21/5 and −4/3, chord length added (REFERENCES §4.2)', () => {
    const c = measureContour(contourFromSegments([cubic(0, 0, 1, 2, 3, 2, 4, 0)], true), 'up');
    expect(value(c.signedAreaMm2)).toBeCloseTo(-4.2, 14);
    expect(rel(c.lengthMm, 5.268365543018514145 + 4)).toBeLessThan(1e-12);
    expect(c.orientation).toBe('cw');
    const q = measureContour(contourFromSegments([quad(0, 0, 1, 2, 2, 0)], true), 'up');
    expect(value(q.signedAreaMm2)).toBeCloseTo(-4 / 3, 14);
    expect(rel(q.lengthMm, 2.957885715089194868 + 2)).toBeLessThan(1e-12);
  });

  const shifted: [number, number][] = [
    [1e4, 1.2099999999987086],
    [1e6, 1.2100000000826547],
    [1e8, 1.2100000025331974],
    [1e9, 1.2099999153614078],
  ];
  for (const [d, area] of shifted) {
    it(`keeps the exact area of the stored doubles for the unit quad shifted by ${d} (REFERENCES §7.4)`, () => {
      const pts = [[0.1, 0.2], [1.3, 0.1], [1.2, 1.4], [0.2, 1.1]].map(([x, y]) => [x! + d, y! + d] as [number, number]);
      const m = measureContour(contourFromSegments(polygonSegments(pts, true), true), 'up');
      expect(rel(value(m.signedAreaMm2), area)).toBeLessThan(1e-14);
    });
  }

  it('keeps a circle\'s area when shifted by 1e6 (REFERENCES §7.4: local origin)', () => {
    const m = measureContour(contourFromSegments(fourCubicCircle(1e6, 1e6, 1), true), 'up');
    expect(rel(value(m.areaMm2), 3.142472332656506927)).toBeLessThan(1e-9);
  });
});

describe('measureContour definitions', () => {
  it('gives an open contour its gap and drawn length, and no area (types.ts ContourMetrics)', () => {
    const m = measureContour(contourFromSegments([line(0, 0, 3, 0), line(3, 0, 3, 4)], false), 'down');
    expect(m.closed).toBe(false);
    expect(m.gapMm).toBe(5);
    expect(m.lengthMm).toBe(7);
    for (const k of ['perimeterMm', 'signedAreaMm2', 'areaMm2', 'q', 'deficitMm2'] as const) {
      expect(m[k]).toEqual({ value: null, reason: 'open contour' });
    }
    expect(m.orientation).toBeNull();
    expect(m.bboxMm).toEqual([0, 0, 3, 4]);
    expect(m.segmentCount).toBe(2);
  });

  it('adds the closing chord to a closed contour\'s length and reports gap 0 (3-4-5 triangle)', () => {
    const m = measureContour(contourFromSegments([line(0, 0, 3, 0), line(3, 0, 3, 4)], true), 'up');
    expect(m.gapMm).toBe(0);
    expect(m.lengthMm).toBe(12);
    expect(value(m.signedAreaMm2)).toBe(6);
  });

  it('has zero length, start-point box and no Q for a lone moveto', () => {
    const open = measureContour(contourFromSegments([], false, [2, 3]), 'down');
    expect(open.gapMm).toBe(0);
    expect(open.lengthMm).toBe(0);
    expect(open.bboxMm).toEqual([2, 3, 2, 3]);
    expect(open.segmentCount).toBe(0);
    const closed = measureContour(contourFromSegments([], true, [2, 3]), 'down');
    expect(closed.perimeterMm).toEqual({ value: 0 });
    expect(closed.areaMm2).toEqual({ value: 0 });
    expect(closed.q).toEqual({ value: null, reason: 'zero length' });
    expect(closed.deficitMm2).toEqual({ value: null, reason: 'zero length' });
    expect(closed.orientation).toBeNull();
  });

  it('calls a positive area clockwise in y-down files and counter-clockwise in y-up files (types.ts convention)', () => {
    const square = contourFromSegments(rectangleSegments(0, 0, 1, 1), true); // A = +1
    expect(measureContour(square, 'down').orientation).toBe('cw');
    expect(measureContour(square, 'up').orientation).toBe('ccw');
    const back = reverseContour(square);
    expect(measureContour(back, 'down').orientation).toBe('ccw');
    expect(measureContour(back, 'up').orientation).toBe('cw');
  });

  it('gives a figure-eight the winding-weighted area: lobes of opposite turn cancel (Green\'s theorem)', () => {
    const m = measureContour(contourFromSegments(polygonSegments([[0, 0], [1, 1], [1, 0], [0, 1]], true), true), 'up');
    expect(value(m.signedAreaMm2)).toBe(0);
    expect(m.orientation).toBeNull();
  });

  it('never returns NaN, even for coordinates that overflow products (types.ts: undefined metrics carry a reason)', () => {
    const huge = measureContour(contourFromSegments([cubic(0, 0, 1e300, 1e300, -1e300, 1e300, 1e300, 0)], true), 'up');
    for (const k of ['perimeterMm', 'signedAreaMm2', 'areaMm2', 'q', 'deficitMm2'] as const) {
      const metric = huge[k];
      if (metric.value === null) expect(metric.reason).toBe('numeric overflow');
      else expect(Number.isFinite(metric.value)).toBe(true);
    }
    expect(Number.isNaN(huge.lengthMm)).toBe(false);
    const big = measureContour(contourFromSegments(rectangleSegments(0, 0, 1e160, 1e160), true), 'up');
    expect(big.perimeterMm).toEqual({ value: 4e160 });
    expect(big.q).toEqual({ value: null, reason: 'numeric overflow' });
  });

  it('knows the shortest segment, with getSegmentLength\'s value: Infinity without segments, NaN once a length is NaN', () => {
    const detailed = (segments: Segment[]) => measureContourDetailed(contourFromSegments(segments, false), 'up').shortestSegmentMm;
    // Lines 5 (3-4-5), 2 and 7 long; each half of a circle of radius 1 is π long (REFERENCES.md §2.4).
    expect(detailed([line(0, 0, 3, 4), line(3, 4, 5, 4), line(5, 4, 12, 4)])).toBe(2);
    expect(detailed([line(0, 0, 3, 4), ...circleArcs(10, 10, 1, 2)])).toBe(Math.PI);
    expect(detailed([])).toBe(Infinity);
    expect(detailed([line(0, 0, 3, 4), line(3, 4, NaN, 4), line(NaN, 4, 3, 4), line(3, 4, 3, 4)])).toBeNaN();
  });

  it('reports no depth cap for ordinary curves', () => {
    expect(measureContourDetailed(contourFromSegments(fourCubicCircle(0, 0, 1), true), 'up').lengthDepthCapped).toBe(false);
  });
});

/** Real-world-like path data: editor exports with relative commands, smooth curves, arcs, several subpaths. */
const paths = [
  'M10 10 C 20 20, 40 20, 50 10 S 80 0, 90 10 L 90 50 Q 70 70 50 50 T 10 50 Z',
  'm 12.5,3.2 c 4.1,-1.2 9.8,0.4 11.2,4.9 1.6,5.1 -2.3,10.4 -7.6,11.5 -4.2,0.9 -9.1,-1.3 -10.3,-5.6 -1.1,-4.2 2.6,-9.6 6.7,-10.8 z',
  'M0 0 H40 V25 C40 35 30 40 20 40 C10 40 0 35 0 25 Z',
  'M5 5 L30 5 L30 12 Q30 20 22 20 L5 20 Z',
  'M 100 100 c 0 -27.6 22.4 -50 50 -50 s 50 22.4 50 50 -22.4 50 -50 50 -50 -22.4 -50 -50 z',
  'M2 2 C2 12 12 2 12 12 C12 22 2 12 2 22 L-5 22 Z',
  'M0,0 q 10,-20 20,0 t 20,0 t 20,0 v 30 h -60 z',
  'M 31.4 7.9 C 28 2 18 1 13 6 C 9 10 9 16 12 20 L 25 35 L 38 20 C 41 16 41 10 37 6 Z',
];

describe('measureContour against npm reference libraries', () => {
  for (const d of paths) {
    it(`agrees with svg-path-properties (length) and paper.js (length, area) on "${d.slice(0, 40)}…"`, () => {
      const [contour] = contoursFromPathData(d);
      const m = measureContour(contour!, 'down');
      // svg-path-properties integrates numerically (its own Legendre–Gauss), closing segment included.
      expect(rel(new svgPathProperties(d).getTotalLength(), m.lengthMm)).toBeLessThan(1e-6);
      const p = new paper.Path(d);
      // paper.js Curve.getLength runs a fixed-order Gauss–Legendre; on the S-shaped cubics of path 6 it is
      // off by 5e-8 relative (a 2·10⁶-panel Simpson sum agrees with our value to 2e-14), hence 1e-7.
      expect(rel(m.lengthMm, p.length)).toBeLessThan(1e-7);
      // paper.js `area` is positive for clockwise-on-screen paths, like our signed area in y-down files.
      expect(rel(value(m.signedAreaMm2), p.area)).toBeLessThan(1e-12);
    });
  }

  const arcPaths: [string, number, number][] = [
    // Exact values (not paper.js, which replaces arcs by cubics): circle r = 10 → L = 20π, A = 100π (§2.1);
    // ellipse 4×2 as two complementary arcs → perimeter of §2.4 (4, 2) and A = 8π.
    ['M0 10 A10 10 0 0 1 20 10 A10 10 0 0 1 0 10 Z', 20 * Math.PI, 100 * Math.PI],
    ['M0 0 A4 2 30 1 0 5 3 A4 2 30 0 0 0 0 Z', 19.376896441095352397, 8 * Math.PI],
  ];
  for (const [d, L, A] of arcPaths) {
    it(`gives the exact length and area of arc paths "${d}" (REFERENCES §2.1, §2.4, §5.5)`, () => {
      const m = measureContour(contoursFromPathData(d)[0]!, 'down');
      expect(rel(m.lengthMm, L)).toBeLessThan(1e-13);
      expect(rel(value(m.areaMm2), A)).toBeLessThan(1e-13);
      // svg-path-properties integrates arcs numerically; agrees to its own accuracy.
      expect(rel(new svgPathProperties(d).getTotalLength(), L)).toBeLessThan(1e-4);
    });
  }
});

// ---- Property tests (seeded) ----

// File-like coordinates: micrometre grid within ±100 mm (no subnormals; see the report on arc.ts).
const coord = fc.integer({ min: -100000, max: 100000 }).map((v) => v / 1000);
const point = fc.tuple(coord, coord);

/** A closed loop through 2–7 random points whose last segment returns to the start, mixing all kinds. */
const loopArb = fc
  .array(fc.tuple(point, fc.constantFrom('line', 'quad', 'cubic', 'arc'), point, point, fc.double({ min: 0.1, max: 200, noNaN: true }), fc.boolean(), fc.boolean()), { minLength: 2, maxLength: 7 })
  .map((steps) => {
    const segments: Segment[] = [];
    for (let i = 0; i < steps.length; i++) {
      const [[x0, y0], kind, [ax, ay], [bx, by], r, large, sweep] = steps[i]!;
      const [[x1, y1]] = steps[(i + 1) % steps.length]!;
      if (x0 === x1 && y0 === y1) continue;
      if (kind === 'line') segments.push(line(x0, y0, x1, y1));
      else if (kind === 'quad') segments.push(quad(x0, y0, ax, ay, x1, y1));
      else if (kind === 'cubic') segments.push(cubic(x0, y0, ax, ay, bx, by, x1, y1));
      else segments.push(arcFromSvgEndpoints(x0, y0, r, r / 2, ax, large, sweep, x1, y1, { start: 0, end: 0 })!);
    }
    return contourFromSegments(segments, true);
  })
  .filter((c) => c.segments.length > 0 && measureContour(c, 'up').lengthMm > 1e-3);

function close(a: number, b: number, scale: number, tol = 1e-9) {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * scale);
}

describe('measureContour invariants (fast-check)', () => {
  it('does not depend on the start segment of a loop (seed 101)', () => {
    fc.assert(fc.property(loopArb, fc.nat(), (c, k) => {
      const a = measureContour(c, 'up');
      const b = measureContour(rotateContourStart(c, k % c.segments.length), 'up');
      close(b.lengthMm, a.lengthMm, a.lengthMm);
      close(value(b.signedAreaMm2), value(a.signedAreaMm2), a.lengthMm ** 2);
      expect(b.bboxMm).toEqual(a.bboxMm);
    }), { seed: 101, numRuns: 150 });
  });

  it('flips the sign of the area and keeps the length when reversed (seed 202)', () => {
    fc.assert(fc.property(loopArb, (c) => {
      const a = measureContour(c, 'up');
      const b = measureContour(reverseContour(c), 'up');
      close(b.lengthMm, a.lengthMm, a.lengthMm);
      close(value(b.signedAreaMm2), -value(a.signedAreaMm2), a.lengthMm ** 2);
    }), { seed: 202, numRuns: 150 });
  });

  it('keeps length and area under translation, moving the box (seed 303)', () => {
    fc.assert(fc.property(loopArb, coord, coord, (c, dx, dy) => {
      const a = measureContour(c, 'up');
      const b = measureContour(mapContour(c, [1, 0, 0, 1, dx, dy]), 'up');
      close(b.lengthMm, a.lengthMm, a.lengthMm);
      close(value(b.signedAreaMm2), value(a.signedAreaMm2), a.lengthMm ** 2);
      b.bboxMm.forEach((v, i) => close(v, a.bboxMm[i]! + (i % 2 === 0 ? dx : dy), 400, 1e-12));
    }), { seed: 303, numRuns: 150 });
  });

  it('scales A by k², L by k and keeps Q under uniform scaling (seed 404)', () => {
    fc.assert(fc.property(loopArb, fc.double({ min: 0.01, max: 100, noNaN: true }), (c, k) => {
      const a = measureContour(c, 'up');
      const b = measureContour(mapContour(c, [k, 0, 0, k, 0, 0]), 'up');
      close(b.lengthMm, k * a.lengthMm, k * a.lengthMm);
      close(value(b.signedAreaMm2), k * k * value(a.signedAreaMm2), (k * a.lengthMm) ** 2);
      close(value(b.q), value(a.q), 1);
    }), { seed: 404, numRuns: 150 });
  });

  it('keeps length, area and orientation under a 90° rotation, rotating the box (seed 505)', () => {
    fc.assert(fc.property(loopArb, (c) => {
      const a = measureContour(c, 'down');
      const b = measureContour(mapContour(c, [0, 1, -1, 0, 0, 0]), 'down'); // (x, y) ↦ (−y, x)
      close(b.lengthMm, a.lengthMm, a.lengthMm);
      close(value(b.signedAreaMm2), value(a.signedAreaMm2), a.lengthMm ** 2);
      const [x0, y0, x1, y1] = a.bboxMm;
      [-y1, x0, -y0, x1].forEach((v, i) => close(b.bboxMm[i]!, v, 400, 1e-9));
    }), { seed: 505, numRuns: 150 });
  });
});
