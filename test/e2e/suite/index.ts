/**
 * Entry point of the in-host suite: VS Code's extension host loads this module (`extensionTestsPath`)
 * and calls `run()`. It runs the tests in order, prints each result, writes a JSON summary to
 * `LOOPWISE_E2E_RESULTS` when set (the runner reads the counts from it) and rejects when any test
 * failed, which makes the host report a non-zero exit code.
 */
import { writeFileSync } from 'node:fs';
import { runAll } from './harness';
import { resetEditors } from './helpers';
import './extension.e2e';
import './diagnostics.e2e';
import './hover.e2e';
import './quickFix.e2e';
import './settings.e2e';
import './symbols.e2e';
import './dxf.e2e';

/** Marks the suite's own lines in the forwarded extension-host console, so the runner can echo them. */
export const LINE_MARKER = '[loopwise-e2e] ';

export async function run(): Promise<void> {
  const summary = await runAll((line) => console.log(LINE_MARKER + line), resetEditors);
  const resultsFile = process.env['LOOPWISE_E2E_RESULTS'];
  if (resultsFile) writeFileSync(resultsFile, JSON.stringify(summary, null, 2));
  if (summary.failed > 0) throw new Error(`${summary.failed} of ${summary.outcomes.length} in-host tests failed`);
}
