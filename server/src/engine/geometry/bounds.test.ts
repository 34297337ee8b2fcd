import paper from 'paper';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arcFromSvgEndpoints } from './arc';
import { getBezierCriticalParameters, getSegmentBounds, getSegmentEnd, getSegmentPoint, getSegmentStart, setSegmentBounds, type Box } from './bounds';
import { arc, cubic, ellipseArc, line, quad } from '../../../../test/support/shapes';
import type { Arc, Segment } from '../types';

paper.setup(new paper.Size(100, 100));

describe('getSegmentBounds', () => {
  it('uses the curve\'s extremum, not the control points: cubic (0,0),(1,2),(3,2),(4,0) peaks at y = 1.5 (by hand: y = 6t(1 − t))', () => {
    expect(getSegmentBounds(cubic(0, 0, 1, 2, 3, 2, 4, 0))).toEqual([0, 0, 4, 1.5]);
  });

  it('gives a line\'s end points', () => {
    expect(getSegmentBounds(line(3, -1, -2, 4))).toEqual([-2, -1, 3, 4]);
  });

  it('gives cx ± a, cy ± b for a full ellipse (by hand)', () => {
    expect(getSegmentBounds(ellipseArc(1, 2, 4, 3))).toEqual([-3, -1, 5, 5]);
  });

  it('gives a rotated ellipse the half-widths √(a²cos²φ + b²sin²φ), √(a²sin²φ + b²cos²φ) (standard formula, from memory)', () => {
    const phi = Math.PI / 6, a = 4, b = 2;
    const e = arc(0, 0, a * Math.cos(phi), a * Math.sin(phi), -b * Math.sin(phi), b * Math.cos(phi), 0, 2 * Math.PI);
    const hx = Math.sqrt(a * a * Math.cos(phi) ** 2 + b * b * Math.sin(phi) ** 2);
    const hy = Math.sqrt(a * a * Math.sin(phi) ** 2 + b * b * Math.cos(phi) ** 2);
    const box = getSegmentBounds(e);
    [-hx, -hy, hx, hy].forEach((v, i) => expect(box[i]).toBeCloseTo(v, 14));
  });

  it('includes the lowest point of the REFERENCES §5.5 arc M0 0 A10 10 0 0 1 10 0 (centre (5, 8.66), θ from −120° to −60° passes −90°)', () => {
    const a = arcFromSvgEndpoints(0, 0, 10, 10, 0, false, true, 10, 0, { start: 0, end: 0 }) as Arc;
    const box = getSegmentBounds(a);
    expect(box[0]).toBe(0);
    expect(box[2]).toBe(10);
    expect(box[1]).toBeCloseTo(5 * Math.sqrt(3) - 10, 14);
    expect(box[3]).toBe(0);
  });

  it('follows a clockwise sweep: the half circle M0 0 A5 5 0 0 0 10 0 bulges to +y (REFERENCES §5.5 row 2, Δθ = −180° from 180°)', () => {
    const a = arcFromSvgEndpoints(0, 0, 5, 5, 0, false, false, 10, 0, { start: 0, end: 0 }) as Arc;
    const box = getSegmentBounds(a);
    expect(box[1]).toBe(0);
    expect(box[3]).toBeCloseTo(5, 14);
  });

  it('agrees with paper.js Curve bounds on random quads and cubics (seed 4711)', () => {
    const coord = fc.double({ min: -100, max: 100, noNaN: true });
    fc.assert(
      fc.property(fc.array(coord, { minLength: 8, maxLength: 8 }), fc.boolean(), (p, isQuad) => {
        const s: Segment = isQuad ? quad(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!) : cubic(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!, p[6]!, p[7]!);
        const d = isQuad
          ? `M${p[0]} ${p[1]} Q${p[2]} ${p[3]} ${p[4]} ${p[5]}`
          : `M${p[0]} ${p[1]} C${p[2]} ${p[3]} ${p[4]} ${p[5]} ${p[6]} ${p[7]}`;
        const b = new paper.Path(d).bounds;
        const box = getSegmentBounds(s);
        const expected = [b.left, b.top, b.right, b.bottom];
        box.forEach((v, i) => expect(v).toBeCloseTo(expected[i]!, 8));
      }),
      { seed: 4711, numRuns: 300 },
    );
  });

  it('gives, bit for bit, the end points plus the curve at getBezierCriticalParameters (its definition; seed 2718)', () => {
    const coord = fc.integer({ min: -100000, max: 100000 }).map((v) => v / 1000);
    fc.assert(
      fc.property(fc.array(coord, { minLength: 8, maxLength: 8 }), fc.boolean(), (p, isQuad) => {
        const s: Segment = isQuad ? quad(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!) : cubic(p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!, p[6]!, p[7]!);
        const [ex, ey] = getSegmentEnd(s);
        const expected: Box = [Math.min(s.x0, ex), Math.min(s.y0, ey), Math.max(s.x0, ex), Math.max(s.y0, ey)];
        for (const t of getBezierCriticalParameters(s)) {
          const [x, y] = getSegmentPoint(s, t);
          if (x < expected[0]) expected[0] = x;
          if (y < expected[1]) expected[1] = y;
          if (x > expected[2]) expected[2] = x;
          if (y > expected[3]) expected[3] = y;
        }
        expect(getSegmentBounds(s)).toEqual(expected);
        const reused: Box = [NaN, NaN, NaN, NaN];
        setSegmentBounds(s, reused);
        expect(reused).toEqual(expected);
      }),
      { seed: 2718, numRuns: 500 },
    );
  });

  for (const [turns, seed] of [[7, 1234], [40, 4321]] as const) {
    it(`contains every sampled point of random arcs with |theta0| ≤ ${turns}, and sampled points reach each edge (seed ${seed})`, () => {
      const coord = fc.double({ min: -50, max: 50, noNaN: true });
      fc.assert(
        fc.property(coord, coord, coord, coord, coord, coord, fc.double({ min: -turns, max: turns, noNaN: true }), fc.double({ min: -6.2, max: 6.2, noNaN: true }),
          (cx, cy, ux, uy, vx, vy, t0, sw) => {
            const a = arc(cx, cy, ux, uy, vx, vy, t0, sw);
            const box = getSegmentBounds(a);
            const scale = 1e-9 * (1 + Math.abs(cx) + Math.abs(cy) + Math.hypot(ux, uy) + Math.hypot(vx, vy));
            const reach = [Infinity, Infinity, -Infinity, -Infinity];
            let outside = 0;
            const n = 4000;
            for (let i = 0; i <= n; i++) {
              const [x, y] = getSegmentPoint(a, i / n);
              if (x < box[0] - scale || y < box[1] - scale || x > box[2] + scale || y > box[3] + scale) outside++;
              reach[0] = Math.min(reach[0]!, x); reach[1] = Math.min(reach[1]!, y);
              reach[2] = Math.max(reach[2]!, x); reach[3] = Math.max(reach[3]!, y);
            }
            expect(outside).toBe(0);
            // Sampling step Δ ≤ 6.2/4000 in θ: an extremum is missed by at most r(1 − cos(Δ/2)) ≈ r·Δ²/8 ≈ 3e-7·r.
            const r = Math.hypot(ux, uy) + Math.hypot(vx, vy);
            reach.forEach((v, i) => expect(Math.abs(v - box[i]!)).toBeLessThanOrEqual(4e-7 * r + scale));
          }),
        { seed, numRuns: 200 },
      );
    });
  }
});

describe('getSegmentPoint, getSegmentStart, getSegmentEnd', () => {
  it('evaluates Béziers in Bernstein form: the §4.2 cubic at t = ½ is (2, 1.5) (by hand)', () => {
    expect(getSegmentPoint(cubic(0, 0, 1, 2, 3, 2, 4, 0), 0.5)).toEqual([2, 1.5]);
    expect(getSegmentPoint(quad(0, 0, 1, 2, 2, 0), 0.5)).toEqual([1, 1]);
    expect(getSegmentPoint(line(0, 0, 2, 4), 0.25)).toEqual([0.5, 1]);
  });

  it('evaluates arcs at θ = theta0 + t·sweep (types.ts contract)', () => {
    const [x, y] = getSegmentPoint(arc(0, 0, 2, 0, 0, 1, 0, Math.PI), 0.5);
    expect(x).toBeCloseTo(0, 15);
    expect(y).toBe(1);
  });

  it('returns the stored end points', () => {
    const c = cubic(0, 0, 1, 2, 3, 2, 4, 0);
    expect(getSegmentStart(c)).toEqual([0, 0]);
    expect(getSegmentEnd(c)).toEqual([4, 0]);
    expect(getSegmentEnd(quad(0, 0, 1, 2, 2, 0))).toEqual([2, 0]);
  });
});

describe('getBezierCriticalParameters', () => {
  it('finds the cusp of (0,0),(1,1),(0,1),(1,0) at t = ½ (REFERENCES §4.5)', () => {
    expect(getBezierCriticalParameters(cubic(0, 0, 1, 1, 0, 1, 1, 0))).toEqual([0.5]);
  });

  it('is empty for lines and arcs', () => {
    expect(getBezierCriticalParameters(line(0, 0, 1, 1))).toEqual([]);
    expect(getBezierCriticalParameters(ellipseArc(0, 0, 1, 1))).toEqual([]);
  });
});
