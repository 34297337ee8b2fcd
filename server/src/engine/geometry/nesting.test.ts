import { describe, expect, it } from 'vitest';
import { readSvg } from '../formats/svg/readSvg';
import { wrapSvg } from '../../../../test/support/checkCases';
import { measureContour } from './measure';
import { getFileSummary, getNesting, MAX_WINDING_TESTS } from './nesting';
import { createWindingTester, getWindingNumber } from './winding';
import { circleArcs, contourFromSegments, polygonSegments } from '../../../../test/support/shapes';

const analyse = (svg: string) => {
  const read = readSvg(wrapSvg(svg), { assumedUnit: 'auto' });
  return read.contours.map((contour) => ({ contour, metrics: measureContour(contour, read.yAxis) }));
};

describe('getWindingNumber', () => {
  const square = contourFromSegments(polygonSegments([[0, 0], [2, 0], [2, 2], [0, 2]], false), true);
  it('is +1 inside a counter-clockwise square in y-up axes and 0 outside (sign convention of types.ts)', () => {
    expect(getWindingNumber(square, 1, 1)).toEqual({ winding: 1, onBoundary: false });
    expect(getWindingNumber(square, 3, 1)).toEqual({ winding: 0, onBoundary: false });
  });
  it('says a point on an edge or a vertex is on the boundary (exact orient2d)', () => {
    expect(getWindingNumber(square, 2, 1).onBoundary).toBe(true);
    expect(getWindingNumber(square, 0, 0).onBoundary).toBe(true);
  });
  it('gives the bow-tie lobes windings −1 (right) and +1 (left) (REFERENCES.md §1.4)', () => {
    const bow = contourFromSegments(polygonSegments([[0, 0], [2, 2], [2, 0], [0, 2]], false), true);
    expect(getWindingNumber(bow, 1.5, 1).winding).toBe(-1);
    expect(getWindingNumber(bow, 0.5, 1).winding).toBe(1);
  });
  it('leaves out a segment shorter than 1e-9 of the size, so a point just off the square is still outside (REFERENCES.md §7.3 tolerance)', () => {
    // A 1e-12 mm step out of the corner (2, 0) and back: within eps = 1e-9·2√2, so both are dropped.
    const notched = createWindingTester(contourFromSegments(polygonSegments([[0, 0], [2, 0], [2 + 1e-12, 0], [2, 0], [2, 2], [0, 2]], false), true));
    expect(notched.pieces.count).toBe(4);
    expect(notched.getWinding(1, 1)).toEqual({ winding: 1, onBoundary: false });
    expect(notched.getWinding(2.5, 1e-13)).toEqual({ winding: 0, onBoundary: false });
  });
  it('counts 1 inside a circle of arcs and 0 just outside (circle equation)', () => {
    const c = contourFromSegments(circleArcs(0, 0, 5, 2), true);
    expect(Math.abs(getWindingNumber(c, 4.999, 0).winding)).toBe(1);
    expect(getWindingNumber(c, 5.001, 0).winding).toBe(0);
    expect(Math.abs(getWindingNumber(c, 0, 4.9).winding)).toBe(1);
  });
});

describe('getNesting and getFileSummary', () => {
  it('tells an outline, its hole and an island in the hole apart and nets the areas (by hand: 100 − 36 and 4)', () => {
    const cs = analyse('<path d="M0 0H10V10H0Z"/><path d="M2 2V8H8V2Z"/><path d="M4 4H6V6H4Z"/><path d="M20 0H21V1H20Z"/>');
    const n = getNesting(cs);
    expect(n.parent).toEqual([null, 0, 1, null]);
    expect(n.depth).toEqual([0, 1, 2, 0]);
    expect(n.parts.map((p) => [p.outer, p.holes, p.netAreaMm2, p.holesTurnOpposite])).toEqual([
      [0, [1], 64, true],
      [2, [], 4, true],
      [3, [], 1, true],
    ]);
    const s = getFileSummary(cs, n);
    expect(s).toEqual({ contours: 4, parts: 3, pierces: 4, cutLengthMm: 40 + 24 + 8 + 4, netAreaMm2: 69 });
  });
  it('flags a hole that turns the same way as its outline (orientation consistency, information only)', () => {
    const n = getNesting(analyse('<path d="M0 0H10V10H0Z"/><path d="M2 2H8V8H2Z"/>'));
    expect(n.parts[0]!.holesTurnOpposite).toBe(false);
  });
  it('puts a circle hole inside a square and an open line inside both (parent of an open contour)', () => {
    const n = getNesting(analyse('<rect x="0" y="0" width="20" height="20"/><circle cx="10" cy="10" r="5"/><path d="M9 10H11"/>'));
    expect(n.parent).toEqual([null, 0, 1]);
    expect(n.parts).toHaveLength(1);
    expect(n.parts[0]!.netAreaMm2).toBeCloseTo(400 - 25 * Math.PI, 9); // REFERENCES.md §2.1: A = πr²
  });
});

describe('getNesting on stacked outlines', () => {
  it('stops after MAX_WINDING_TESTS tests and leaves the contour where it stopped and the later ones at depth 0; a square inside all, placed first, has depth 600 (by hand)', () => {
    // A 1 mm square inside, then 600 stacked 10 mm squares: each of a square's 4 sample points is on every
    // other square, so each pair costs 4 tests and 4·600·599 > MAX_WINDING_TESTS (closed form).
    const nesting = getNesting(analyse('<rect x="4" y="4" width="1" height="1"/>' + '<rect width="10" height="10"/>'.repeat(600)));
    expect(nesting.depth[0]).toBe(600);
    expect(nesting.stoppedAt).not.toBeNull();
    expect(nesting.stoppedAt!).toBeGreaterThan(1);
    expect(nesting.depth.slice(nesting.stoppedAt!).every((d) => d === 0)).toBe(true);
    expect(nesting.parent.slice(nesting.stoppedAt!).every((p) => p === null)).toBe(true);
    expect(MAX_WINDING_TESTS).toBeLessThan(4 * 600 * 599);
  });

  it('places every contour of 300 concentric circles (stoppedAt null, depths 299 … 0, by hand)', () => {
    const nesting = getNesting(analyse(Array.from({ length: 300 }, (_, i) => `<circle r="${i + 1}"/>`).join('')));
    expect(nesting.stoppedAt).toBeNull();
    expect(nesting.depth).toEqual(Array.from({ length: 300 }, (_, i) => 299 - i));
  });
});

