/**
 * The analysers: worker-thread results equal the engine's own on the calling thread (the structured
 * clone keeps every figure), cancellation stops a run, and a worker that dies fails only its own job.
 * The worker is the bundled dist/analysisWorker.js, built by test/globalSetup.ts.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import { analyze, analyzeOutlines, DEFAULT_OPTIONS, getFormatForPath, toFigures, withShapes } from '../engine/index';
import type { FileFormat, OutlineFigures } from '../engine/index';
import { InlineAnalyser, runJob, WorkerAnalyser } from './analyser';
import type { JobOptions, JobReply } from './analyser';

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
      const outlines: OutlineFigures[] = [];
      expect(await analyser.analyse(text, format, jobOptions, never, (f) => outlines.push(f)), file).toEqual(toFigures(analyze(text, format, jobOptions)));
      expect(outlines, file).toEqual([toFigures(analyzeOutlines(text, format, jobOptions))]);
    }
  });

  it('hands over the findings before it has measured the roundness of a big contour', async () => {
    const analyser = createWorkerAnalyser();
    const events: string[] = [];
    const result = await analyser
      .analyse(bigSvg(100_000), 'svg', jobOptions, never, (f) => events.push(`outlines: ${f.contours.length} contour, ${f.findings.length} findings`))
      .then((r) => {
        events.push('complete');
        return r;
      });
    expect(events).toEqual(['outlines: 1 contour, 0 findings', 'complete']);
    // A regular 100 000-gon inscribed in r = 100 has R = 100 (handbook: circumradius of a regular
    // polygon); its vertices, rounded to 5 decimals, move by at most 0.71e-5.
    const r = result!.contours[0]!.geometry.roundness.circumradius.value!;
    expect(Math.abs(r.valueMm - 100)).toBeLessThanOrEqual(0.71e-5 + r.errorBoundMm);
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
    const outlines: OutlineFigures[] = [];
    expect(await analyser.analyse(SMALL, 'svg', jobOptions, never, (f) => outlines.push(f))).toEqual(toFigures(analyze(SMALL, 'svg', jobOptions)));
    expect(outlines).toEqual([toFigures(analyzeOutlines(SMALL, 'svg', jobOptions))]);
    expect(await analyser.analyse(SMALL, 'svg', jobOptions, () => true)).toBeUndefined();
  });

  it('stops before the shapes when the document changes after the findings', async () => {
    let outdated = false;
    const outlines: OutlineFigures[] = [];
    const result = await new InlineAnalyser().analyse(SMALL, 'svg', jobOptions, () => outdated, (f) => {
      outlines.push(f);
      outdated = true;
    });
    expect(result).toBeUndefined();
    expect(outlines).toHaveLength(1);
  });
});

describe('runJob (the worker side)', () => {
  const replies = (text: string, format: FileFormat, cancel: Int32Array, onReply: (r: JobReply) => void = () => {}) => {
    const out: JobReply[] = [];
    runJob({ id: 7, text, format, options: jobOptions, cancel }, (r) => {
      out.push(r);
      onReply(r);
    });
    return out;
  };

  it("posts the findings' figures, then the shapes that complete them to the engine's whole result", () => {
    const [outlines, done, ...more] = replies(SMALL, 'svg', new Int32Array(new SharedArrayBuffer(4)));
    expect(more).toEqual([]);
    if (outlines?.kind !== 'outlines' || done?.kind !== 'done') throw new Error(`unexpected replies ${outlines?.kind} ${done?.kind}`);
    expect(withShapes(outlines.result, done.shapes)).toEqual(toFigures(analyze(SMALL, 'svg', jobOptions)));
  });

  it('reports cancellation when the shared flag is raised, before or after the findings', () => {
    const cancel = new Int32Array(new SharedArrayBuffer(4));
    Atomics.store(cancel, 0, 1);
    expect(replies(SMALL, 'svg', cancel)).toEqual([{ id: 7, kind: 'cancelled' }]);
    const later = new Int32Array(new SharedArrayBuffer(4));
    expect(replies(SMALL, 'svg', later, () => Atomics.store(later, 0, 1)).map((r) => r.kind)).toEqual(['outlines', 'cancelled']);
  });

  it('reports an engine failure as a message instead of throwing', () => {
    const cancel = new Int32Array(new SharedArrayBuffer(4));
    // No reader exists for this format, so the engine throws: the worker must answer, not die.
    expect(replies(SMALL, 'pdf' as FileFormat, cancel)).toMatchObject([{ id: 7, kind: 'failed' }]);
  });
});
