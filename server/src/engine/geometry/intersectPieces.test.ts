import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Segment } from '../types';
import { buildPieces, getPiecePoint, KIND_ARC, KIND_CUBIC, KIND_LINE, KIND_QUAD, SEGMENT_PIECES, STRIDE, writeSegmentPieces } from './intersectPieces';
import { arc, circleArcs, contourFromSegments, cubic, line, quad } from '../../../../test/support/shapes';

describe('buildPieces', () => {
  // The loop cubic (0,0),(3,3),(−1,3),(2,0): x(t) = 9t − 21t² + 14t³, so x′ = 9 − 42t + 42t² = 0 at
  // t = ½ ∓ √252/84; y(t) = 9t(1 − t), so y′ = 0 at t = ½ (solved by hand).
  const cuts = [0.5 - Math.sqrt(252) / 84, 0.5, 0.5 + Math.sqrt(252) / 84];
  const bernstein = (p: number[], t: number) => (1 - t) ** 3 * p[0]! + 3 * t * (1 - t) ** 2 * p[1]! + 3 * t * t * (1 - t) * p[2]! + t ** 3 * p[3]!;

  it('cuts 2000 loop cubics at their x and y extremes (by hand), past the buffer\'s first size, with exact end points and t ranges', () => {
    const copies = 2000;
    const segs = Array.from({ length: copies }, (_, k) => cubic(2 * k, 0, 2 * k + 3, 3, 2 * k - 1, 3, 2 * k + 2, 0));
    const P = buildPieces([contourFromSegments(segs, false)], 0);
    expect(P.count).toBe(4 * copies); // more than the segments + half that the buffer starts with
    expect(P.buf.length).toBe(P.count * STRIDE);
    const b = P.buf;
    for (let k = 0; k < copies; k++) {
      const xs = [2 * k, 2 * k + 3, 2 * k - 1, 2 * k + 2], ys = [0, 3, 3, 0];
      const ts = [0, ...cuts, 1];
      for (let p = 0; p < 4; p++) {
        const o = (4 * k + p) * STRIDE;
        expect(b[o]).toBe(KIND_CUBIC);
        expect(b[o + 1]).toBe(k);
        expect(b[o + 2]).toBeCloseTo(ts[p]!, 15);
        expect(b[o + 3]).toBeCloseTo(ts[p + 1]!, 15);
        expect(b[o + 4]).toBeCloseTo(bernstein(xs, ts[p]!), 9);
        expect(b[o + 5]).toBeCloseTo(bernstein(ys, ts[p]!), 9);
        expect(b[o + 6]).toBeCloseTo(bernstein(xs, ts[p + 1]!), 9);
        expect(b[o + 7]).toBeCloseTo(bernstein(ys, ts[p + 1]!), 9);
        // Monotone: both control points lie in the box of the end points.
        for (const c of [8, 10]) {
          expect(b[o + c]! >= Math.min(b[o + 4]!, b[o + 6]!) - 1e-12 && b[o + c]! <= Math.max(b[o + 4]!, b[o + 6]!) + 1e-12).toBe(true);
          expect(b[o + c + 1]! >= Math.min(b[o + 5]!, b[o + 7]!) - 1e-12 && b[o + c + 1]! <= Math.max(b[o + 5]!, b[o + 7]!) + 1e-12).toBe(true);
        }
      }
      // Neighbouring pieces share their end point exactly.
      if (k > 0) expect([b[4 * k * STRIDE + 4], b[4 * k * STRIDE + 5]]).toEqual([b[(4 * k - 1) * STRIDE + 6], b[(4 * k - 1) * STRIDE + 7]]);
    }
    // x runs from 0 to the last end point 2·copies; y peaks at y(½) = 9/4.
    expect(P.bbox.slice(0, 3)).toEqual([0, 0, 2 * copies]);
    expect(P.bbox[3]).toBeCloseTo(9 / 4, 14);
  });

  it('cuts a circle drawn as one arc at its four axis points (circle equation), growing the buffer from room for two pieces', () => {
    const P = buildPieces([contourFromSegments(circleArcs(0, 0, 5, 1), true)], 0);
    expect(P.count).toBeGreaterThanOrEqual(4);
    expect(P.buf.length).toBe(P.count * STRIDE);
    for (let i = 0; i < P.count; i++) {
      const o = i * STRIDE;
      expect(P.buf[o]).toBe(KIND_ARC);
      expect(Math.hypot(P.buf[o + 6]!, P.buf[o + 7]!)).toBeCloseTo(5, 12);
      // Every cut lies on an axis: x = 0 or y = 0 (the segment's own end aside).
      if (i < P.count - 1) expect(Math.min(Math.abs(P.buf[o + 6]!), Math.abs(P.buf[o + 7]!))).toBeLessThan(1e-12);
    }
    expect(P.bbox.map((v) => Math.round(v * 1e9) / 1e9)).toEqual([-5, -5, 5, 5]);
  });

  it('keeps the chains, closing lines and bounding box of several contours, and leaves out point-sized segments', () => {
    const a = contourFromSegments([line(0, 0, 4, 0), line(4, 0, 4, 0), line(4, 0, 4, 3)], true); // closed by an implicit line
    const b = contourFromSegments([line(10, 10, 11, 12)], false);
    const P = buildPieces([a, b], 0);
    expect(P.count).toBe(4);
    expect(P.chains).toEqual([{ contour: 0, first: 0, count: 3, cyclic: true }, { contour: 1, first: 3, count: 1, cyclic: false }]);
    expect(Array.from(P.contourOf)).toEqual([0, 0, 0, 1]);
    expect(P.buf[2 * STRIDE]).toBe(KIND_LINE);
    expect(P.buf[2 * STRIDE + 1]).toBe(-1);
    expect(Array.from(P.buf.subarray(2 * STRIDE + 4, 2 * STRIDE + 8))).toEqual([4, 3, 0, 0]);
    expect(P.bbox).toEqual([0, 0, 11, 12]);
    // Extents 4 and 3, closing gap 5; extent 2 and end-to-start gap √5 (by hand).
    expect(P.minKeptExtent).toBe(2);
  });
});

// Coordinates on a coarse grid make equal, collinear and axis-parallel control points common, which
// is where cuts appear, merge or vanish; wide doubles cover the general case.
const coordinate = fc.oneof(fc.integer({ min: -4, max: 4 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }));
const point = fc.tuple(coordinate, coordinate);
const anySegment: fc.Arbitrary<Segment> = fc.oneof(
  fc.tuple(point, point).map(([a, b]) => line(a[0], a[1], b[0], b[1])),
  fc.tuple(point, point, point).map(([a, b, c]) => quad(a[0], a[1], b[0], b[1], c[0], c[1])),
  fc.tuple(point, point, point, point).map(([a, b, c, d]) => cubic(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1])),
  fc.tuple(point, point, point, fc.double({ min: -7, max: 7, noNaN: true }), fc.double({ min: -2 * Math.PI, max: 2 * Math.PI, noNaN: true }))
    .map(([c, u, v, t0, sweep]) => arc(c[0], c[1], u[0], u[1], v[0], v[1], t0, sweep)),
);

/** The fields each kind of piece uses (the module's layout); the reused buffer keeps stale values in the rest. */
const FIELDS: Record<number, readonly number[]> = {
  [KIND_LINE]: [0, 1, 2, 3, 4, 5, 6, 7],
  [KIND_QUAD]: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9],
  [KIND_CUBIC]: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11],
  [KIND_ARC]: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15],
};

/** Largest step against the piece's overall direction, per axis, over 64 samples. */
function worstTurnBack(buf: Float64Array, i: number): number {
  const [sx, sy] = getPiecePoint(buf, i, 0), [ex, ey] = getPiecePoint(buf, i, 1);
  const dirX = Math.sign(ex - sx), dirY = Math.sign(ey - sy);
  let worst = 0, [px, py] = [sx, sy];
  for (let k = 1; k <= 64; k++) {
    const [x, y] = getPiecePoint(buf, i, k / 64);
    if (dirX !== 0) worst = Math.max(worst, -(x - px) * dirX);
    if (dirY !== 0) worst = Math.max(worst, -(y - py) * dirY);
    [px, py] = [x, y];
  }
  return worst;
}

describe('writeSegmentPieces', () => {
  it('writes, for one segment, exactly the pieces buildPieces writes for it (reference: buildPieces; fast-check, seed 41)', () => {
    fc.assert(fc.property(anySegment, (s) => {
      const P = buildPieces([contourFromSegments([s], false)], 0);
      const count = writeSegmentPieces(s);
      expect(count).toBe(P.count);
      for (let i = 0; i < count; i++) {
        const o = i * STRIDE;
        for (const f of FIELDS[P.buf[o]!]!) expect(Object.is(SEGMENT_PIECES[o + f], P.buf[o + f]), `piece ${i} field ${f}`).toBe(true);
      }
    }), { seed: 41, numRuns: 1000 });
  });

  it('cuts every segment into pieces monotone in x and y, nearly flat monotone cubics (whose root search is skipped) included: no sample turns back beyond rounding (the module invariant; fast-check, seed 43)', () => {
    // Control differences of one sign, some of them down to 1e-15 of the others.
    const difference = fc.oneof(fc.double({ min: 1e-15, max: 1e-11, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }));
    const monotone = fc.tuple(fc.array(difference, { minLength: 6, maxLength: 6 }), fc.boolean(), fc.boolean()).map(([d, sx, sy]) => {
      const ex = sx ? 1 : -1, ey = sy ? 1 : -1;
      return cubic(0, 0, ex * d[0]!, ey * d[1]!, ex * (d[0]! + d[2]!), ey * (d[1]! + d[3]!), ex * (d[0]! + d[2]! + d[4]!), ey * (d[1]! + d[3]! + d[5]!));
    });
    fc.assert(fc.property(fc.oneof(anySegment, monotone), (s) => {
      const count = writeSegmentPieces(s);
      const scale = Math.max(1, ...Array.from(SEGMENT_PIECES.subarray(0, count * STRIDE), Math.abs));
      for (let i = 0; i < count; i++) expect(worstTurnBack(SEGMENT_PIECES, i)).toBeLessThanOrEqual(1e-12 * scale);
    }), { seed: 43, numRuns: 3000 });
  });

  it('cuts a cubic at its x and y turning points: the unit circle quarter from (1, 0) to (−1, 0) has one at t = 1/2 (by hand)', () => {
    expect(writeSegmentPieces(cubic(1, 0, 1, 4 / 3, -1, 4 / 3, -1, 0))).toBe(2);
    expect(SEGMENT_PIECES[6]).toBe(0);
    expect(SEGMENT_PIECES[7]).toBe(1);
  });

  it('writes no piece for a segment that is a single point, as buildPieces leaves it out', () => {
    for (const s of [line(1, 2, 1, 2), cubic(1, 2, 1, 2, 1, 2, 1, 2), arc(1, 2, 0, 0, 0, 0, 0, 1), arc(1, 2, 1, 0, 0, 1, 0.5, 0)]) {
      expect(writeSegmentPieces(s)).toBe(0);
      expect(buildPieces([contourFromSegments([s], false)], 0).count).toBe(0);
    }
  });
});
