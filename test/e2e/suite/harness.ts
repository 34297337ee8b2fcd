/**
 * A small mocha-style runner for the in-host suite: `describe`/`it` register tests, `runAll` runs
 * them one after the other with a per-test timeout, prints each result and a summary, and returns
 * the counts. (vitest runs its own workers, so it cannot run inside VS Code's extension host.)
 */

export type TestBody = () => Promise<void> | void;

interface TestCase {
  readonly title: string;
  readonly body: TestBody;
  readonly timeoutMs: number;
}

export interface TestOutcome {
  readonly title: string;
  readonly passed: boolean;
  readonly durationMs: number;
  readonly error?: string;
}

export interface RunSummary {
  readonly passed: number;
  readonly failed: number;
  readonly outcomes: readonly TestOutcome[];
}

/** Default timeout of one test: generous, since a test ends as soon as its condition holds. */
export const DEFAULT_TEST_TIMEOUT_MS = 60_000;

const tests: TestCase[] = [];
const prefixes: string[] = [];

/** Groups tests; titles are joined with ' › '. */
export function describe(title: string, body: () => void): void {
  prefixes.push(title);
  try {
    body();
  } finally {
    prefixes.pop();
  }
}

export function it(title: string, body: TestBody, timeoutMs = DEFAULT_TEST_TIMEOUT_MS): void {
  tests.push({ title: [...prefixes, title].join(' › '), body, timeoutMs });
}

function withTimeout(body: TestBody, timeoutMs: number): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`timed out after ${timeoutMs} ms`)), timeoutMs);
    Promise.resolve()
      .then(body)
      .then(
        () => { clearTimeout(timer); resolve(); },
        (error: unknown) => { clearTimeout(timer); reject(error); },
      );
  });
}

function describeError(error: unknown): string {
  if (error instanceof Error) return error.stack ?? `${error.name}: ${error.message}`;
  return String(error);
}

/**
 * Runs every registered test in order; `print` receives one line per test and the summary.
 * `afterFailure` runs after each failed test (a failed test skips its own clean-up, e.g. reverting
 * an edit, and must not leave that state to the tests after it); its own failure is printed.
 */
export async function runAll(print: (line: string) => void, afterFailure?: () => Promise<void>): Promise<RunSummary> {
  const outcomes: TestOutcome[] = [];
  for (const test of tests) {
    const started = Date.now();
    try {
      await withTimeout(test.body, test.timeoutMs);
      const durationMs = Date.now() - started;
      outcomes.push({ title: test.title, passed: true, durationMs });
      print(`  ✓ ${test.title} (${durationMs} ms)`);
    } catch (error) {
      const durationMs = Date.now() - started;
      const text = describeError(error);
      outcomes.push({ title: test.title, passed: false, durationMs, error: text });
      print(`  ✗ ${test.title} (${durationMs} ms)`);
      for (const line of text.split('\n')) print(`      ${line}`);
      if (afterFailure) {
        await withTimeout(afterFailure, DEFAULT_TEST_TIMEOUT_MS).catch((cleanupError: unknown) =>
          print(`      (clean-up after the failure failed: ${describeError(cleanupError).split('\n')[0]})`));
      }
    }
  }
  const passed = outcomes.filter((o) => o.passed).length;
  const failed = outcomes.length - passed;
  print(`in-host suite: ${passed} passed, ${failed} failed`);
  return { passed, failed, outcomes };
}
