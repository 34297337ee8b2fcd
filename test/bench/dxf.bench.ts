/**
 * DXF reading speed, side by side (run: `npx vitest bench --run test/bench/dxf.bench.ts`).
 * Files of loose LINE/ARC entities (open outlines of 3 lines + 1 arc each, shuffled so chaining has
 * work to do and every outline gets a close fix) at 1e4 and 1e5 entities. Compared: a bare group tokenizer with number conversion (the
 * floor: what any reader must at least do), our reader (scan + entities + chaining), our full analysis,
 * and dxf-parser's parse alone. Peak RSS of the process is printed after each size.
 */
import DxfParser from 'dxf-parser';
import { bench, describe } from 'vitest';
import { readDxf } from '../../server/src/engine/formats/dxf/readDxf';
import { analyze } from '../../server/src/engine/index';

function makeFile(entities: number): string {
  const out: string[] = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES'];
  const shapes = Math.ceil(entities / 4);
  const cols = Math.ceil(Math.sqrt(shapes));
  const parts: string[][] = [];
  for (let k = 0; k < shapes; k++) {
    const x = (k % cols) * 20, y = Math.floor(k / cols) * 20;
    const L = (x0: number, y0: number, x1: number, y1: number) => ['0', 'LINE', '8', 'CUT', '10', String(x0), '20', String(y0), '30', '0', '11', String(x1), '21', String(y1), '31', '0'];
    // Right, top and left edges and a corner arc; the bottom edge is missing, so each outline is open (gap 10 mm).
    parts.push(L(x + 15, y + 5, x + 15, y + 15), L(x + 15, y + 15, x, y + 15), L(x, y + 15, x, y));
    parts.push(['0', 'ARC', '8', 'CUT', '10', String(x + 10), '20', String(y + 5), '30', '0', '40', '5', '50', '270', '51', '360']);
  }
  // Deterministic shuffle (LCG), so pieces arrive out of order.
  let s = 12345;
  for (let i = parts.length - 1; i > 0; i--) {
    s = (s * 1103515245 + 12345) % 2 ** 31;
    const j = s % (i + 1);
    [parts[i], parts[j]] = [parts[j], parts[i]];
  }
  for (const p of parts) out.push(...p);
  out.push('0', 'ENDSEC', '0', 'EOF');
  return out.join('\n') + '\n';
}

/** The floor: walk every line pair, parse the group code, convert numeric values (codes 10–59). */
function tokenizeFloor(text: string): number {
  let pos = 0;
  let sum = 0;
  const n = text.length;
  while (pos < n) {
    let nl = text.indexOf('\n', pos);
    if (nl < 0) nl = n;
    let code = 0;
    for (let i = pos; i < nl; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d >= 0 && d <= 9) code = code * 10 + d;
    }
    pos = nl + 1;
    let nl2 = text.indexOf('\n', pos);
    if (nl2 < 0) nl2 = n;
    if (code >= 10 && code < 60) sum += Number(text.slice(pos, nl2));
    pos = nl2 + 1;
  }
  return sum;
}

const options = { time: 0, iterations: 3, warmupIterations: 1 };
const mb = () => `${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`;

for (const size of [1e4, 1e5]) {
  const text = makeFile(size);
  describe(`${size} loose LINE/ARC entities (${(text.length / 1e6).toFixed(1)} MB)`, () => {
    bench('floor: bare group tokenizer with number conversion', () => { tokenizeFloor(text); }, options);
    bench('loopwise readDxf (scan, entities, chaining)', () => { readDxf(text, { assumedUnit: 'auto' }); }, options);
    bench('loopwise analyze (read + all checks)', () => { analyze(text, 'dxf'); }, options);
    bench('dxf-parser parseSync (parse only)', () => { new DxfParser().parseSync(text); }, {
      ...options,
      teardown: () => console.log(`peak RSS of the process after ${size} entities: ${mb()}`),
    });
  });
}
