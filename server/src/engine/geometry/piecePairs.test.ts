import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { findPiecePairs, sortByCode } from './piecePairs';
import { buildPieces, STRIDE, type Pieces } from './intersectPieces';
import { circleArcs, contourFromSegments, fourCubicCircle, line, polygonSegments } from '../../../../test/support/shapes';
import type { Contour } from '../types';

/** Brute-force reference: every pair i < j whose end-point boxes, grown by pad, meet (closed boxes). */
function bruteForcePairs(P: Pieces, pad: number, keep: (i: number, j: number) => boolean = () => true): number[] {
  const b = P.buf;
  const box = (i: number) => {
    const o = i * STRIDE;
    return [Math.min(b[o + 4]!, b[o + 6]!) - pad, Math.min(b[o + 5]!, b[o + 7]!) - pad, Math.max(b[o + 4]!, b[o + 6]!) + pad, Math.max(b[o + 5]!, b[o + 7]!) + pad];
  };
  const out: number[] = [];
  for (let i = 0; i < P.count; i++) {
    const p = box(i);
    for (let j = i + 1; j < P.count; j++) {
      const q = box(j);
      if (p[0]! <= q[2]! && q[0]! <= p[2]! && p[1]! <= q[3]! && q[1]! <= p[3]! && keep(i, j)) out.push(i, j);
    }
  }
  return out;
}

/** Open polylines on a small integer grid: boxes that touch at an edge or a corner are common. */
const gridPolylines = fc.array(
  fc.array(fc.tuple(fc.integer({ min: 0, max: 12 }), fc.integer({ min: 0, max: 12 })), { minLength: 2, maxLength: 40 }),
  { minLength: 1, maxLength: 8 },
).map((lines) => lines.map((pts): Contour => contourFromSegments(polygonSegments(pts, false), false)));

describe('findPiecePairs against a brute-force reference (all pairs, closed-box test)', () => {
  it('finds exactly the meeting pairs, sorted, on random grid polylines with touching boxes, pad 0 and 0.5 (seed 31)', () => {
    fc.assert(fc.property(gridPolylines, fc.constantFrom(0, 0.5), (contours, pad) => {
      const P = buildPieces(contours, 0);
      expect(Array.from(findPiecePairs(P, pad, () => true))).toEqual(bruteForcePairs(P, pad));
    }), { seed: 31, numRuns: 300 });
  });

  it('agrees on 3000 pieces: a long zigzag contour over a grid of 500 small squares (seed 5 LCG)', () => {
    let s = 5;
    const rnd = () => (s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const contours: Contour[] = [];
    for (let k = 0; k < 500; k++) {
      const x = (k % 25) * 4, y = Math.floor(k / 25) * 4;
      contours.push(contourFromSegments(polygonSegments([[x, y], [x + 2, y], [x + 2, y + 2], [x, y + 2]], false), true));
    }
    const zig: [number, number][] = [];
    for (let k = 0; k < 1000; k++) zig.push([rnd() * 100, rnd() * 80]);
    contours.push(contourFromSegments(polygonSegments(zig, false), false));
    const P = buildPieces(contours, 0);
    expect(P.count).toBe(2999);
    const keep = (i: number, j: number) => (i + j) % 3 !== 0;
    const got = findPiecePairs(P, 1e-9, keep);
    expect(got.length).toBeGreaterThan(3000);
    expect(Array.from(got)).toEqual(bruteForcePairs(P, 1e-9, keep));
  });

  it('handles no pieces, one piece and pieces that are all the same point box', () => {
    expect(findPiecePairs(buildPieces([], 0), 0, () => true)).toEqual(new Int32Array(0));
    expect(findPiecePairs(buildPieces([contourFromSegments([line(0, 0, 1, 1)], false)], 0), 0, () => true)).toEqual(new Int32Array(0));
    const same = buildPieces(Array.from({ length: 40 }, () => contourFromSegments([line(0, 0, 1, 0)], false)), 0);
    expect(Array.from(findPiecePairs(same, 0, () => true))).toEqual(bruteForcePairs(same, 0));
  });

  it('stops soon after finding more than maxPairs pairs, and finds all n(n − 1)/2 pairs of n equal pieces when allowed (closed form)', () => {
    for (const count of [60, 3000]) {
      // Every piece lies on every other: count·(count − 1)/2 pairs, 1770 and ~4.5 million.
      const same = buildPieces(Array.from({ length: count }, () => contourFromSegments([line(0, 0, 1, 0)], false)), 0);
      const got = findPiecePairs(same, 0, () => true, { maxPairs: 500 });
      expect(got.length / 2).toBeGreaterThan(500);
      expect(got.length / 2).toBeLessThan(500 + 64 * 64);
      for (let k = 0; k < got.length; k += 2) expect(got[k]).toBeLessThan(got[k + 1]!);
      expect(findPiecePairs(same, 0, () => true, { maxPairs: count * count }).length / 2).toBe((count * (count - 1)) / 2);
    }
  });

  it('stops when cancelled and returns only meeting pairs found so far', () => {
    const contours = Array.from({ length: 6000 }, (_, k) => contourFromSegments([line(k, 0, k + 1, 0)], false));
    const P = buildPieces(contours, 0);
    let polls = 0;
    const got = findPiecePairs(P, 0, () => true, { isCancelled: () => ++polls >= 1 });
    expect(polls).toBe(1);
    expect(got.length / 2).toBeLessThan(P.count - 1);
    const all = new Set<string>();
    const ref = bruteForcePairs(P, 0);
    for (let k = 0; k < ref.length; k += 2) all.add(`${ref[k]},${ref[k + 1]}`);
    for (let k = 0; k < got.length; k += 2) expect(all.has(`${got[k]},${got[k + 1]}`)).toBe(true);
  });
});

/**
 * Polylines made of monotone runs: each run keeps one direction on each axis (up, down or none) for
 * 1–80 steps of 0–2 grid units, so the search meets long monotone leaves ascending and descending
 * on either axis, runs along one line (zero extent on an axis), equal boxes and boxes that touch.
 */
const runPolylines = fc.array(
  fc.tuple(
    fc.tuple(fc.integer({ min: 0, max: 40 }), fc.integer({ min: 0, max: 40 })),
    fc.array(fc.tuple(fc.constantFrom(-1, 0, 1, 1, -1), fc.constantFrom(-1, 0, 1, -1, 1), fc.integer({ min: 1, max: 80 }), fc.integer({ min: 0, max: 1000 })), { minLength: 1, maxLength: 5 }),
  ),
  { minLength: 1, maxLength: 6 },
).map((lines) => lines.map(([[x, y], runs]): Contour => {
  const pts: [number, number][] = [[x, y]];
  for (const [sx, sy, length, seed] of runs) {
    let r = seed;
    for (let k = 0; k < length; k++) {
      r = (r * 1103515245 + 12345) % 2 ** 31;
      x += sx * (r % 3);
      y += sy * ((r >> 4) % 3);
      pts.push([x, y]);
    }
  }
  return contourFromSegments(polygonSegments(pts, false), pts.length % 2 === 0);
}));

describe('findPiecePairs on long monotone runs, against the same brute-force reference', () => {
  it('finds exactly the meeting pairs on polylines of monotone runs, pad 0, 0.5 and 1 (seed 47)', () => {
    fc.assert(fc.property(runPolylines, fc.constantFrom(0, 0.5, 1), (contours, pad) => {
      const P = buildPieces(contours, 0);
      expect(Array.from(findPiecePairs(P, pad, () => true))).toEqual(bruteForcePairs(P, pad));
    }), { seed: 47, numRuns: 400 });
  });

  it('agrees where a long run reaches infinite coordinates', () => {
    const steps: [number, number][] = [[0, 0]];
    for (let k = 1; k <= 40; k++) steps.push([k, k < 30 ? k : 1e308 * k]); // from k = 30 on, y overflows to Infinity
    const contours = [
      contourFromSegments(polygonSegments(steps, false), false),
      contourFromSegments(polygonSegments(steps.map(([x, y]) => [x + 0.5, y]), false), false),
      contourFromSegments(polygonSegments(steps.map(([x, y]) => [-x, -y]), false), false),
    ];
    const P = buildPieces(contours, 0);
    for (const pad of [0, 0.5]) expect(Array.from(findPiecePairs(P, pad, () => true))).toEqual(bruteForcePairs(P, pad));
  });

  it('pairs a NaN box with every box, as the closed-box test does when no comparison rules a pair out, next to long runs', () => {
    const broken: [number, number][] = Array.from({ length: 60 }, (_, k) => [k, k === 30 ? Number.NaN : 60 - k]);
    const P = buildPieces([
      contourFromSegments(polygonSegments(broken, false), false),
      contourFromSegments(polygonSegments(broken.map(([x, y]) => [x, y + 0.5]), false), false),
    ], 0);
    const b = P.buf;
    const ref: number[] = [];
    for (let i = 0; i < P.count; i++) {
      for (let j = i + 1; j < P.count; j++) {
        const o = i * STRIDE, q = j * STRIDE;
        const rejected = Math.max(b[o + 4]!, b[o + 6]!) < Math.min(b[q + 4]!, b[q + 6]!) || Math.max(b[o + 5]!, b[o + 7]!) < Math.min(b[q + 5]!, b[q + 7]!)
          || Math.min(b[o + 4]!, b[o + 6]!) > Math.max(b[q + 4]!, b[q + 6]!) || Math.min(b[o + 5]!, b[o + 7]!) > Math.max(b[q + 5]!, b[q + 7]!);
        if (!rejected) ref.push(i, j);
      }
    }
    expect(ref.length).toBeGreaterThan(bruteForcePairs(P, 0).length);
    expect(Array.from(findPiecePairs(P, 0, () => true))).toEqual(ref);
  });

  it('agrees on wavy circles of 1500 lines, one touching another and one crossing it, with cubics and arcs beside them', () => {
    const wavy = (n: number, cx: number, r: number): [number, number][] => Array.from({ length: n }, (_, k) => {
      const a = (2 * Math.PI * k) / n, rr = r + 0.4 * Math.sin(37 * a);
      return [cx + rr * Math.cos(a), rr * Math.sin(a)];
    });
    const contours = [
      contourFromSegments(polygonSegments(wavy(1500, 0, 100), false), true),
      contourFromSegments(polygonSegments(wavy(1500, 200.8, 100), false), true),
      contourFromSegments(polygonSegments(wavy(1500, 150, 60), false), true),
      contourFromSegments(fourCubicCircle(0, 0, 99.8), true),
      contourFromSegments(circleArcs(200, 0, 100.2, 2), true),
    ];
    const P = buildPieces(contours, 0);
    for (const pad of [0, 1e-9, 0.05]) {
      const got = findPiecePairs(P, pad, () => true);
      expect(got.length).toBeGreaterThan(2 * P.count);
      expect(Array.from(got)).toEqual(bruteForcePairs(P, pad));
    }
  });
});

describe('sortByCode', () => {
  it('orders like a stable Array.prototype.sort by the unsigned codes (ES2019 requires a stable sort)', () => {
    let s = 99;
    const codes = new Uint32Array(5000);
    for (let k = 0; k < codes.length; k++) codes[k] = (s = (s * 1103515245 + 12345) % 2 ** 31) % 7 === 0 ? 0xffffffff : (s * 2) >>> (k % 20);
    const ref = Array.from(codes.keys()).sort((a, b) => codes[a]! - codes[b]!);
    expect(Array.from(sortByCode(codes))).toEqual(ref);
  });
});
