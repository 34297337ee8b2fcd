/**
 * Many small parts: `analyze()` of a sheet of 5000 contours of one shape against the floor, side by
 * side in one run (run: `npx vitest bench --run test/bench/parts.bench.ts`).
 *
 * A perforated panel or a nested sheet is thousands of small contours, each of which gets its
 * measures, nesting, hull and roundness (inradius and minimum zone by branch and bound, or in closed
 * form for a whole circle). Shapes: circle, rectangle, slot, rounded rectangle, hexagon and an L, each
 * 5000 times on a 10 mm grid inside one rounded outer boundary. Timed in one process, in turn, for each
 * shape, after 2 warm-up calls of both: the floor (saxes + a number scan of every attribute,
 * svgFloor.ts) and ours (`analyze()` of the engine bundled as shipped, shippedEngine.ts), median of 5. Printed: both times, µs per contour and
 * ours/floor. No target: the figures track the cost of roundness per contour (recorded in
 * DEVELOPERS.md). The machine is noisy: compare ratios of one run.
 */
import { bench, describe } from 'vitest';
import { analyze } from './shippedEngine';
import { svgFloor } from './svgFloor';
import { fmt, time } from './timing';

const COUNT = 5000;

/** One part centred at (x, y), about 6 × 4 mm. */
const shapes: Record<string, (x: number, y: number) => string> = {
  circle: (x, y) => `<circle cx="${x}" cy="${y}" r="3"/>`,
  rectangle: (x, y) => `<rect x="${x - 3}" y="${y - 2}" width="6" height="4"/>`,
  slot: (x, y) => `<rect x="${x - 3}" y="${y - 1.5}" width="6" height="3" rx="1.5"/>`,
  'rounded rectangle': (x, y) => `<rect x="${x - 3}" y="${y - 2}" width="6" height="4" rx="0.5"/>`,
  hexagon: (x, y) => `<polygon points="${Array.from({ length: 6 }, (_, k) =>
    `${(x + 3 * Math.cos((k * Math.PI) / 3)).toFixed(4)},${(y + 3 * Math.sin((k * Math.PI) / 3)).toFixed(4)}`).join(' ')}"/>`,
  'L shape': (x, y) => `<polygon points="${x - 3},${y - 2} ${x + 3},${y - 2} ${x + 3},${y} ${x - 1},${y} ${x - 1},${y + 2} ${x - 3},${y + 2}"/>`,
};

/** A sheet of COUNT parts of one shape inside a rounded outer boundary, in mm. */
function makeSheet(part: (x: number, y: number) => string): string {
  const cols = Math.ceil(Math.sqrt(COUNT)), side = cols * 10 + 20;
  const parts: string[] = [];
  for (let k = 0; k < COUNT; k++) parts.push(part(15 + (k % cols) * 10, 15 + Math.floor(k / cols) * 10));
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${side}mm" height="${side}mm" viewBox="0 0 ${side} ${side}">` +
    `<rect x="1" y="1" width="${side - 2}" height="${side - 2}" rx="5"/>${parts.join('')}</svg>`;
}

for (const [name, part] of Object.entries(shapes)) {
  const text = makeSheet(part);
  for (let i = 0; i < 2; i++) { svgFloor(text); analyze(text, 'svg'); }
  const fl = time(5, () => svgFloor(text)).ms;
  const us = time(5, () => analyze(text, 'svg')).ms;
  console.log(
    `[parts.bench] ${COUNT} × ${name.padEnd(17)} floor ${fmt(fl)}, ours ${fmt(us)} | ${((1000 * us) / (COUNT + 1)).toFixed(0)} µs per contour, ours/floor ${(us / fl).toFixed(1)}`,
  );
}

// vitest's own table for the two extremes (the figures above are the ones to read).
describe(`${COUNT} parts on a sheet`, () => {
  for (const name of ['circle', 'L shape']) {
    const text = makeSheet(shapes[name]!);
    bench(`analyze: ${name}`, () => { analyze(text, 'svg'); }, { iterations: 3, time: 0 });
  }
});
