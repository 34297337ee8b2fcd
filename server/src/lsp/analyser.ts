/**
 * Where analyses run. The language server hands every analysis to an `Analyser`, so the protocol
 * thread is never blocked by a huge file: `WorkerAnalyser` runs the engine on worker threads (the
 * server's default), `InlineAnalyser` on the calling thread (tests, and environments without workers).
 *
 * Cancellation: the caller's `isOutdated` is polled on the protocol thread while a job runs; when it
 * turns true a shared flag is raised, and the engine in the worker sees it between its stages and stops.
 * A worker still busy with an outdated job after a grace period (a long reading stage of a huge file)
 * is terminated and replaced, so stale work never holds a core the current version needs.
 * A worker that dies (out of memory on a hostile file, a crash) fails only its own job and is replaced.
 */
import { Worker } from 'node:worker_threads';
import { AnalysisCancelled, analyzeOutlines, measureShapes, toFigures, withShapes } from '../engine/index';
import type { AnalysisFigures, AnalysisOptions, ContourShape, FileFormat, OutlineFigures } from '../engine/index';

/** Options for one analysis; `isCancelled` is the analyser's to supply. */
export type JobOptions = Omit<AnalysisOptions, 'isCancelled'>;

/** Gets an analysis's figures up to its findings, before its contours' roundness and hull are measured. */
export type OnOutlines = (figures: OutlineFigures) => void;

export interface Analyser {
  /**
   * The analysis without its segment geometry (see engine/figures.ts), or undefined when
   * `isOutdated()` turned true first. Rejects when the analysis failed. `onOutlines` gets the figures
   * up to the findings as soon as they are known, before the contours' roundness and hull are measured
   * (so the problems can be shown first).
   */
  analyse(text: string, format: FileFormat, options: JobOptions, isOutdated: () => boolean, onOutlines?: OnOutlines): Promise<AnalysisFigures | undefined>;
  dispose(): Promise<void>;
}

/** Runs the engine on the calling thread, with a turn of the event loop between the findings and the shapes. */
export class InlineAnalyser implements Analyser {
  async analyse(text: string, format: FileFormat, options: JobOptions, isOutdated: () => boolean, onOutlines?: OnOutlines): Promise<AnalysisFigures | undefined> {
    try {
      const outlines = analyzeOutlines(text, format, { ...options, isCancelled: isOutdated });
      const figures = toFigures(outlines);
      onOutlines?.(figures);
      await new Promise((resolve) => setImmediate(resolve));
      return withShapes(figures, measureShapes(outlines, isOutdated));
    } catch (error) {
      if (error instanceof AnalysisCancelled) return undefined;
      throw error;
    }
  }

  async dispose(): Promise<void> {}
}

/** Main thread → worker. `cancel` is an Int32Array over a SharedArrayBuffer: 1 means stop. */
export interface JobRequest {
  readonly id: number;
  readonly text: string;
  readonly format: FileFormat;
  readonly options: JobOptions;
  readonly cancel: Int32Array;
}

/** Worker → main thread: `outlines` first, then one of the others. */
export type JobReply =
  | { readonly id: number; readonly kind: 'outlines'; readonly result: OutlineFigures }
  | { readonly id: number; readonly kind: 'done'; readonly shapes: readonly ContourShape[] }
  | { readonly id: number; readonly kind: 'cancelled' }
  | { readonly id: number; readonly kind: 'failed'; readonly message: string };

/** How often a running job's `isOutdated` is polled on the protocol thread. */
export const CANCEL_POLL_MS = 25;

interface Job {
  readonly request: JobRequest;
  readonly isOutdated: () => boolean;
  readonly onOutlines: OnOutlines | undefined;
  /** The figures up to the findings, once the worker sent them. */
  outlines?: OutlineFigures;
  readonly resolve: (result: AnalysisFigures | undefined) => void;
  readonly reject: (error: Error) => void;
}

interface Slot {
  readonly worker: Worker;
  job: Job | undefined;
  poll: ReturnType<typeof setInterval> | undefined;
}

export interface WorkerAnalyserOptions {
  /** Path of the bundled worker entry (dist/analysisWorker.js). */
  readonly workerPath: string;
  /** Worker threads at most; jobs beyond them wait in order. */
  readonly workers: number;
  /** Heap limit of one worker in MB: a file that needs more fails alone instead of taking the server down. */
  readonly maxHeapMb: number;
  /** How long an outdated job may run on after its flag was raised before its worker is terminated. */
  readonly cancelGraceMs: number;
  /** Called when a worker was terminated because its outdated job did not stop in time. */
  readonly onTerminated?: () => void;
}

export class WorkerAnalyser implements Analyser {
  private readonly slots: Slot[] = [];
  private readonly waiting: Job[] = [];
  private nextId = 1;
  private disposed = false;

  constructor(private readonly options: WorkerAnalyserOptions) {}

  analyse(text: string, format: FileFormat, options: JobOptions, isOutdated: () => boolean, onOutlines?: OnOutlines): Promise<AnalysisFigures | undefined> {
    if (this.disposed) return Promise.reject(new Error('The analyser is disposed'));
    return new Promise((resolve, reject) => {
      const cancel = new Int32Array(new SharedArrayBuffer(4));
      this.waiting.push({ request: { id: this.nextId++, text, format, options, cancel }, isOutdated, onOutlines, resolve, reject });
      this.dispatch();
    });
  }

  async dispose(): Promise<void> {
    this.disposed = true;
    for (const job of this.waiting.splice(0)) job.resolve(undefined);
    await Promise.all(this.slots.splice(0).map((slot) => {
      this.finish(slot)?.resolve(undefined);
      return slot.worker.terminate();
    }));
  }

  /** Starts waiting jobs on idle workers, creating workers up to the limit. Outdated waiting jobs are dropped. */
  private dispatch(): void {
    while (this.waiting.length > 0) {
      const job = this.waiting[0]!;
      if (job.isOutdated()) {
        this.waiting.shift();
        job.resolve(undefined);
        continue;
      }
      const slot = this.slots.find((s) => !s.job) ?? (this.slots.length < this.options.workers ? this.createSlot() : undefined);
      if (!slot) return;
      this.waiting.shift();
      slot.job = job;
      let flaggedAt: number | undefined;
      slot.poll = setInterval(() => {
        if (flaggedAt === undefined) {
          if (!job.isOutdated()) return;
          Atomics.store(job.request.cancel, 0, 1);
          flaggedAt = performance.now();
        } else if (performance.now() - flaggedAt >= this.options.cancelGraceMs) {
          this.terminate(slot);
        }
      }, CANCEL_POLL_MS);
      slot.worker.postMessage(job.request);
    }
  }

  private createSlot(): Slot {
    const worker = new Worker(this.options.workerPath, { resourceLimits: { maxOldGenerationSizeMb: this.options.maxHeapMb } });
    const slot: Slot = { worker, job: undefined, poll: undefined };
    worker.on('message', (reply: JobReply) => {
      const job = slot.job;
      if (!job || job.request.id !== reply.id) return;
      if (reply.kind === 'outlines') {
        job.outlines = reply.result;
        job.onOutlines?.(reply.result);
        return;
      }
      this.finish(slot);
      if (reply.kind === 'done') {
        if (job.outlines) job.resolve(withShapes(job.outlines, reply.shapes));
        else job.reject(new Error('The analysis worker sent the shapes before the findings'));
      } else if (reply.kind === 'cancelled') job.resolve(undefined);
      else job.reject(new Error(reply.message));
      this.dispatch();
    });
    // A worker that dies takes only its job with it; the next job gets a fresh worker.
    const onDeath = (error: Error) => {
      const index = this.slots.indexOf(slot);
      if (index < 0) return;
      this.slots.splice(index, 1);
      this.finish(slot)?.reject(error);
      if (!this.disposed) this.dispatch();
    };
    worker.on('error', onDeath);
    worker.on('exit', (code) => onDeath(new Error(`The analysis worker stopped (exit code ${code}); the file may be too large to analyse.`)));
    this.slots.push(slot);
    return slot;
  }

  /** Stops a worker whose outdated job runs on: the job answers undefined, and the next job gets a fresh worker. */
  private terminate(slot: Slot): void {
    const index = this.slots.indexOf(slot);
    if (index < 0) return;
    this.slots.splice(index, 1);
    this.finish(slot)?.resolve(undefined);
    void slot.worker.terminate();
    this.options.onTerminated?.();
    this.dispatch();
  }

  /** Detaches the slot's job and stops polling it; returns the job. */
  private finish(slot: Slot): Job | undefined {
    const job = slot.job;
    if (slot.poll !== undefined) clearInterval(slot.poll);
    slot.job = undefined;
    slot.poll = undefined;
    return job;
  }
}

/** The worker side: answers one request with its outlines, then its shapes (the body of dist/analysisWorker.js). */
export function runJob(request: JobRequest, post: (reply: JobReply) => void): void {
  const { id } = request;
  const isCancelled = () => Atomics.load(request.cancel, 0) === 1;
  try {
    const outlines = analyzeOutlines(request.text, request.format, { ...request.options, isCancelled });
    post({ id, kind: 'outlines', result: toFigures(outlines) });
    post({ id, kind: 'done', shapes: measureShapes(outlines, isCancelled) });
  } catch (error) {
    if (error instanceof AnalysisCancelled) post({ id, kind: 'cancelled' });
    else post({ id, kind: 'failed', message: error instanceof Error ? `${error.message}\n${error.stack ?? ''}` : String(error) });
  }
}
