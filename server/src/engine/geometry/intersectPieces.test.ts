import { describe, expect, it } from 'vitest';
import { buildPieces, KIND_ARC, KIND_CUBIC, KIND_LINE, STRIDE } from './intersectPieces';
import { circleArcs, contourFromSegments, cubic, line } from '../../../../test/support/shapes';

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
