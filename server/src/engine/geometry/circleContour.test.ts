import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { arc, circleArcs, contourFromSegments, ellipseArc, line } from '../../../../test/support/shapes';
import type { Arc, Contour, Segment } from '../types';
import { getContourCircle } from './circleContour';
import { measureContour } from './measure';
import { getRoundness } from './roundness';

const size = (c: Contour) => {
  const [a, b, cc, d] = measureContour(c, 'up').bboxMm;
  return Math.hypot(cc - a, d - b);
};
const circleOf = (segments: readonly Segment[]) => {
  const c = contourFromSegments(segments, true);
  return getContourCircle(c, size(c));
};

/** A circle about (cx, cy) of radius r cut into arcs at the given angles (ascending, from θ0), drawn
 *  counter-clockwise, or clockwise when `clockwise`; consecutive arcs share their end points. */
function cutCircle(cx: number, cy: number, r: number, theta0: number, cuts: readonly number[], clockwise: boolean): Arc[] {
  const stops = [theta0, ...cuts.map((t) => theta0 + t), theta0 + 2 * Math.PI];
  const arcs = stops.slice(1).map((t, i) => arc(cx, cy, r, 0, 0, r, stops[i]!, t - stops[i]!));
  for (let i = 1; i < arcs.length; i++) arcs[i] = { ...arcs[i]!, x0: arcs[i - 1]!.x1, y0: arcs[i - 1]!.y1 };
  arcs[arcs.length - 1] = { ...arcs[arcs.length - 1]!, x1: arcs[0]!.x0, y1: arcs[0]!.y0 };
  if (!clockwise) return arcs;
  return arcs.reverse().map((s) => ({ ...s, x0: s.x1, y0: s.y1, x1: s.x0, y1: s.y0, theta0: s.theta0 + s.sweep, sweep: -s.sweep }));
}

describe('getContourCircle: a contour of arcs of one circle, once round', () => {
  it('finds the circle of one full arc (a DXF CIRCLE), two half arcs and four quarter arcs (an SVG circle), either way round', () => {
    for (const segments of [circleArcs(4, -3, 7, 1), circleArcs(4, -3, 7, 2), cutCircle(4, -3, 7, 0, [Math.PI / 2, Math.PI, 1.5 * Math.PI], false),
      cutCircle(4, -3, 7, 0, [Math.PI / 2, Math.PI, 1.5 * Math.PI], true)]) {
      const circle = circleOf(segments)!;
      expect(circle).not.toBeNull();
      expect(circle.cx).toBeCloseTo(4, 12);
      expect(circle.cy).toBeCloseTo(-3, 12);
      expect(circle.r).toBeCloseTo(7, 12);
      expect(circle.deviationMm).toBeLessThan(1e-12);
    }
  });

  it('finds nothing in an ellipse, a lens of two circles, a semicircle and its diameter, a circle drawn twice, arcs that turn both ways or leave a gap', () => {
    const half = arc(0, 0, 5, 0, 0, 5, 0, Math.PI);
    const cases: [string, Segment[]][] = [
      ['an ellipse with semi-axes 5 and 4.99', [ellipseArc(0, 0, 5, 4.99)]],
      // Two arcs of radius 5 about (±3, 0), meeting at (0, ±4).
      ['a lens', [arc(-3, 0, 5, 0, 0, 5, -Math.atan2(4, 3), 2 * Math.atan2(4, 3)), arc(3, 0, 5, 0, 0, 5, Math.PI - Math.atan2(4, 3), 2 * Math.atan2(4, 3))]],
      ['a semicircle and its diameter', [half, line(-5, half.y1, 5, 0)]],
      ['a circle drawn twice', [...circleArcs(0, 0, 5, 1), ...circleArcs(0, 0, 5, 1)]],
      ['two half arcs turning opposite ways', [half, { ...half, theta0: Math.PI, sweep: -Math.PI, x0: half.x1, y0: half.y1, x1: 5, y1: 0 }]],
      ['two half arcs, the second starting 1e-6 mm off the first one\'s end', [half, { ...arc(0, 0, 5, 0, 0, 5, Math.PI, Math.PI), x0: half.x1 + 1e-6 }]],
      ['a circle whose second half has a radius 1e-6 mm larger', [half, arc(0, 0, 5 + 1e-6, 0, 0, 5 + 1e-6, Math.PI, Math.PI)]],
    ];
    for (const [name, segments] of cases) expect(circleOf(segments), name).toBeNull();
  });

  it('finds the circle however it is cut, placed and drawn (fast-check, seed 97)', () => {
    const drawn = fc.record({
      cx: fc.double({ min: -1e5, max: 1e5, noNaN: true }), cy: fc.double({ min: -1e5, max: 1e5, noNaN: true }),
      r: fc.double({ min: 1e-2, max: 1e4, noNaN: true }), theta0: fc.double({ min: -10, max: 10, noNaN: true }),
      cuts: fc.uniqueArray(fc.double({ min: 0.01, max: 2 * Math.PI - 0.01, noNaN: true }), { maxLength: 6 }), clockwise: fc.boolean(),
    });
    fc.assert(fc.property(drawn, ({ cx, cy, r, theta0, cuts, clockwise }) => {
      const circle = circleOf(cutCircle(cx, cy, r, theta0, cuts.slice().sort((a, b) => a - b), clockwise))!;
      expect(circle).not.toBeNull();
      const scale = Math.abs(cx) + Math.abs(cy) + r;
      expect(Math.abs(circle.cx - cx) + Math.abs(circle.cy - cy) + Math.abs(circle.r - r)).toBeLessThan(1e-12 * scale);
    }), { seed: 97, numRuns: 300 });
  });
});

describe('getRoundness of a whole circle', () => {
  it('gives ρ = R = r about the centre and a minimum zone of 0 (handbook: a circle is its own inscribed and enclosing circle)', () => {
    const c = contourFromSegments(cutCircle(30, 40, 12.5, 0.3, [1, 2, 4], true), true);
    const { roundness, hull } = getRoundness(c, measureContour(c, 'up'), false);
    for (const figure of [roundness.inradius, roundness.circumradius]) {
      expect(figure.value?.valueMm).toBeCloseTo(12.5, 12);
      expect(figure.value?.centreXMm).toBeCloseTo(30, 12);
      expect(figure.value?.centreYMm).toBeCloseTo(40, 12);
      expect(figure.value?.errorBoundMm).toBeLessThan(1e-12);
    }
    expect(roundness.minZone.value?.valueMm).toBe(0);
    expect(roundness.radiusGapMm.value).toBe(0);
    expect(hull.areaMm2).toBeCloseTo(Math.PI * 12.5 ** 2, 10);
  });

  it('leaves a circle whose halves differ in radius by 1e-6 mm to the searches, which see a zone, not 0', () => {
    const c = contourFromSegments([arc(0, 0, 5, 0, 0, 5, 0, Math.PI), arc(0, 0, 5 + 1e-6, 0, 0, 5 + 1e-6, Math.PI, Math.PI)], true);
    expect(getContourCircle(c, size(c))).toBeNull();
    expect(getRoundness(c, measureContour(c, 'up'), false).roundness.minZone.value!.valueMm).toBeGreaterThan(1e-7);
  });
});
