import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { VALIDATION_DELAY_MS, ValidationQueue } from './validation';

describe('ValidationQueue', () => {
  beforeEach(() => {
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('analyses a document once after a burst of edits, when the delay has passed since the last one', async () => {
    const seen: string[] = [];
    const queue = new ValidationQueue(async (uri) => void seen.push(uri));
    queue.schedule('a');
    await vi.advanceTimersByTimeAsync(VALIDATION_DELAY_MS - 1);
    queue.schedule('a');
    await vi.advanceTimersByTimeAsync(VALIDATION_DELAY_MS - 1);
    expect(seen).toEqual([]);
    await vi.advanceTimersByTimeAsync(2);
    expect(seen).toEqual(['a']);
  });

  it('debounces each document on its own', async () => {
    const seen: string[] = [];
    const queue = new ValidationQueue(async (uri) => void seen.push(uri));
    queue.schedule('a');
    queue.schedule('b', 50);
    await vi.advanceTimersByTimeAsync(60);
    expect(seen).toEqual(['b']);
    await vi.advanceTimersByTimeAsync(VALIDATION_DELAY_MS);
    expect(seen).toEqual(['b', 'a']);
  });

  it('runs one document at a time and lets timers run between documents', async () => {
    const events: string[] = [];
    const queue = new ValidationQueue(async (uri) => {
      events.push(`start ${uri}`);
      await Promise.resolve();
      events.push(`end ${uri}`);
    });
    queue.schedule('a', 0);
    queue.schedule('b', 0);
    setTimeout(() => events.push('other work'), 0);
    await vi.advanceTimersByTimeAsync(10);
    await queue.whenIdle();
    expect(events).toEqual(['start a', 'end a', 'other work', 'start b', 'end b']);
  });

  it('drops a pending run when cancelled', async () => {
    const seen: string[] = [];
    const queue = new ValidationQueue(async (uri) => void seen.push(uri));
    queue.schedule('a');
    queue.cancel('a');
    await vi.advanceTimersByTimeAsync(VALIDATION_DELAY_MS * 2);
    expect(seen).toEqual([]);
  });
});
