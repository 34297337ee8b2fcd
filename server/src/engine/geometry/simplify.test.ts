import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { simplifyClosedPolyline } from './simplify';

type Loop = { xs: Float64Array; ys: Float64Array };

/** Brute-force distance from (x, y) to the segment A–B (independent of the module's own). */
function pointSegment(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay, l2 = dx * dx + dy * dy;
  const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / l2));
  return Math.hypot(x - ax - t * dx, y - ay - t * dy);
}

/** Points every 1/samples along each edge of the closed loop through `idx`. */
function samplesOf(loop: Loop, idx: readonly number[], samples: number): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k < idx.length; k++) {
    const a = idx[k]!, b = idx[(k + 1) % idx.length]!;
    for (let s = 0; s < samples; s++) {
      const t = s / samples;
      out.push([loop.xs[a]! + t * (loop.xs[b]! - loop.xs[a]!), loop.ys[a]! + t * (loop.ys[b]! - loop.ys[a]!)]);
    }
  }
  return out;
}

/** Directed Hausdorff distance from sampled points to the closed loop through `idx`, by brute force. */
function directedHausdorff(points: readonly [number, number][], loop: Loop, idx: readonly number[]): number {
  let worst = 0;
  for (const [x, y] of points) {
    let best = Infinity;
    for (let k = 0; k < idx.length; k++) {
      const a = idx[k]!, b = idx[(k + 1) % idx.length]!;
      best = Math.min(best, pointSegment(x, y, loop.xs[a]!, loop.ys[a]!, loop.xs[b]!, loop.ys[b]!));
    }
    worst = Math.max(worst, best);
  }
  return worst;
}

/** A star-shaped loop: n points at increasing angles and random radii in [1, 2]. */
function starLoop(radii: readonly number[]): Loop {
  const n = radii.length;
  const xs = new Float64Array(n), ys = new Float64Array(n);
  radii.forEach((r, i) => { xs[i] = r * Math.cos((2 * Math.PI * i) / n); ys[i] = r * Math.sin((2 * Math.PI * i) / n); });
  return { xs, ys };
}

describe('simplifyClosedPolyline', () => {
  it('keeps at most the budget, keeps every fixed vertex, and both polylines lie within the bound it states of each other (reference: brute-force Hausdorff distance by its definition; fast-check, seed 61)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 1, max: 2, noNaN: true }), { minLength: 12, maxLength: 300 }),
        fc.integer({ min: 3, max: 40 }),
        fc.array(fc.nat(), { maxLength: 3 }),
        (radii, maxKept, pins) => {
          const loop = starLoop(radii);
          const n = radii.length;
          const order = Int32Array.from({ length: n }, (_, i) => i);
          const fixed = new Uint8Array(n);
          for (const p of pins) fixed[p % n] = 1;
          const s = simplifyClosedPolyline(loop.xs, loop.ys, order, fixed, maxKept);
          expect(s).not.toBeNull();
          const kept = [...order].filter((_, k) => s!.keep[k] === 1);
          expect(kept.length).toBe(s!.kept);
          expect(kept.length).toBeLessThanOrEqual(Math.max(maxKept, 0));
          for (let k = 0; k < n; k++) if (fixed[k]) expect(s!.keep[k]).toBe(1);
          const all = [...order];
          const slack = 1e-12;
          expect(directedHausdorff(samplesOf(loop, all, 4), loop, kept)).toBeLessThanOrEqual(s!.deviationMm + slack);
          expect(directedHausdorff(samplesOf(loop, kept, 16), loop, all)).toBeLessThanOrEqual(s!.deviationMm + slack);
        },
      ),
      { seed: 61, numRuns: 150 },
    );
  });

  it('reduces a 100 000-gon of radius 100 to 2000 vertices within 1 to 4 times the sagitta of 2000 equal chords, R(1 − cos(π/2000)) (reference: the sagitta formula; no 2000 of its vertices do better, by pigeonhole)', () => {
    const n = 100_000, R = 100;
    const loop = starLoop(new Array<number>(n).fill(R));
    const s = simplifyClosedPolyline(loop.xs, loop.ys, Int32Array.from({ length: n }, (_, i) => i), new Uint8Array(n), 2000)!;
    const sagitta = R * (1 - Math.cos(Math.PI / 2000));
    expect(s.kept).toBeLessThanOrEqual(2000);
    expect(s.deviationMm).toBeGreaterThanOrEqual(sagitta * (1 - 1e-9));
    expect(s.deviationMm).toBeLessThanOrEqual(4 * sagitta);
  });

  it('thins a square of 40 000 points (10 000 a side, its corners between the subsample\'s points) to its corners with no deviation: the subsample cuts the corners, so the whole loop is thinned (elementary geometry)', () => {
    const side = 10_000, n = 4 * side, xs = new Float64Array(n), ys = new Float64Array(n);
    const corners: [number, number][] = [[0, 0], [1, 0], [1, 1], [0, 1]];
    // Rotated by 3 so that no corner is at an index the subsample's step divides.
    for (let k = 0; k < n; k++) {
      const q = (k + 3) % n, c = Math.floor(q / side), t = (q % side) / side;
      const [x0, y0] = corners[c]!, [x1, y1] = corners[(c + 1) % 4]!;
      xs[k] = x0 + t * (x1 - x0); ys[k] = y0 + t * (y1 - y0);
    }
    const s = simplifyClosedPolyline(xs, ys, Int32Array.from({ length: n }, (_, i) => i), new Uint8Array(n), 100)!;
    expect(s.deviationMm).toBeLessThanOrEqual(1e-12);
    for (const q of [0, side, 2 * side, 3 * side]) expect(s.keep[(q - 3 + n) % n]).toBe(1);
  });

  it('keeps a loop that fits the budget as it is, with no deviation', () => {
    const loop = starLoop([1, 2, 1, 2, 1, 2]);
    const s = simplifyClosedPolyline(loop.xs, loop.ys, Int32Array.from([0, 1, 2, 3, 4, 5]), new Uint8Array(6), 6)!;
    expect([...s.keep]).toEqual([1, 1, 1, 1, 1, 1]);
    expect(s.deviationMm).toBe(0);
  });

  it('gives up when the fixed vertices alone exceed the budget', () => {
    const loop = starLoop([1, 2, 1, 2, 1, 2]);
    expect(simplifyClosedPolyline(loop.xs, loop.ys, Int32Array.from([0, 1, 2, 3, 4, 5]), Uint8Array.from([1, 1, 1, 1, 0, 0]), 3)).toBeNull();
  });

  it('gives up at the work cap: a 1000-gon thinned to 100 needs about log₂ 100 distance evaluations per vertex, so a cap of 2 stops it and the default does not', () => {
    const n = 1000;
    const xs = Float64Array.from({ length: n }, (_, i) => Math.cos((2 * Math.PI * i) / n));
    const ys = Float64Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * i) / n));
    const order = Int32Array.from({ length: n }, (_, i) => i);
    expect(simplifyClosedPolyline(xs, ys, order, new Uint8Array(n), 100, 2)).toBeNull();
    expect(simplifyClosedPolyline(xs, ys, order, new Uint8Array(n), 100)?.kept).toBe(100);
  });
});
