/**
 * DXF reading and analysis speed side by side, and peak memory (run: `npx vitest bench --run test/bench/dxf.bench.ts`).
 *
 * Input: loose LINE/ARC entities (open outlines of 3 lines + 1 arc, shuffled; looseDxf.ts) at 1e4, 1e5
 * and 1e6 entities. Timed in one process, in turn, for each size, each contender warmed up alike just
 * before it is timed (for 1.5 s or 100 calls at 1e4, 3 s or 20 calls at 1e5, one call at 1e6 — dxf-parser
 * none at 1e6, where one call takes ~3 GB): median of 15 runs at 1e4, 5 at 1e5, 1 run at 1e6:
 * - floor: a bare group tokenizer with number conversion (what any reader must at least do);
 * - least: the floor plus the least that any reader must add to hand an editor this file's contours
 *   and open-contour problems (readLeast: entity starts, end points, a hashed join, one object per
 *   contour and per problem), a lower bound for ours;
 * - read: our readDxf (scan, entity records, units, duplicates, pieces, chaining, contours, close fixes);
 * - ours: `analyzeOutlines()`, read + measures + geometry (intersections, nesting) + all checks:
 *   what the language server publishes the problems from;
 * - whole: `analyze()`, that and then every contour's roundness and hull (measured by the server after
 *   publishing, reported by the CLI);
 * (read, ours and whole from the engine bundled as the server and the CLI run it: shippedEngine.ts)
 * - dxf-parser: its parseSync alone (no positions, no geometry).
 * Printed: times, least/floor, read/floor, ours/floor (target ≤ 2) and whole/floor, ours/least,
 * dxf-parser/ours (target > 1) and dxf-parser/whole. The least reader must find as many contours as
 * ours, or the run stops.
 * Peak RSS at 1e6 (target ≤ 1 GB) is measured in a child process that only reads the file and runs
 * analyze once (dxfPeakRss.ts, bundled with esbuild), since this process also holds dxf-parser's
 * objects. The machine is noisy: compare ratios of one run, not absolute times between runs.
 * LOOPWISE_BENCH_MAX_N=1e5 stops at 1e5.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import DxfParser from 'dxf-parser';
import { buildSync } from 'esbuild';
import { bench, describe } from 'vitest';
import { makeLooseDxf, readLeast, tokenizeFloor } from './looseDxf';
import { analyze, analyzeOutlines, DEFAULT_OPTIONS, readDxf } from './shippedEngine';
import { fmt, timeSteady } from './timing';

const read = (text: string) => readDxf(text, { assumedUnit: 'auto', nearClosedToleranceMm: DEFAULT_OPTIONS.nearClosedToleranceMm });
const maxN = Number(process.env['LOOPWISE_BENCH_MAX_N'] ?? 1e6);
const sizes = [1e4, 1e5, 1e6].filter((n) => n <= maxN);

let largest = '';
for (const n of sizes) {
  const text = makeLooseDxf(n);
  largest = text;
  // One call at 1e4 varies 18–52 ms within a process (collections): a median of 15 is steadier.
  const runs = n >= 1e6 ? 1 : n >= 1e5 ? 5 : 15;
  // Each contender is warmed up for the same wall time (or call count) just before it is timed, so
  // that every one is timed in its steady state (as in geometry.bench.ts); one call each at 1e6.
  const [warmMs, warmCalls] = n >= 1e6 ? [0, 1] : n >= 1e5 ? [3000, 20] : [1500, 100];
  // Each contender returns a count, not its result: a kept result (hundreds of MB at 1e6) would be
  // live through the next call and the next contender's, and slow their collections.
  const fl = timeSteady(runs, () => tokenizeFloor(text), warmMs, warmCalls);
  const ls = timeSteady(runs, () => readLeast(text).contours, warmMs, warmCalls);
  const rd = timeSteady(runs, () => read(text).contours.length, warmMs, warmCalls);
  if (ls.value !== rd.value) throw new Error(`the least reader found ${ls.value} contours, ours ${rd.value}`);
  const us = timeSteady(runs, () => analyzeOutlines(text, 'dxf').findings.length, warmMs, warmCalls);
  const wh = timeSteady(runs, () => analyze(text, 'dxf').findings.length, warmMs, warmCalls);
  // dxf-parser takes ~3 GB at 1e6: timed there once, with no warm-up call.
  const parse = () => new DxfParser().parseSync(text)?.entities.length;
  const dp = timeSteady(runs, parse, warmMs, n >= 1e6 ? 0 : warmCalls);
  console.log(
    `[dxf.bench] n=${n.toExponential(0)} (${(text.length / 2 ** 20).toFixed(1)} MB) floor ${fmt(fl.ms)}, least ${fmt(ls.ms)}, read ${fmt(rd.ms)}, ours ${fmt(us.ms)}, whole ${fmt(wh.ms)}, dxf-parser ${fmt(dp.ms)}` +
      ` | least/floor ${(ls.ms / fl.ms).toFixed(2)}, read/floor ${(rd.ms / fl.ms).toFixed(2)}, ours/floor ${(us.ms / fl.ms).toFixed(2)} (target ≤ 2), whole/floor ${(wh.ms / fl.ms).toFixed(2)}` +
      `, ours/least ${(us.ms / ls.ms).toFixed(2)}, dxf-parser/ours ${(dp.ms / us.ms).toFixed(2)} (target > 1), dxf-parser/whole ${(dp.ms / wh.ms).toFixed(2)}` +
      ` | warm-up calls ${fl.warmUps}/${ls.warmUps}/${rd.warmUps}/${us.warmUps}/${wh.warmUps}/${dp.warmUps}`,
  );
}

if (maxN >= 1e6) {
  const dir = mkdtempSync(join(tmpdir(), 'loopwise-dxf-bench-'));
  const script = join(dir, 'dxfPeakRss.cjs');
  const file = join(dir, 'loose-1e6.dxf');
  buildSync({ entryPoints: [fileURLToPath(new URL('./dxfPeakRss.ts', import.meta.url))], bundle: true, platform: 'node', format: 'cjs', outfile: script, logLevel: 'error' });
  writeFileSync(file, largest); // the 1e6 text timed above
  const r = JSON.parse(execFileSync(process.execPath, [script, file], { encoding: 'utf8' })) as { peakRssMb: number; rssTextMb: number; textMb: number; ms: number };
  rmSync(dir, { recursive: true });
  console.log(
    `[dxf.bench] n=1e6 peak RSS of a process that reads the file and analyses it once: ${r.peakRssMb.toFixed(0)} MB (target ≤ 1024 MB;` +
      ` ${r.rssTextMb.toFixed(0)} MB after reading the ${r.textMb.toFixed(0)} MB text), analyze ${fmt(r.ms)}`,
  );
}

// vitest's own side-by-side table at 1e4 (the figures above are the ones to read).
const small = makeLooseDxf(1e4);
describe('1e4 loose LINE/ARC entities', () => {
  bench('floor: bare group tokenizer with number conversion', () => { tokenizeFloor(small); }, { iterations: 3, time: 0 });
  bench('least: the floor and the least a reader must add (lower bound)', () => { readLeast(small); }, { iterations: 3, time: 0 });
  bench('loopwise readDxf (scan, entities, chaining)', () => { read(small); }, { iterations: 3, time: 0 });
  bench('ours: loopwise analyzeOutlines (read + geometry + all checks)', () => { analyzeOutlines(small, 'dxf'); }, { iterations: 3, time: 0 });
  bench('whole: loopwise analyze (and roundness and hull)', () => { analyze(small, 'dxf'); }, { iterations: 3, time: 0 });
  bench('dxf-parser parseSync (parse only)', () => { new DxfParser().parseSync(small); }, { iterations: 3, time: 0 });
});
