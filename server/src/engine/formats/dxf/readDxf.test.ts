import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../../test/support/applyEdits';
import { toPlainSegment } from '../../../../../test/support/shapes';
import { measureContour } from '../../geometry/measure';
import type { Arc, Contour, ReadResult, Segment } from '../../types';
import { readDxf } from './readDxf';

/** An ASCII DXF text from group pairs: optional header $INSUNITS, optional extra sections, entities. */
function dxf(entities: (string | number)[][], opts: { insunits?: number; before?: (string | number)[] } = {}): string {
  const pairs: (string | number)[] = [];
  if (opts.insunits !== undefined) pairs.push(0, 'SECTION', 2, 'HEADER', 9, '$INSUNITS', 70, opts.insunits, 0, 'ENDSEC');
  if (opts.before) pairs.push(...opts.before);
  pairs.push(0, 'SECTION', 2, 'ENTITIES');
  for (const e of entities) for (const v of e) pairs.push(v);
  pairs.push(0, 'ENDSEC', 0, 'EOF');
  return pairs.join('\n') + '\n';
}
const read = (text: string) => readDxf(text, { assumedUnit: 'auto' });
const line = (x0: number, y0: number, x1: number, y1: number, layer = '0') => [0, 'LINE', 8, layer, 10, x0, 20, y0, 11, x1, 21, y1];
const arcPoint = (a: Arc, t: number): [number, number] => [a.cx + a.ux * Math.cos(t) + a.vx * Math.sin(t), a.cy + a.uy * Math.cos(t) + a.vy * Math.sin(t)];
const ids = (r: ReadResult) => r.problems.map((p) => `${p.checkId}/${p.messageId}`);
const area = (c: Contour) => {
  const a = measureContour(c, 'up').signedAreaMm2;
  if (a.value === null) throw new Error(a.reason);
  return a.value;
};
function endOf(s: Segment): [number, number] {
  return s.kind === 'quad' ? [s.x2, s.y2] : s.kind === 'cubic' ? [s.x3, s.y3] : [s.x1, s.y1];
}

describe('readDxf: entities', () => {
  it('turns the bulge worked example into the arc of REFERENCES.md §6.8', () => {
    const r = read(dxf([[0, 'LWPOLYLINE', 8, 0, 90, 4, 70, 1, 10, 0, 20, 0, 42, 0.5, 10, 10, 20, 0, 10, 10, 20, 10, 10, 0, 20, 10]]));
    expect(r.problems).toEqual([]);
    const c = r.contours[0];
    expect(c.closed).toBe(true);
    const a = c.segments[0] as Arc;
    expect(a.kind).toBe('arc');
    // §6.8: centre (5, 3.75), r = 6.25, θ = 1.8545904360032244649 rad, passes (5, −2.5).
    expect(a.cx).toBeCloseTo(5, 12);
    expect(a.cy).toBeCloseTo(3.75, 12);
    expect(Math.hypot(a.ux, a.uy)).toBeCloseTo(6.25, 12);
    expect(a.sweep).toBeCloseTo(1.8545904360032244649, 14);
    const mid = arcPoint(a, a.theta0 + a.sweep / 2);
    expect(mid[0]).toBeCloseTo(5, 12);
    expect(mid[1]).toBeCloseTo(-2.5, 12);
    // §6.8: A = 117.47246945318797783 (shoelace 100 + segment 17.4724…).
    expect(area(c)).toBeCloseTo(117.47246945318797783, 9);
  });

  it('maps a block through INSERT base point, negative scale, rotation and columns as in REFERENCES.md §6.4', () => {
    const blocks = [0, 'SECTION', 2, 'BLOCKS', 0, 'BLOCK', 8, 0, 2, 'SQ', 70, 0, 10, 1, 20, 1, 30, 0,
      0, 'LWPOLYLINE', 8, 0, 90, 4, 70, 1, 10, 1, 20, 1, 10, 2, 20, 1, 10, 2, 20, 2, 10, 1, 20, 2, 0, 'ENDBLK', 0, 'ENDSEC'];
    const r = read(dxf([[0, 'INSERT', 8, 0, 2, 'SQ', 10, 10, 20, 5, 41, 2, 42, -1, 50, 90, 70, 3, 44, 5]], { before: blocks }));
    expect(r.problems).toEqual([]);
    expect(r.contours).toHaveLength(3);
    const pts = r.contours[0].segments.map((s) => [s.x0, s.y0]);
    // §6.4: (10,5), (10,7), (11,7), (11,5), A = −2 (the mirrored insert flips the sign).
    expect(pts).toEqual([[10, 5], [10, 7], [11, 7], [11, 5]]);
    expect(area(r.contours[0])).toBeCloseTo(-2, 12);
    // §6.4: column index 2 with spacing 5 → offset (0, 10) after the 90° rotation.
    expect(r.contours[2].segments[0].x0).toBeCloseTo(10, 12);
    expect(r.contours[2].segments[0].y0).toBeCloseTo(15, 12);
  });

  it('mirrors an ARC with extrusion (0,0,-1) through the arbitrary axis algorithm (REFERENCES.md §6.5)', () => {
    const r = read(dxf([[0, 'ARC', 8, 0, 10, 5, 20, 0, 40, 2, 50, 0, 51, 90, 210, 0, 220, 0, 230, -1]]));
    const a = r.contours[0].segments[0] as Arc;
    // §6.5: WCS (−7,0) → (−6.414213562, 1.414213562) → (−5,2), clockwise seen from +Z.
    expect([a.x0, a.y0]).toEqual([-7, 0]);
    expect(a.x1).toBeCloseTo(-5, 12);
    expect(a.y1).toBeCloseTo(2, 12);
    const mid = arcPoint(a, a.theta0 + a.sweep / 2);
    expect(mid[0]).toBeCloseTo(-6.414213562, 8);
    expect(mid[1]).toBeCloseTo(1.414213562, 8);
    expect(Math.sign((a.ux * a.vy - a.uy * a.vx) * a.sweep)).toBe(-1);
  });

  it('reads a rational SPLINE quarter circle as the exact arc (REFERENCES.md §4.7)', () => {
    const w = Math.SQRT1_2;
    const r = read(dxf([[0, 'SPLINE', 8, 0, 70, 12, 71, 2, 72, 6, 73, 3, 40, 0, 40, 0, 40, 0, 40, 1, 40, 1, 40, 1,
      41, 1, 41, w, 41, 1, 10, 1, 20, 0, 30, 0, 10, 1, 20, 1, 30, 0, 10, 0, 20, 1, 30, 0]]));
    expect(r.problems).toEqual([]);
    const a = r.contours[0].segments[0] as Arc;
    expect(a.kind).toBe('arc');
    expect(a.cx).toBeCloseTo(0, 14);
    expect(a.cy).toBeCloseTo(0, 14);
    for (let k = 0; k <= 8; k++) {
      const [x, y] = arcPoint(a, a.theta0 + (a.sweep * k) / 8);
      expect(Math.hypot(x, y)).toBeCloseTo(1, 14);
    }
    // §4.7: C(½) = (√2/2, √2/2); the arc's midpoint is the same point.
    const mid = arcPoint(a, a.theta0 + a.sweep / 2);
    expect(mid[0]).toBeCloseTo(w, 14);
    expect(mid[1]).toBeCloseTo(w, 14);
    expect(a.sweep).toBeCloseTo(Math.PI / 2, 14);
  });

  it('reads the 9-point NURBS full circle of REFERENCES.md §4.7 as four exact arcs with Q = 1', () => {
    const w = Math.SQRT1_2;
    const pts = [[1, 0], [1, 1], [0, 1], [-1, 1], [-1, 0], [-1, -1], [0, -1], [1, -1], [1, 0]];
    const knots = [0, 0, 0, 0.25, 0.25, 0.5, 0.5, 0.75, 0.75, 1, 1, 1];
    const e: (string | number)[] = [0, 'SPLINE', 8, 0, 70, 13, 71, 2, 72, 12, 73, 9];
    for (const k of knots) e.push(40, k);
    pts.forEach((_, i) => e.push(41, i % 2 ? w : 1));
    for (const [x, y] of pts) e.push(10, x, 20, y, 30, 0);
    const r = read(dxf([e]));
    const c = r.contours[0];
    expect(c.closed).toBe(true);
    expect(c.segments.map((s) => s.kind)).toEqual(['arc', 'arc', 'arc', 'arc']);
    const m = measureContour(c, 'up');
    expect(m.lengthMm).toBeCloseTo(2 * Math.PI, 10);
    expect(m.q.value).toBeCloseTo(1, 10);
  });

  it('turns a non-rational cubic B-spline into exact Béziers that meet the de Boor points (Boehm insertion)', () => {
    // Uniform interior knot ½: the two Bézier pieces meet at the average of the middle control points' thirds;
    // checked against a direct Cox–de Boor evaluation written here.
    const ctrl = [[0, 0], [1, 2], [3, 2], [4, 0], [6, 1]];
    const knots = [0, 0, 0, 0, 0.5, 1, 1, 1, 1];
    const e: (string | number)[] = [0, 'SPLINE', 8, 0, 70, 8, 71, 3, 72, 9, 73, 5];
    for (const k of knots) e.push(40, k);
    for (const [x, y] of ctrl) e.push(10, x, 20, y, 30, 0);
    const c = read(dxf([e])).contours[0];
    expect(c.segments.map((s) => s.kind)).toEqual(['cubic', 'cubic']);
    const basis = (i: number, p: number, u: number): number => {
      if (p === 0) return knots[i] <= u && u < knots[i + 1] ? 1 : 0;
      const a = knots[i + p] > knots[i] ? ((u - knots[i]) / (knots[i + p] - knots[i])) * basis(i, p - 1, u) : 0;
      const b = knots[i + p + 1] > knots[i + 1] ? ((knots[i + p + 1] - u) / (knots[i + p + 1] - knots[i + 1])) * basis(i + 1, p - 1, u) : 0;
      return a + b;
    };
    const deBoor = (u: number) => ctrl.reduce((acc, [x, y], i) => [acc[0] + basis(i, 3, u) * x, acc[1] + basis(i, 3, u) * y], [0, 0]);
    for (const [seg, u0] of [[0, 0], [1, 0.5]] as const) {
      const s = c.segments[seg];
      if (s.kind !== 'cubic') throw new Error('cubic expected');
      for (const t of [0, 0.3, 0.7]) {
        const v = 1 - t;
        const bx = v ** 3 * s.x0 + 3 * v * v * t * s.x1 + 3 * v * t * t * s.x2 + t ** 3 * s.x3;
        const by = v ** 3 * s.y0 + 3 * v * v * t * s.y1 + 3 * v * t * t * s.y2 + t ** 3 * s.y3;
        const [dx, dy] = deBoor(u0 + t / 2);
        expect(bx).toBeCloseTo(dx, 12);
        expect(by).toBeCloseTo(dy, 12);
      }
    }
  });

  it('reads a cubic B-spline of 20 000 control points into its n − 3 Béziers, which follow de Boor\'s algorithm (from memory)', () => {
    // Clamped, uniform with a few doubled interior knots; each Bézier piece is one non-empty knot span.
    const n = 20000, p = 3;
    const interior = Array.from({ length: n - p - 1 }, (_, i) => 1 + i - (i % 97 === 5 ? 1 : 0));
    const knots = [0, 0, 0, 0, ...interior, n, n, n, n];
    const ctrl = Array.from({ length: n }, (_, i) => [i / 10, ((i * 7919) % 1000) / 10]);
    const e: (string | number)[] = [0, 'SPLINE', 8, 0, 70, 8, 71, p, 72, knots.length, 73, n];
    for (const k of knots) e.push(40, k);
    for (const [x, y] of ctrl) e.push(10, x, 20, y, 30, 0);
    const c = read(dxf([e])).contours[0];
    const spans = knots.slice(p, n + 1).flatMap((u, i, all) => (i > 0 && all[i - 1] < u ? [[all[i - 1], u]] : []));
    expect(c.segments).toHaveLength(spans.length);
    expect(c.segments.every((s) => s.kind === 'cubic')).toBe(true);
    /** de Boor's algorithm: the point at u in span k (knots[k] ≤ u < knots[k + 1]). */
    const deBoor = (k: number, u: number) => {
      const d = Array.from({ length: p + 1 }, (_, j) => [...ctrl[j + k - p]]);
      for (let r = 1; r <= p; r++) {
        for (let j = p; j >= r; j--) {
          const alpha = (u - knots[j + k - p]) / (knots[j + 1 + k - r] - knots[j + k - p]);
          d[j] = [(1 - alpha) * d[j - 1][0] + alpha * d[j][0], (1 - alpha) * d[j - 1][1] + alpha * d[j][1]];
        }
      }
      return d[p];
    };
    for (let piece = 0; piece < spans.length; piece += 331) {
      const [u0, u1] = spans[piece], s = c.segments[piece];
      if (s.kind !== 'cubic') throw new Error('cubic expected');
      const k = knots.lastIndexOf(u0);
      for (const t of [0, 0.25, 0.6]) {
        const v = 1 - t;
        const [x, y] = deBoor(k, u0 + t * (u1 - u0));
        expect(v ** 3 * s.x0 + 3 * v * v * t * s.x1 + 3 * v * t * t * s.x2 + t ** 3 * s.x3).toBeCloseTo(x, 9);
        expect(v ** 3 * s.y0 + 3 * v * v * t * s.y1 + 3 * v * t * t * s.y2 + t ** 3 * s.y3).toBeCloseTo(y, 9);
      }
    }
  });

  it('reads full and partial ELLIPSEs with parameter angles (REFERENCES.md §6.4)', () => {
    const r = read(dxf([
      [0, 'ELLIPSE', 8, 0, 10, 0, 20, 0, 30, 0, 11, 2, 21, 0, 31, 0, 40, 0.5, 41, 0, 42, 2 * Math.PI],
      [0, 'ELLIPSE', 8, 0, 10, 10, 20, 0, 30, 0, 11, 2, 21, 0, 31, 0, 40, 0.5, 41, 0, 42, Math.PI / 4],
    ]));
    expect(r.contours[0].closed).toBe(true);
    // §6.4: M = (2,0), ratio ½, t = π/4 → (1.41421, 0.70711) from the centre.
    const a = r.contours[1].segments[0] as Arc;
    expect(a.x1 - 10).toBeCloseTo(1.41421356, 7);
    expect(a.y1).toBeCloseTo(0.70710678, 7);
    expect(r.contours[1].closed).toBe(false);
  });

  it('reads POLYLINE/VERTEX/SEQEND with bulges and skips spline frame vertices (flag 16, REFERENCES.md §6.4)', () => {
    const r = read(dxf([[0, 'POLYLINE', 8, 0, 66, 1, 10, 0, 20, 0, 30, 0, 70, 1,
      0, 'VERTEX', 8, 0, 10, 0, 20, 0, 42, 0.5, 0, 'VERTEX', 8, 0, 10, 99, 20, 99, 70, 16,
      0, 'VERTEX', 8, 0, 10, 10, 20, 0, 0, 'VERTEX', 8, 0, 10, 10, 20, 10, 0, 'VERTEX', 8, 0, 10, 0, 20, 10,
      0, 'SEQEND', 8, 0]]));
    expect(r.problems).toEqual([]);
    expect(r.contours).toHaveLength(1);
    expect(area(r.contours[0])).toBeCloseTo(117.47246945318797783, 9); // §6.8
  });
});

describe('readDxf: units and layers', () => {
  // REFERENCES.md §6.3 table.
  const table: [number, number][] = [[1, 25.4], [2, 304.8], [4, 1], [5, 10], [6, 1000], [9, 0.0254], [10, 914.4], [13, 1e-3], [14, 100], [21, 304.8006096012192]];
  for (const [code, mm] of table) {
    it(`converts $INSUNITS ${code} to ${mm} mm per unit (REFERENCES.md §6.3)`, () => {
      const r = read(dxf([line(0, 0, 1, 0)], { insunits: code }));
      expect(r.units.declared).toBe(true);
      expect(r.units.mmPerUnit).toBeCloseTo(mm, 12);
      expect(r.contours[0].segments[0].x1).toBeCloseTo(mm, 12);
    });
  }

  it('assumes millimetres when $INSUNITS is 0 or absent, and the chosen unit otherwise (§6.3, common practice)', () => {
    expect(read(dxf([line(0, 0, 1, 0)], { insunits: 0 })).units).toMatchObject({ declared: false, mmPerUnit: 1, assumed: 'mm' });
    expect(read(dxf([line(0, 0, 1, 0)])).units).toMatchObject({ declared: false, mmPerUnit: 1, assumed: 'mm' });
    expect(readDxf(dxf([line(0, 0, 1, 0)]), { assumedUnit: 'in' }).units).toMatchObject({ declared: false, mmPerUnit: 25.4, assumed: 'in' });
  });

  it('reports and skips entities on frozen and switched-off layers, and keeps each contour\'s layer', () => {
    const tables = [0, 'SECTION', 2, 'TABLES', 0, 'TABLE', 2, 'LAYER', 0, 'LAYER', 2, 'CUT', 70, 0, 62, 1,
      0, 'LAYER', 2, 'NOTES', 70, 1, 62, 7, 0, 'LAYER', 2, 'OFF', 70, 0, 62, -3, 0, 'ENDTAB', 0, 'ENDSEC'];
    const r = read(dxf([[0, 'CIRCLE', 8, 'CUT', 10, 0, 20, 0, 40, 1], [0, 'CIRCLE', 8, 'NOTES', 10, 0, 20, 0, 40, 2], [0, 'CIRCLE', 8, 'OFF', 10, 0, 20, 0, 40, 3]], { before: tables }));
    expect(r.contours.map((c) => c.layer)).toEqual(['CUT']);
    expect(r.problems.map((p) => [p.messageId, p.data.layer, p.data.state])).toEqual([['hiddenLayer', 'NOTES', 'frozen'], ['hiddenLayer', 'OFF', 'off']]);
  });

  it('lists TEXT, HATCH and POINT as not analysed and warns about tilted entities', () => {
    const r = read(dxf([[0, 'TEXT', 8, 0, 1, 'hi'], [0, 'TEXT', 8, 0, 1, 'ho'], [0, 'POINT', 8, 0, 10, 1, 20, 1],
      [0, 'CIRCLE', 8, 0, 10, 0, 20, 0, 40, 1, 210, 0.6, 220, 0, 230, 0.8], [0, 'LINE', 8, 0, 10, 0, 20, 0, 30, 0, 11, 1, 21, 0, 31, 5]]));
    expect(r.contours).toEqual([]);
    expect(ids(r)).toEqual(['not-analysed/entities', 'not-analysed/entities', 'out-of-plane/tilted', 'out-of-plane/tilted']);
    expect(r.problems[0].data).toEqual({ entity: 'TEXT', count: 2 });
  });
});

describe('readDxf: chaining', () => {
  /** Deterministic shuffle (seeded LCG), common practice. */
  function shuffle<T>(xs: T[], seed: number): T[] {
    const out = [...xs];
    let s = seed;
    for (let i = out.length - 1; i > 0; i--) {
      s = (s * 1103515245 + 12345) % 2 ** 31;
      const j = s % (i + 1);
      [out[i], out[j]] = [out[j], out[i]];
    }
    return out;
  }

  for (const seed of [1, 7, 42]) {
    it(`chains a shuffled, partly reversed slot outline into one closed contour (seed ${seed})`, () => {
      // A 20 × 10 slot: two lines and two half circles (area 20·10 + π·5², perimeter 40 + 10π — handbook formulas).
      const pieces: (string | number)[][] = [
        line(0, 0, 20, 0), [0, 'ARC', 8, 0, 10, 20, 20, 5, 40, 5, 50, 270, 51, 90],
        line(0, 10, 20, 10), [0, 'ARC', 8, 0, 10, 0, 20, 5, 40, 5, 50, 90, 51, 270],
      ];
      const r = read(dxf(shuffle(pieces, seed)));
      expect(r.problems).toEqual([]);
      expect(r.contours).toHaveLength(1);
      const c = r.contours[0];
      expect(c.closed).toBe(true);
      for (let i = 0; i < c.segments.length; i++) {
        const [ex, ey] = endOf(c.segments[i]);
        const n = c.segments[(i + 1) % c.segments.length];
        expect(Math.hypot(n.x0 - ex, n.y0 - ey)).toBeLessThan(1e-12);
      }
      const m = measureContour(c, 'up');
      expect(Math.abs(area(c))).toBeCloseTo(200 + 25 * Math.PI, 9);
      expect(m.lengthMm).toBeCloseTo(40 + 10 * Math.PI, 9);
    });
  }

  it('keeps an outline with a small gap open and moves the end onto the start with its close fix', () => {
    const text = dxf([line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 10), line(0, 10, 0, 0.05)]);
    const r = read(text);
    const c = r.contours[0];
    expect(c.closed).toBe(false);
    expect(text.slice(c.endSpan.start, c.endSpan.end)).toContain('0.05');
    const fixed = applyEdits(text, c.closeFix!.edits);
    // Only the y value line of the moved end changes.
    expect(fixed).toBe(text.replace('\n21\n0.05\n', '\n21\n0\n'));
    const again = read(fixed);
    expect(again.contours).toHaveLength(1);
    expect(again.contours[0].closed).toBe(true);
    expect(again.problems).toEqual([]);
  });

  it('reports three ends meeting at one point as branching, with every entity involved', () => {
    const r = read(dxf([line(0, 0, 10, 0), line(10, 0, 20, 0), line(10, 0, 10, 10)]));
    const b = r.problems.filter((p) => p.checkId === 'branching');
    expect(b).toHaveLength(1);
    expect(b[0].data).toEqual({ count: 3, xMm: 10, yMm: 0 });
    expect(b[0].related).toHaveLength(2);
  });

  it('joins ends on the same layer only', () => {
    const r = read(dxf([line(0, 0, 10, 0, 'A'), line(10, 0, 10, 10, 'B')]));
    expect(r.contours).toHaveLength(2);
  });

  it('closes an LWPOLYLINE whose last vertex repeats the first by setting the flag and dropping the vertex', () => {
    const text = dxf([[0, 'LWPOLYLINE', 8, 0, 90, 5, 70, 0, 10, 0, 20, 0, 10, 10, 20, 0, 10, 10, 20, 10, 10, 0, 20, 10, 10, 0, 20, 0]]);
    const c = read(text).contours[0];
    expect(c.closed).toBe(false);
    const fixed = applyEdits(text, c.closeFix!.edits);
    expect(fixed).toBe(text.replace('90\n5\n70\n0\n', '90\n4\n70\n1\n').replace('10\n0\n20\n10\n10\n0\n20\n0\n', '10\n0\n20\n10\n'));
    const again = read(fixed);
    expect(again.contours[0].closed).toBe(true);
    expect(area(again.contours[0])).toBeCloseTo(100, 12); // 10 × 10 square, counter-clockwise in y-up axes
  });

  it('removes an exact duplicate entity with its fix, and leaves it out of the chaining', () => {
    const text = dxf([[0, 'CIRCLE', 5, 'A1', 8, 0, 10, 0, 20, 0, 40, 1], [0, 'CIRCLE', 5, 'A2', 8, 0, 10, 0, 20, 0, 40, 1]]);
    const r = read(text);
    expect(r.contours).toHaveLength(1);
    const d = r.problems.find((p) => p.checkId === 'duplicate-entity')!;
    expect(d.data).toEqual({ entity: 'CIRCLE', line: 5 });
    const fixed = applyEdits(text, d.fixes![0].edits);
    expect(fixed).toBe(text.replace('0\nCIRCLE\n5\nA2\n8\n0\n10\n0\n20\n0\n40\n1\n', ''));
    expect(read(fixed).problems).toEqual([]);
  });
});

describe('readDxf: many entities', () => {
  it('finds the one exact duplicate among 3000 distinct LINEs, past several growths of the duplicate table', () => {
    const lines = Array.from({ length: 3000 }, (_, i) => line(i, 0, i, 1));
    const r = read(dxf([...lines, line(7, 0, 7, 1)]));
    const d = r.problems.filter((p) => p.checkId === 'duplicate-entity');
    expect(d).toHaveLength(1);
    expect(d[0].data.line).toBe(5 + 7 * 12); // the 8th LINE: 4 section lines, then 12 lines per LINE (1-based)
    expect(r.contours).toHaveLength(3000);
  });
});

describe('readDxf: section order', () => {
  it('reads a file whose HEADER and BLOCKS come after its ENTITIES as if they came first (DXF section order, REFERENCES.md §6.1)', () => {
    const header = [0, 'SECTION', 2, 'HEADER', 9, '$INSUNITS', 70, 1, 0, 'ENDSEC'];
    const blocks = [0, 'SECTION', 2, 'BLOCKS', 0, 'BLOCK', 2, 'SQ', 10, 0, 20, 0,
      0, 'LWPOLYLINE', 8, 0, 90, 4, 70, 1, 10, 0, 20, 0, 10, 1, 20, 0, 10, 1, 20, 1, 10, 0, 20, 1, 0, 'ENDBLK', 0, 'ENDSEC'];
    const entities = [0, 'SECTION', 2, 'ENTITIES', 0, 'INSERT', 8, 0, 2, 'SQ', 10, 5, 20, 5, 0, 'CIRCLE', 8, 0, 10, 0, 20, 0, 40, 1, 0, 'ENDSEC'];
    const inOrder = read([...header, ...blocks, ...entities, 0, 'EOF'].join('\n') + '\n');
    const late = read([...entities, ...blocks, ...header, 0, 'EOF'].join('\n') + '\n');
    expect(inOrder.problems).toEqual([]);
    expect(late.problems).toEqual([]);
    expect(late.units.mmPerUnit).toBe(25.4); // $INSUNITS 1 = inch (§6.3)
    expect(late.contours.map((c) => [c.element, area(c)])).toEqual(inOrder.contours.map((c) => [c.element, area(c)]));
    expect(area(late.contours[0])).toBeCloseTo(25.4 ** 2, 9); // unit square in inches
  });
});

describe('readDxf: malformed input', () => {
  it('reports a binary DXF at offset 0 (REFERENCES.md §6.6)', () => {
    const r = read('AutoCAD Binary DXF\r\n\x1a\0\0\0');
    expect(r.problems[0]).toMatchObject({ checkId: 'parse-error', messageId: 'dxf', span: { start: 0, end: 22 } });
  });

  it('reports a non-integer group code at its line and still reads the next entity', () => {
    const text = dxf([[0, 'LINE', 8, 0, 'x1', 5, 20, 0, 11, 1, 21, 0], [0, 'CIRCLE', 8, 0, 10, 0, 20, 0, 40, 2]]);
    const r = read(text);
    expect(ids(r)[0]).toBe('parse-error/dxf');
    expect(text.slice(r.problems[0].span.start, r.problems[0].span.end)).toBe('x1');
    expect(r.contours.some((c) => c.element === 'CIRCLE')).toBe(true);
  });

  it('reports a truncated pair and a value that is not a number', () => {
    const r1 = read('0\nSECTION\n2\nENTITIES\n0\nCIRCLE\n10\n');
    expect(r1.problems[0].data.detail).toBe('group code 10 on line 7 has no value line (the file is truncated)');
    const t2 = dxf([[0, 'CIRCLE', 8, 0, 10, 'abc', 20, 0, 40, 2]]);
    const r2 = read(t2);
    expect(t2.slice(r2.problems[0].span.start, r2.problems[0].span.end)).toBe('abc');
    expect(r2.contours).toEqual([]);
  });

  it('accepts CRLF line ends and right-justified group codes', () => {
    const text = dxf([line(0, 0, 3, 4)]).split('\n').map((l) => (/^\d+$/.test(l) && l.length < 3 ? l.padStart(3) : l)).join('\r\n');
    const r = read(text);
    expect(r.problems).toEqual([]);
    expect(r.contours[0].segments[0]).toMatchObject({ x1: 3, y1: 4 });
  });
});

describe('readDxf: the reader kept between reads', () => {
  // The latest reader and document builder are kept for their layouts and emptied after each read
  // (keepShape.ts): nothing a result holds may be emptied with them. An invariant of our own (no
  // outside source applies): the files are every DXF of samples/ and test/fixtures.
  const root = fileURLToPath(new URL('../../../../../', import.meta.url));
  const files = [...readdirSync(join(root, 'samples')).map((f) => join(root, 'samples', f)), ...readdirSync(join(root, 'test/fixtures/dxf'), { recursive: true, encoding: 'utf8' }).map((f) => join(root, 'test/fixtures/dxf', f))]
    .filter((f) => f.endsWith('.dxf'));
  const snapshot = (r: ReadResult) => JSON.stringify(r, (_, v: unknown) => (v !== null && typeof v === 'object' && 'x0' in v && 'kind' in v ? toPlainSegment(v as Segment) : v));

  it('leaves each result as it was after the next file is read, and reads a file again the same', () => {
    expect(files.length).toBeGreaterThan(8);
    for (let i = 0; i < files.length; i++) {
      const text = readFileSync(files[i]!, 'utf8');
      const r = read(text);
      const before = snapshot(r);
      read(readFileSync(files[(i + 1) % files.length]!, 'utf8'));
      expect(snapshot(r), files[i]).toBe(before);
      expect(snapshot(read(text)), files[i]).toBe(before);
    }
  });
});
