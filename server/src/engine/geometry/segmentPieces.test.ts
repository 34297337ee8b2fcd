import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { arc, contourFromSegments, cubic, line, quad } from '../../../../test/support/shapes';
import type { Segment } from '../types';
import { buildPieces, KIND_ARC, KIND_CUBIC, KIND_LINE, KIND_QUAD, STRIDE } from './intersectPieces';
import { SEGMENT_PIECES, writeSegmentPieces } from './segmentPieces';

/** The fields of each piece that flattening reads, by kind (intersectPieces.ts layout). */
const FIELDS: Record<number, readonly number[]> = {
  [KIND_LINE]: [0, 4, 5, 6, 7],
  [KIND_QUAD]: [0, 4, 5, 6, 7, 8, 9],
  [KIND_CUBIC]: [0, 4, 5, 6, 7, 8, 9, 10, 11],
  [KIND_ARC]: [0, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15],
};

/** Reference: the pieces intersectPieces.ts `buildPieces` writes for the segment alone. */
function expectSameAsBuildPieces(s: Segment): void {
  const P = buildPieces([contourFromSegments([s], false)], 0);
  const count = writeSegmentPieces(s);
  expect(count).toBe(P.count);
  for (let i = 0; i < count; i++) {
    const o = i * STRIDE;
    for (const f of FIELDS[P.buf[o]!]!) expect(Object.is(SEGMENT_PIECES[o + f], P.buf[o + f]), `piece ${i} field ${f}`).toBe(true);
  }
}

// Coordinates on a coarse grid make equal, collinear and axis-parallel control points common,
// which is where cuts appear, merge or vanish; wide doubles cover the general case.
const coordinate = fc.oneof(fc.integer({ min: -4, max: 4 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }));
const point = fc.tuple(coordinate, coordinate);
const segment: fc.Arbitrary<Segment> = fc.oneof(
  fc.tuple(point, point).map(([a, b]) => line(a[0], a[1], b[0], b[1])),
  fc.tuple(point, point, point).map(([a, b, c]) => quad(a[0], a[1], b[0], b[1], c[0], c[1])),
  fc.tuple(point, point, point, point).map(([a, b, c, d]) => cubic(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1])),
  fc.tuple(point, point, point, fc.double({ min: -7, max: 7, noNaN: true }), fc.double({ min: -2 * Math.PI, max: 2 * Math.PI, noNaN: true }))
    .map(([c, u, v, t0, sweep]) => arc(c[0], c[1], u[0], u[1], v[0], v[1], t0, sweep)),
);

describe('writeSegmentPieces', () => {
  it('writes the pieces of intersectPieces.ts buildPieces to the last bit (reference: buildPieces; fast-check, seed 41)', () => {
    fc.assert(fc.property(segment, (s) => expectSameAsBuildPieces(s)), { seed: 41, numRuns: 3000 });
  });

  it('matches buildPieces on cubics whose control polygon is monotone but nearly flat, where the root search is skipped (reference: buildPieces; fast-check, seed 43)', () => {
    // Control differences of one sign, some of them down to 1e-15 of the others.
    const difference = fc.oneof(fc.double({ min: 1e-15, max: 1e-11, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }));
    const monotone = fc.tuple(fc.array(difference, { minLength: 6, maxLength: 6 }), fc.boolean(), fc.boolean()).map(([d, sx, sy]) => {
      const ex = sx ? 1 : -1, ey = sy ? 1 : -1;
      return cubic(0, 0, ex * d[0]!, ey * d[1]!, ex * (d[0]! + d[2]!), ey * (d[1]! + d[3]!), ex * (d[0]! + d[2]! + d[4]!), ey * (d[1]! + d[3]! + d[5]!));
    });
    fc.assert(fc.property(monotone, (s) => expectSameAsBuildPieces(s)), { seed: 43, numRuns: 2000 });
  });

  it('cuts a cubic at its x and y turning points: the unit circle quarter from (1, 0) to (−1, 0) has one at t = 1/2 (by hand)', () => {
    expect(writeSegmentPieces(cubic(1, 0, 1, 4 / 3, -1, 4 / 3, -1, 0))).toBe(2);
    expect(SEGMENT_PIECES[6]).toBe(0);
    expect(SEGMENT_PIECES[7]).toBe(1);
  });

  it('tells semi-diameter components −0 from +0 when it reuses the last arc\'s turning angles (reference: buildPieces)', () => {
    // atan2(0, −1) = π but atan2(−0, −1) = −π, and buildPieces tries nine turns from each: over
    // θ ∈ (12, 15) the first arc is cut at 4π, the second is not cut.
    expectSameAsBuildPieces(arc(0, 0, -1, 0, 0, 1, 12, 3));
    expectSameAsBuildPieces(arc(0, 0, -1, -0, -0, 1, 12, 3));
  });

  it('writes no piece for a segment that is a single point, as buildPieces leaves it out (reference: buildPieces)', () => {
    for (const s of [line(1, 2, 1, 2), cubic(1, 2, 1, 2, 1, 2, 1, 2), arc(1, 2, 0, 0, 0, 0, 0, 1), arc(1, 2, 1, 0, 0, 1, 0.5, 0)]) {
      expect(writeSegmentPieces(s)).toBe(0);
      expectSameAsBuildPieces(s);
    }
  });
});
