import { describe, expect, it } from 'vitest';
import type { Arc, Segment } from '../types';
import { getArcPoint } from './arc';
import {
  getDeterminant, multiplyMatrices, transformPoint, transformSegment, transformSegments, type Matrix,
} from './transform';

const span = { start: 0, end: 0 };

/** Closed polygon as line segments. */
function polygon(points: readonly (readonly [number, number])[]): Segment[] {
  return points.map(([x0, y0], i) => {
    const [x1, y1] = points[(i + 1) % points.length]!;
    return { kind: 'line', x0, y0, x1, y1, span };
  });
}

/** Shoelace formula A = ½Σ(x_i y_{i+1} − x_{i+1} y_i) (REFERENCES §4.1), on the segments' start points. */
function shoelace(segments: readonly Segment[]): number {
  let sum = 0;
  for (const s of segments) sum += s.x0 * (s.kind === 'line' ? s.y1 : 0) - (s.kind === 'line' ? s.x1 : 0) * s.y0;
  return sum / 2;
}

function length(s: Segment): number {
  return s.kind === 'line' ? Math.hypot(s.x1 - s.x0, s.y1 - s.y0) : NaN;
}

// L-shape from REFERENCES §2.8: A = 3.
const lShape = polygon([[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]);

describe('transformSegment', () => {
  it('scales areas by |det| (shoelace, REFERENCES §4.1; L-shape A = 3 from §2.8)', () => {
    expect(shoelace(lShape)).toBe(3);
    const m: Matrix = [2, 1, 0.5, 3, 7, -4];
    const image = transformSegments(lShape, m);
    expect(shoelace(image)).toBeCloseTo(3 * getDeterminant(m), 12);
    expect(getDeterminant(m)).toBe(5.5);
  });

  it('flips the sign of the area under a mirror, scale(2, −1) (REFERENCES §5.7: det < 0 mirrors)', () => {
    const image = transformSegments(lShape, [2, 0, 0, -1, 0, 0]);
    expect(shoelace(image)).toBe(-6);
  });

  it('keeps lengths under a rotation (rotations are isometries, from memory)', () => {
    const a = (37 * Math.PI) / 180;
    const m: Matrix = [Math.cos(a), Math.sin(a), -Math.sin(a), Math.cos(a), 3, 4];
    const image = transformSegments(lShape, m);
    image.forEach((s, i) => expect(length(s)).toBeCloseTo(length(lShape[i]!), 14));
  });

  it('maps an arc so that every point of the image is the image of a point (affine map of C + U cos θ + V sin θ, types.ts Arc)', () => {
    const arc: Arc = {
      kind: 'arc', x0: 0, y0: 0, x1: 0, y1: 0, cx: 1, cy: 2, ux: 3, uy: 1, vx: -0.5, vy: 2,
      theta0: 0.3, sweep: -2.1, span,
    };
    const m: Matrix = [1.5, -0.2, 0.7, -2, 10, 20];
    const image = transformSegment(arc, m) as Arc;
    for (let k = 0; k <= 8; k++) {
      const theta = arc.theta0 + (arc.sweep * k) / 8;
      const [px, py] = getArcPoint(arc, theta);
      const [qx, qy] = getArcPoint(image, theta);
      const [ex, ey] = transformPoint(m, px, py);
      expect(qx).toBeCloseTo(ex, 12);
      expect(qy).toBeCloseTo(ey, 12);
    }
  });

  it("reverses an arc's turning sense under a mirror: the area term rx·ry·Δθ of REFERENCES §4.3 becomes u×v·Δθ and changes sign", () => {
    const arc: Arc = { kind: 'arc', x0: 1, y0: 0, x1: 0, y1: 1, cx: 0, cy: 0, ux: 1, uy: 0, vx: 0, vy: 1, theta0: 0, sweep: Math.PI / 2, span };
    const cross = (a: Arc) => a.ux * a.vy - a.uy * a.vx;
    const mirrored = transformSegment(arc, [1, 0, 0, -1, 0, 0]) as Arc;
    expect(cross(arc) * arc.sweep).toBeGreaterThan(0);
    expect(cross(mirrored) * mirrored.sweep).toBeLessThan(0);
  });

  it('returns the same array for the identity (no copy of large paths)', () => {
    expect(transformSegments(lShape, [1, 0, 0, 1, 0, 0])).toBe(lShape);
  });
});

describe('multiplyMatrices', () => {
  it('applies the right factor first: translate(10,20)·rotate(90)·scale(2) maps (1,0) to (10,22) (REFERENCES §5.7)', () => {
    const m = multiplyMatrices(multiplyMatrices([1, 0, 0, 1, 10, 20], [0, 1, -1, 0, 0, 0]), [2, 0, 0, 2, 0, 0]);
    expect(m).toEqual([0, 2, -2, 0, 10, 20]);
    expect(transformPoint(m, 1, 0)).toEqual([10, 22]);
  });
});
