/**
 * The analysers: worker-thread results equal the engine's own on the calling thread (the structured
 * clone keeps every figure), cancellation stops a run, and a worker that dies fails only its own job.
 * The worker is the bundled dist/analysisWorker.js, built by test/globalSetup.ts.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import { analyze, DEFAULT_OPTIONS, getFormatForPath, toFigures } from '../engine/index';
import type { FileFormat } from '../engine/index';
import { InlineAnalyser, runJob, WorkerAnalyser } from './analyser';
import type { JobOptions } from './analyser';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const workerPath = `${root}dist/analysisWorker.js`;
const { isCancelled: _unused, ...options } = DEFAULT_OPTIONS;
const jobOptions: JobOptions = options;
const never = () => false;

/** One closed polygon of n line segments around a circle of radius 100 (mm): a big file to analyse. */
function bigSvg(n: number): string {
  const parts = ['M100 0'];
  for (let k = 1; k < n; k++) {
    const a = (2 * Math.PI * k) / n;
    parts.push(`L${(100 * Math.cos(a)).toFixed(5)} ${(100 * Math.sin(a)).toFixed(5)}`);
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="-100 -100 200 200"><path d="${parts.join(' ')}Z"/></svg>`;
}

const SMALL = '<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm" viewBox="0 0 10 10"><path d="M0 0H5V5H0Z"/></svg>';

let analysers: WorkerAnalyser[] = [];
function createWorkerAnalyser(workers = 1, maxHeapMb = 512, cancelGraceMs = 60_000, onTerminated?: () => void): WorkerAnalyser {
  const a = new WorkerAnalyser({ workerPath, workers, maxHeapMb, cancelGraceMs, ...(onTerminated ? { onTerminated } : {}) });
  analysers.push(a);
  return a;
}

afterEach(async () => {
  await Promise.all(analysers.map((a) => a.dispose()));
  analysers = [];
});

describe('WorkerAnalyser', () => {
  it('returns exactly what the engine returns on this thread, for every sample', async () => {
    const analyser = createWorkerAnalyser();
    const dir = `${root}samples/`;
    const files = readdirSync(dir).filter((f) => getFormatForPath(f));
    expect(files.length).toBeGreaterThanOrEqual(9);
    for (const file of files) {
      const text = readFileSync(dir + file, 'utf8');
      const format = getFormatForPath(file)!;
      expect(await analyser.analyse(text, format, jobOptions, never), file).toEqual(toFigures(analyze(text, format, jobOptions)));
    }
  });

  it('stops a run whose document changed and stays usable', async () => {
    const analyser = createWorkerAnalyser();
    let outdated = false;
    const run = analyser.analyse(bigSvg(200_000), 'svg', jobOptions, () => outdated);
    setTimeout(() => (outdated = true), 10);
    expect(await run).toBeUndefined();
    const next = await analyser.analyse(SMALL, 'svg', jobOptions, never);
    // 5 × 5 mm square: area a² = 25 mm².
    expect(next?.contours[0]?.metrics.areaMm2).toEqual({ value: 25 });
  });

  it('terminates a worker whose outdated job runs on past the grace period, and runs the next job on a fresh one', async () => {
    let terminated = 0;
    const analyser = createWorkerAnalyser(1, 512, 0, () => terminated++);
    let outdated = false;
    // Reading 400 000 segments is one stage of well over 25 ms: the flag alone cannot stop it in time.
    const run = analyser.analyse(bigSvg(400_000), 'svg', jobOptions, () => outdated);
    setTimeout(() => (outdated = true), 10);
    expect(await run).toBeUndefined();
    expect(terminated).toBe(1);
    const next = await analyser.analyse(SMALL, 'svg', jobOptions, never);
    expect(next?.contours[0]?.metrics.areaMm2).toEqual({ value: 25 });
  });

  it('drops a waiting job that is already outdated without running it', async () => {
    const analyser = createWorkerAnalyser();
    expect(await analyser.analyse(SMALL, 'svg', jobOptions, () => true)).toBeUndefined();
  });

  it('finishes a small file on the second worker while a big one is still running', async () => {
    const analyser = createWorkerAnalyser(2);
    const order: string[] = [];
    const big = analyser.analyse(bigSvg(50_000), 'svg', jobOptions, never).then(() => order.push('big'));
    const small = analyser.analyse(SMALL, 'svg', jobOptions, never).then(() => order.push('small'));
    await Promise.all([big, small]);
    expect(order).toEqual(['small', 'big']);
  });

  it('fails only the job whose worker ran out of memory, then analyses the next file on a fresh worker', async () => {
    const analyser = createWorkerAnalyser(1, 8);
    await expect(analyser.analyse(bigSvg(400_000), 'svg', jobOptions, never)).rejects.toThrow();
    const next = await analyser.analyse(SMALL, 'svg', jobOptions, never);
    expect(next?.contours).toHaveLength(1);
  });

  it('answers nothing after it is disposed of', async () => {
    const analyser = createWorkerAnalyser();
    await analyser.dispose();
    await expect(analyser.analyse(SMALL, 'svg', jobOptions, never)).rejects.toThrow('disposed');
  });
});

describe('InlineAnalyser', () => {
  it('returns the engine result, or undefined once outdated', async () => {
    const analyser = new InlineAnalyser();
    expect(await analyser.analyse(SMALL, 'svg', jobOptions, never)).toEqual(toFigures(analyze(SMALL, 'svg', jobOptions)));
    expect(await analyser.analyse(SMALL, 'svg', jobOptions, () => true)).toBeUndefined();
  });
});

describe('runJob (the worker side)', () => {
  it('reports cancellation when the shared flag is raised', () => {
    const cancel = new Int32Array(new SharedArrayBuffer(4));
    Atomics.store(cancel, 0, 1);
    expect(runJob({ id: 7, text: SMALL, format: 'svg', options: jobOptions, cancel })).toEqual({ id: 7, kind: 'cancelled' });
  });

  it('reports an engine failure as a message instead of throwing', () => {
    const cancel = new Int32Array(new SharedArrayBuffer(4));
    // No reader exists for this format, so the engine throws: the worker must answer, not die.
    const reply = runJob({ id: 8, text: SMALL, format: 'pdf' as FileFormat, options: jobOptions, cancel });
    expect(reply).toMatchObject({ id: 8, kind: 'failed' });
  });
});
