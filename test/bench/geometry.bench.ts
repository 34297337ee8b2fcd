/**
 * Self-intersection speed on one huge contour, side by side (run: `npx vitest bench --run test/bench/geometry.bench.ts`).
 * One SVG path of n line, cubic or arc segments around a wavy circle (simple: no crossings), n = 1e4
 * and 1e5. Compared in one run: the floor (XML parse with saxes + a plain number scan of the path
 * data), our self-intersection search on the read contour, our full analysis of the file, and paper.js
 * (path import + length + area + self-intersections). vitest prints the ratios; crossing counts of
 * ours and paper's are printed once per size (the contour has none).
 */
import paper from 'paper';
import { SaxesParser } from 'saxes';
import { bench, describe } from 'vitest';
import { readSvg } from '../../server/src/engine/formats/svg/readSvg';
import { findSelfIntersections } from '../../server/src/engine/geometry/intersect';
import { analyze } from '../../server/src/engine/index';

type Kind = 'line' | 'cubic' | 'arc';

function makePathData(n: number, kind: Kind): string {
  const R = 1000;
  const pt = (k: number): [number, number] => {
    const a = (2 * Math.PI * k) / n;
    const r = R + 2 * Math.sin(a * 37);
    return [r * Math.cos(a), r * Math.sin(a)];
  };
  const f = (v: number) => v.toFixed(4);
  const parts: string[] = [];
  const [x0, y0] = pt(0);
  parts.push(`M${f(x0)} ${f(y0)}`);
  for (let k = 1; k <= n; k++) {
    const [x, y] = pt(k % n);
    if (kind === 'line') parts.push(`L${f(x)} ${f(y)}`);
    else if (kind === 'arc') parts.push(`A${f(R)} ${f(R)} 0 0 1 ${f(x)} ${f(y)}`);
    else {
      const [px, py] = pt(k - 1);
      const [a, b] = [px + (x - px) / 3 + (y - py) * 0.05, py + (y - py) / 3 - (x - px) * 0.05];
      const [c, d] = [px + (2 * (x - px)) / 3 + (y - py) * 0.05, py + (2 * (y - py)) / 3 - (x - px) * 0.05];
      parts.push(`C${f(a)} ${f(b)} ${f(c)} ${f(d)} ${f(x)} ${f(y)}`);
    }
  }
  parts.push('Z');
  return parts.join('');
}

const wrap = (d: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="3000mm" height="3000mm" viewBox="-1500 -1500 3000 3000"><path d="${d}"/></svg>`;

function floor(text: string): number {
  let sum = 0;
  const parser = new SaxesParser();
  parser.on('opentag', (tag) => {
    const d = tag.attributes['d'];
    if (typeof d !== 'string') return;
    const re = /-?\d*\.?\d+(?:e-?\d+)?/g;
    let m: RegExpExecArray | null;
    while ((m = re.exec(d))) sum += Number(m[0]);
  });
  parser.write(text).close();
  return sum;
}

function paperFull(d: string): number {
  const path = new paper.Path(d);
  void path.length;
  void path.area;
  const n = path.getIntersections(path).filter((l) => l.isCrossing()).length;
  path.remove();
  return n;
}

paper.setup(new paper.Size(100, 100));

for (const n of [1e4, 1e5]) {
  for (const kind of ['line', 'cubic', 'arc'] as const) {
    const d = makePathData(n, kind);
    const text = wrap(d);
    const contour = readSvg(text, { assumedUnit: 'mm' }).contours[0]!;
    const ours = findSelfIntersections(contour);
    console.log(`[geometry.bench] n=${n} ${kind}: ours ${ours.intersections.length} intersections, ${ours.overlaps.length} overlaps, ${ours.unresolved.length} unresolved; paper ${n <= 1e4 ? paperFull(d) : 'see timing'} crossings`);
    describe(`one contour of ${n} ${kind} segments`, () => {
      bench('floor (saxes + number scan)', () => { floor(text); }, { iterations: 3, time: 0 });
      bench('ours: self-intersections of the read contour', () => { findSelfIntersections(contour); }, { iterations: 3, time: 0 });
      bench('ours: full analysis', () => { analyze(text, 'svg', { assumedUnit: 'mm' }); }, { iterations: 3, time: 0 });
      bench('paper: import + length + area + self-intersections', () => { paperFull(d); }, { iterations: 2, time: 0 });
    });
  }
}
