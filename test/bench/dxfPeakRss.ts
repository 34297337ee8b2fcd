/**
 * Child process of dxf.bench.ts: reads the DXF file named by argv[2] (as the CLI does), analyses it
 * once and prints one JSON line with the process's peak RSS, so the figure is the analysis's alone
 * (the benchmark process also holds dxf-parser's objects). Bundled and run by dxf.bench.ts.
 */
import { readFileSync } from 'node:fs';
import { analyze } from '../../server/src/engine/index';

const text = readFileSync(process.argv[2]!, 'utf8');
const rssTextMb = process.memoryUsage().rss / 2 ** 20;
const t = performance.now();
const result = analyze(text, 'dxf');
const ms = performance.now() - t;
const peakRssMb = process.resourceUsage().maxRSS / 1024;
console.log(JSON.stringify({ textMb: text.length / 2 ** 20, rssTextMb, peakRssMb, ms, contours: result.contours.length }));
