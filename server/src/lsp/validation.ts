/**
 * When to analyse: per-document debounce, then one document at a time with a turn of the event loop
 * between documents, so requests (hovers, other files' edits) are served while many files wait.
 */

/** Delay after the last edit of a document before it is analysed; typing faster than this analyses once. */
export const VALIDATION_DELAY_MS = 200;

function yieldToEventLoop(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

export class ValidationQueue {
  private readonly timers = new Map<string, ReturnType<typeof setTimeout>>();
  private readonly due: string[] = [];
  private draining: Promise<void> | undefined;

  /** `validate` analyses one document and publishes; it must not throw (it is guarded by the caller). */
  constructor(private readonly validate: (uri: string) => Promise<void>) {}

  /** Analyses `uri` after `delayMs`, replacing any earlier pending run for it. */
  schedule(uri: string, delayMs: number = VALIDATION_DELAY_MS): void {
    this.cancel(uri);
    if (delayMs <= 0) {
      this.enqueue(uri);
      return;
    }
    this.timers.set(
      uri,
      setTimeout(() => {
        this.timers.delete(uri);
        this.enqueue(uri);
      }, delayMs),
    );
  }

  /** Drops a pending run for `uri` (the document closed). */
  cancel(uri: string): void {
    const timer = this.timers.get(uri);
    if (timer !== undefined) clearTimeout(timer);
    this.timers.delete(uri);
    const i = this.due.indexOf(uri);
    if (i >= 0) this.due.splice(i, 1);
  }

  /** Resolves when every document queued so far (not those still in their debounce delay) is done. */
  whenIdle(): Promise<void> {
    return this.draining ?? Promise.resolve();
  }

  private enqueue(uri: string): void {
    if (!this.due.includes(uri)) this.due.push(uri);
    // `due` is non-empty here, so drain() reaches its first await before its `finally` can run.
    this.draining ??= this.drain();
  }

  private async drain(): Promise<void> {
    try {
      for (let uri = this.due.shift(); uri !== undefined; uri = this.due.shift()) {
        await yieldToEventLoop();
        await this.validate(uri);
      }
    } finally {
      this.draining = undefined;
    }
  }
}
