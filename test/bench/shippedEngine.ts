/**
 * The engine as the language server and the CLI run it: one esbuild bundle of the sources (as
 * esbuild.mjs makes dist/), written to a temporary directory and imported. The benches time this
 * rather than the sources as vitest runs them: vitest's module runner reaches every import through a
 * getter on a module object, which costs the engine's many small calls across modules ~20 % (one
 * 1e4-line contour, 150 calls in one process: ~12 ms a call under vitest, ~10 ms bundled).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { buildSync } from 'esbuild';

type Engine = typeof import('./engineEntry');

const dir = mkdtempSync(join(tmpdir(), 'loopwise-bench-engine-'));
const outfile = join(dir, 'engine.mjs');
buildSync({
  entryPoints: [fileURLToPath(new URL('./engineEntry.ts', import.meta.url))],
  bundle: true, platform: 'node', target: 'node20', format: 'esm', outfile, logLevel: 'error',
});
const engine = (await import(pathToFileURL(outfile).href)) as Engine;
rmSync(dir, { recursive: true });

export const { analyze, analyzeOutlines, DEFAULT_OPTIONS, getFormatForPath, readDxf } = engine;
