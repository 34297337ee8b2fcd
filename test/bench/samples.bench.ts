/**
 * `analyze()` of each file in samples/, warm (run: `npx vitest bench --run test/bench/samples.bench.ts`).
 * The editor re-analyses a file on every edit, so these small ordinary files should each take well
 * under 50 ms. The machine is noisy: read the medians as orders of magnitude between runs.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { bench, describe } from 'vitest';
import { analyze, getFormatForPath } from './shippedEngine';

const dir = join(__dirname, '../../samples');

describe('analyze() per sample file', () => {
  for (const name of readdirSync(dir).sort()) {
    const format = getFormatForPath(name);
    if (!format) continue;
    const text = readFileSync(join(dir, name), 'utf8');
    bench(name, () => { analyze(text, format); }, { warmupIterations: 3, iterations: 15, time: 0 });
  }
});
