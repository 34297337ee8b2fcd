import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import type { Arc } from '../../types';
import { getSegmentEnd } from '../../geometry/bounds';
import { transformSegment, type Matrix } from '../../geometry/transform';
import { toPlainSegment } from '../../../../../test/support/shapes';
import { parsePathData } from './pathData';

// Independent reference: the npm package svg-path-parser (a PEG grammar of SVG 1.1 path data) with
// its makeAbsolute helper. It ships no types, so it is loaded through require with a local shape.
interface RefCommand {
  code: string;
  x0: number; y0: number;
  x: number; y: number;
  x1?: number; y1?: number; x2?: number; y2?: number;
  rx?: number; ry?: number; xAxisRotation?: number; largeArc?: boolean; sweep?: boolean;
}
const svgPathParser = createRequire(import.meta.url)('svg-path-parser') as {
  parseSVG(d: string): object[];
  makeAbsolute(commands: object[]): RefCommand[];
};
function parseReference(d: string): RefCommand[] {
  return svgPathParser.makeAbsolute(svgPathParser.parseSVG(d));
}

const slice = (text: string, span: { start: number; end: number }, base = 0): string =>
  text.slice(span.start - base, span.end - base);

describe('parsePathData agrees with svg-path-parser (independent reference)', () => {
  // Grammar cases from REFERENCES §5.1 (SVG 2 #PathDataBNF, SVG 1.1 §8.3.9) and the reference's README.
  const fixtures = [
    'M3,7 5-6 L1,7 1e2-.4 m-10,10 l10,0 V27 89 H23 v10 h10 C33,43 38,47 43,47 c0,5 5,10 10,10 ' +
      'S63,67 63,67 s-10,10 10,10 Q50,50 73,57 q20,-5 0,-10 T70,40 t0,-15 A5,5 45 1,0 40,20 a5,5 20 0,1 -10-10 Z',
    'M100-200L300-400',
    'M0.6.5L1.5.5.5.5',
    'M1e2-.5e-1L1E+2 3 -.5e-1-1e1',
    'm10 20 30 40 50 60',
    'M10 10 h5 v5 z l5 5',
    'M10 10 l10 0 0 10z m5 5 h3 v3 h-3z m1 1 l2 2',
    'M0 0a1 1 0 1110 10',
    'M0 0a1 1 0 00 1 1',
    'M0,0A4,2,30,1,0,5,3',
    'M0,0L13,000.56',
    'M 1 , 2 L 3 ,4 , 5,6',
    'M\t1\n2\r\nL3  4',
    'M+1+2L-.5-.5',
    'M0 0C10 0 20 10 30 30S50 60 70 70s10 10 20 0',
    'M0 0Q10 0 20 20T40 40t20 0T80 0',
    'M0 0 L10 0 S 20 20 30 30 T 40 40',
    'M0 0H10V10H0V0.5',
    'M1 1 L2 2 Z Z',
    'M1 1 M2 2 L3 3',
    'M0 0 L0 0 C0 0 0 0 0 0',
  ];
  it.each(fixtures)('reads %j like the reference', (d) => {
    const ref = parseReference(d);
    const ours = parsePathData(d, 0);
    expect(ours.error).toBeUndefined();
    const segments = ours.subpaths.flatMap((s) => s.segments);
    const drawn = ref.filter((c) => c.code !== 'M' && c.code !== 'Z');
    expect(segments.length).toBe(drawn.length);
    drawn.forEach((c, k) => {
      const s = segments[k]!;
      expect([s.x0, s.y0]).toEqual([c.x0, c.y0]);
      expect(getSegmentEnd(s)).toEqual([c.x, c.y]);
      if (c.code === 'C') expect(s.kind === 'cubic' && [s.x1, s.y1, s.x2, s.y2]).toEqual([c.x1, c.y1, c.x2, c.y2]);
      if (c.code === 'S') expect(s.kind === 'cubic' && [s.x2, s.y2]).toEqual([c.x2, c.y2]);
      if (c.code === 'Q') expect(s.kind === 'quad' && [s.x1, s.y1]).toEqual([c.x1, c.y1]);
      if (c.code === 'T') expect(s.kind).toBe('quad');
      if (c.code === 'A') {
        expect(s.kind).toBe('arc');
        // rx of the arc: |U| (U = rx·(cos φ, sin φ)); not scaled up here because the radii reach.
        if (s.kind === 'arc' && c.largeArc !== undefined) expect(Math.hypot(s.ux, s.uy)).toBeGreaterThanOrEqual(c.rx! - 1e-12);
      }
    });
    // Movetos: every explicit moveto starts a subpath at the reference's point.
    const movetos = ref.filter((c) => c.code === 'M');
    const explicit = ours.subpaths.filter((s) => d[s.startSpan.start] === 'M' || d[s.startSpan.start] === 'm');
    expect(explicit.map((s) => [s.startX, s.startY])).toEqual(movetos.map((c) => [c.x, c.y]));
    // A repeated Z closes nothing new, so count closed subpaths against Zs not directly after a Z.
    const closes = ref.filter((c, k) => c.code === 'Z' && ref[k - 1]?.code !== 'Z').length;
    expect(ours.subpaths.filter((s) => s.closed).length).toBe(closes);
  });

  it('reads a drawing command after Z as a new subpath from the same start (REFERENCES §5.1)', () => {
    const r = parsePathData('M10 10 h5 v5 z l5 5', 0);
    expect(r.subpaths.map((s) => [s.startX, s.startY, s.closed])).toEqual([[10, 10, true], [10, 10, false]]);
    expect(getSegmentEnd(r.subpaths[1]!.segments[0]!)).toEqual([15, 15]);
  });

  it('reflects the previous C/S control point for S and the previous Q/T control point for T (REFERENCES §5.1)', () => {
    // SVG 2 Paths, S/T: first control point = 2·current − previous control point; else the current point.
    const r = parsePathData('M0 0 C10 0 20 10 30 30 S50 60 70 70 Q80 60 90 70 T110 70 L120 70 T130 80 S140 90 150 80', 0);
    const segs = r.subpaths[0]!.segments;
    expect(segs[1]).toMatchObject({ kind: 'cubic', x1: 40, y1: 50, x2: 50, y2: 60 }); // 2·(30,30) − (20,10)
    expect(segs[3]).toMatchObject({ kind: 'quad', x1: 100, y1: 80 }); // 2·(90,70) − (80,60)
    expect(segs[5]).toMatchObject({ kind: 'quad', x1: 120, y1: 70 }); // after L: the current point
    expect(segs[6]).toMatchObject({ kind: 'cubic', x1: 130, y1: 80 }); // after T: the current point
  });

  it('accepts SVG 1.1 trailing points, form feeds, signed arc radii and zero-length segments', () => {
    // SVG 1.1 §8.3.9 fractional-constant `digit-sequence "."`; SVG 2 wsp includes #xC.
    const r = parsePathData('M1. 2.\fL3. 4 A-5 -5 0 0 1 13 4 L13 4 A1 1 0 0 1 13 4', 0);
    expect(r.error).toBeUndefined();
    const [l, a, z, za] = r.subpaths[0]!.segments;
    expect(l).toMatchObject({ kind: 'line', x0: 1, y0: 2, x1: 3, y1: 4 });
    // Negative radii are made positive (SVG 2 implementation notes, REFERENCES §5.1/5.3): centre (8, 4).
    expect(a).toMatchObject({ kind: 'arc', x1: 13, y1: 4 });
    expect((a as Arc).cx).toBeCloseTo(8, 12);
    expect((a as Arc).cy).toBeCloseTo(4, 12);
    expect(z).toMatchObject({ kind: 'line', x0: 13, y0: 4, x1: 13, y1: 4 });
    // Arc with coinciding ends (omitted by the spec, REFERENCES §5.3 step 0) kept as a zero-length line.
    expect(za).toMatchObject({ kind: 'line', x0: 13, y0: 4, x1: 13, y1: 4 });
  });

  it('reads a path with 100 000 segments', () => {
    const parts = ['M0 0'];
    for (let i = 0; i < 100_000; i++) parts.push(`l${(i % 9) - 4}.25-${i % 7}e-1`);
    const r = parsePathData(parts.join(''), 0);
    expect(r.error).toBeUndefined();
    expect(r.subpaths[0]!.segments.length).toBe(100_000);
  });
});

describe('parsePathData keeps source positions', () => {
  it('gives each segment its argument group, the first one with its letter', () => {
    const base = 9; // e.g. the offset of d's first character in `<path d="…`
    const d = 'M 10,10 L 20,20 30,30 h5 Z';
    const [sub] = parsePathData(d, base).subpaths;
    expect(sub!.segments.map((s) => slice(d, s.span, base))).toEqual(['L 20,20', '30,30', 'h5']);
    expect(slice(d, sub!.span, base)).toBe(d);
    expect(slice(d, sub!.startSpan, base)).toBe('M 10,10');
    expect(slice(d, sub!.endSpan, base)).toBe('Z');
  });

  it('spans implicit linetos, arcs with glued flags and the subpath after a Z', () => {
    const d = '  m1 2 3 4 a1 1 0 1110 10 z l5 5 6 6  M7 7';
    const r = parsePathData(d, 0);
    const [first, second, third] = r.subpaths;
    expect(first!.segments.map((s) => slice(d, s.span))).toEqual(['3 4', 'a1 1 0 1110 10']);
    expect(slice(d, first!.span)).toBe('m1 2 3 4 a1 1 0 1110 10 z');
    expect(slice(d, first!.startSpan)).toBe('m1 2');
    expect(slice(d, second!.startSpan)).toBe('l5 5');
    expect(slice(d, second!.endSpan)).toBe('6 6');
    expect(slice(d, second!.span)).toBe('l5 5 6 6');
    expect(third!.segments).toEqual([]); // a lone moveto
    expect(slice(d, third!.startSpan)).toBe('M7 7');
    expect(slice(d, third!.endSpan)).toBe('M7 7');
  });
});

describe('parsePathData reports malformed data and keeps what came before (REFERENCES §5.2)', () => {
  // at: offset of the error; text: the characters it marks ('' = at the end of the data).
  const cases: { d: string; segments: number[]; at: number; text: string; detail: RegExp }[] = [
    // The REFERENCES §5.2 / SVG 2 example: the complete (20,20) group is kept.
    { d: 'M 10,10 L 20,20,30', segments: [1], at: 18, text: '', detail: /expected a number in 'L'/ },
    // REFERENCES §5.1: M(1.5, .5) then an implicit lineto with one coordinate.
    { d: 'M1.5.5.5', segments: [0], at: 8, text: '', detail: /expected a number/ },
    // A bare exponent is an error, not "1 then command e" (§5.1).
    { d: 'M0 0 L1 1e', segments: [0], at: 8, text: '1e', detail: /exponent has no digits/ },
    { d: 'M0 0 L5 5 X 1', segments: [1], at: 10, text: 'X', detail: /found 'X'/ },
    { d: 'M0 0 L5 5 L', segments: [1], at: 11, text: '', detail: /end of the path data/ },
    // Two numbers 13 and 000.56 = 0.56 (no digit grouping, §5.1), then a lone 7.
    { d: 'M0 0 L13,000.56 7', segments: [1], at: 17, text: '', detail: /expected a number/ },
    // comma-wsp holds at most one comma, and none after a command letter nor before one.
    { d: 'M0 0 L1,,2', segments: [0], at: 8, text: ',', detail: /found ','/ },
    { d: 'M0 0 L,1 2', segments: [0], at: 6, text: ',', detail: /found ','/ },
    { d: 'M0 0 L1 2,', segments: [1], at: 10, text: '', detail: /after ','/ },
    { d: 'M0 0 L1 2, L3 4', segments: [1], at: 11, text: 'L', detail: /after ','.*found 'L'/ },
    { d: 'M0 0 A1 1 0 2 0 5 5', segments: [0], at: 12, text: '2', detail: /arc flag/ },
    { d: 'M0 0 Z 5', segments: [0], at: 7, text: '5', detail: /after 'Z'/ },
    // An odd count of coordinates: the last lone one is dropped.
    { d: 'M0 0 L1 2 3 4 5', segments: [2], at: 15, text: '', detail: /expected a number/ },
    { d: 'M1 2 -', segments: [0], at: 5, text: '-', detail: /not a number/ },
    { d: 'M1e400 0', segments: [], at: 1, text: '1e400', detail: /too large/ },
    { d: 'M0 0 L1 2 M3', segments: [1], at: 12, text: '', detail: /expected a number in 'M'/ },
    // Non-ASCII characters are no path data characters (§5.1): the error names the whole character,
    // a surrogate pair included, and Latin-1 ones (é = U+00E9, NBSP = U+00A0) are no digits nor wsp.
    { d: 'M0 0 L5 5 é', segments: [1], at: 10, text: 'é', detail: /found 'é'/ },
    { d: 'M0 0 L5\u00a05', segments: [0], at: 7, text: '\u00a0', detail: /expected a number/ },
    { d: 'M0 0 L5 5 \u{1F4D0} 1', segments: [1], at: 10, text: '\u{1F4D0}', detail: /found '\u{1F4D0}'/u },
    // Path data must start with a moveto (§5.1); `Z` alone is invalid.
    { d: 'Z', segments: [], at: 0, text: 'Z', detail: /must start with a moveto/ },
    { d: '  L1 2', segments: [], at: 2, text: 'L', detail: /must start with a moveto/ },
  ];
  it.each(cases)('$d', ({ d, segments, at, text, detail }) => {
    const base = 100;
    const r = parsePathData(d, base);
    expect(r.subpaths.map((s) => s.segments.length)).toEqual(segments);
    expect(r.error).toBeDefined();
    expect(r.error!.span.start).toBe(base + at);
    expect(slice(d, r.error!.span, base)).toBe(text);
    expect(r.error!.detail).toMatch(detail);
    expect(r.error!.detail.endsWith('.')).toBe(false);
  });

  it('reads empty, blank and `none` data as no subpaths and no error (SVG 2 Paths, the d property)', () => {
    for (const d of ['', '  \n\t', 'none', ' none ']) expect(parsePathData(d, 0)).toEqual({ subpaths: [] });
  });
});

describe('parsePathData arcs match REFERENCES §5.5', () => {
  const deg = (r: number): number => (r * 180) / Math.PI;
  const norm = (a: number): number => ((a % 360) + 540) % 360 - 180; // to (−180, 180]
  const rows: [string, number, number, number, number][] = [
    // path, cx, cy, θ1 (deg), Δθ (deg)
    ['M0 0 A5 5 0 0 1 10 0', 5, 0, 180, 180],
    ['M0 0 A5 5 0 0 0 10 0', 5, 0, 180, -180],
    ['M0 0 A2 2 0 0 1 10 0', 5, 0, 180, 180],
    ['M0 0 A10 10 0 0 1 10 0', 5, 8.660254037844386, -120, 60],
    ['M0 0 A10 10 0 1 1 10 0', 5, -8.660254037844386, 120, 300],
    ['M0,0A4,2,30,1,0,5,3', 1.7363514101001, 2.63859177966098, -134.890578159557, -266.364907664464],
    ['m0 0 a4 2 30 0 1 5 3', 1.7363514101001, 2.63859177966098, -134.890578159557, 93.6350923355364],
  ];
  it.each(rows)('%s', (d, cx, cy, theta1, delta) => {
    const [seg] = parsePathData(d, 0).subpaths[0]!.segments;
    expect(seg!.kind).toBe('arc');
    const a = seg as Arc;
    expect(a.cx).toBeCloseTo(cx, 9);
    expect(a.cy).toBeCloseTo(cy, 9);
    expect(norm(deg(a.theta0) - theta1)).toBeCloseTo(0, 9);
    expect(deg(a.sweep)).toBeCloseTo(delta, 9);
  });
});

describe('parsePathData with a matrix', () => {
  const path = 'M10 10 C 20 20, 40 20, 50 10 S 80 0, 90 10 L 90 50 Q 70 70 50 50 T 10 50 A 20 10 30 0 1 5 5 '
    + 'a 3 4 -20 1 0 2 -3 A 0 3 0 0 1 7 7 A 5 5 0 0 1 7 7 h 4 v -2 Z m 1 1 l 2 2 c 1 1 2 2 3 3 s 1 2 3 4 q 1 2 3 4 t 5 5';
  const matrices: Matrix[] = [[1.7, 0.4, -0.3, 0.9, -3.3, 7], [0, 1, -1, 0, 0, 0], [1, 0, 0, 1, 1500, 1500], [-2, 0, 0, 2, 0, 0]];
  for (const [m, d] of matrices.flatMap((m) => [path, 'M0 0 L 5 0 A 3 2 10 0 1 9 4', 'M0 0 l 5 0 c 1 1 2 2 3 3'].map((d) => [m, d] as const))) {
    it(`builds exactly transformSegment of each user-unit segment, close fixes unmapped (${d.slice(0, 12)}…, matrix ${m.join(' ')}; SVG 1.1 §7.15.3)`, () => {
      const plain = parsePathData(d, 5);
      const mapped = parsePathData(d, 5, m);
      expect(mapped.subpaths.length).toBe(plain.subpaths.length);
      mapped.subpaths.forEach((sub, i) => {
        const reference = plain.subpaths[i]!;
        expect(sub.segments.map(toPlainSegment)).toEqual(reference.segments.map((s) => transformSegment(s, m)));
        sub.segments.forEach((s, k) => {
          for (const [key, value] of Object.entries(toPlainSegment(s))) {
            if (typeof value === 'number') expect(Object.is(value, (transformSegment(reference.segments[k]!, m) as unknown as Record<string, number>)[key])).toBe(true);
          }
        });
        expect(sub.closeFix).toEqual(reference.closeFix);
        expect([sub.startX, sub.startY]).toEqual([reference.startX, reference.startY]);
      });
    });
  }
});
