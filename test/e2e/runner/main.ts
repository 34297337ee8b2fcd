/**
 * Runs the editor tests: the extension inside a real VS Code (code-server) in headless Chromium.
 *
 * 1. copies test/e2e/workspace and samples/ into a scratch workspace, starts code-server on a free
 *    loopback port with scratch user data;
 * 2. opens the workbench with the extension-development payload: VS Code's extension host loads
 *    out/e2e/suite.js, calls its run() and reports through window.codeAutomationExit(code, logs);
 * 3. opens the workbench again (extension loaded, no tests) and drives the UI scenarios;
 * 4. always stops the browser and code-server (and checks that nothing of theirs is left running,
 *    killing what is); on failure keeps screenshots and logs in
 *    test-results/e2e/; prints `e2e: N passed, N failed` and exits non-zero when anything failed.
 *
 * Expects `node scripts/e2e/build.mjs` to have built dist/ and out/e2e/ (npm run test:e2e does).
 */
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { startCodeServer, type CodeServer } from './codeServer';
import { ensureGroupsEnded, getChildGroups } from './processes';
import { UI_SCENARIOS, waitForWorkbench } from './ui';
import { getWorkbenchUrl, launchBrowser, openPage } from './workbench';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const RESULTS_DIR = path.join(ROOT, 'test-results/e2e');
const CODE_SERVER_DIR = process.env['LOOPWISE_CODE_SERVER_DIR'] ?? path.join(ROOT, '.cache/code-server');
const CHROMIUM = process.env['LOOPWISE_CHROMIUM'] ?? '/usr/bin/chromium';
/** The whole in-host suite; it ends as soon as the extension host reports. */
const SUITE_TIMEOUT_MS = 6 * 60_000;
const START_TIMEOUT_MS = 60_000;
const WORKBENCH_TIMEOUT_MS = 60_000;
const LINE_MARKER = '[loopwise-e2e] ';

interface SuiteSummary {
  readonly passed: number;
  readonly failed: number;
}

interface AutomationExit {
  readonly code: number;
  readonly logs: readonly { readonly relativePath: string; readonly contents: string }[];
}

const started = Date.now();
const elapsed = (): string => `${((Date.now() - started) / 1000).toFixed(1)} s`;
const say = (line: string): void => console.log(`e2e: ${line}`);

function keepLogs(exit: AutomationExit | undefined, dir: string): void {
  for (const log of exit?.logs ?? []) {
    const file = path.join(dir, 'workbench-logs', log.relativePath.replace(/\.\.(\/|\\)/g, ''));
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, log.contents);
  }
}

async function screenshot(page: Page, name: string): Promise<void> {
  const file = path.join(RESULTS_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true, timeout: 10_000 }).then(
    () => say(`screenshot kept: ${path.relative(ROOT, file)}`),
    (error: unknown) => say(`screenshot ${name} failed: ${error instanceof Error ? error.message : String(error)}`),
  );
}

/** Phase 2: runs the in-host suite and returns its counts (a suite that never reported counts as one failure). */
async function runInHostSuite(browser: Browser, server: CodeServer, workspace: string, scratch: string): Promise<SuiteSummary> {
  const resultsFile = path.join(scratch, 'suite-results.json');
  const { context, page } = await openPage(browser, path.join(scratch, 'console-suite.log'), (text) => {
    const at = text.indexOf(LINE_MARKER);
    if (at >= 0) console.log(text.slice(at + LINE_MARKER.length));
  });
  try {
    let report: (exit: AutomationExit) => void = () => undefined;
    const reported = new Promise<AutomationExit>((resolve) => { report = resolve; });
    await page.exposeFunction('__loopwiseAutomationExit', (code: number, logs: AutomationExit['logs']) => report({ code, logs: logs ?? [] }));
    await page.addInitScript(() => {
      (window as unknown as Record<string, unknown>)['codeAutomationExit'] = (code: number, logs: unknown) =>
        (window as unknown as { __loopwiseAutomationExit(c: number, l: unknown): Promise<void> }).__loopwiseAutomationExit(code, logs);
    });
    await page.goto(getWorkbenchUrl({
      server, folder: workspace, extensionDevelopmentPath: ROOT, extensionTestsPath: path.join(ROOT, 'out/e2e/suite.js'),
    }));
    let timer: NodeJS.Timeout | undefined;
    const outcome = await Promise.race([
      reported,
      server.exited.then((code) => new Error(`code-server exited with ${code} during the suite`)),
      new Promise<Error>((resolve) => { timer = setTimeout(() => resolve(new Error(`no result from the extension host within ${SUITE_TIMEOUT_MS / 1000} s`)), SUITE_TIMEOUT_MS); }),
    ]);
    clearTimeout(timer);
    const summary: SuiteSummary | undefined = existsSync(resultsFile) ? JSON.parse(readFileSync(resultsFile, 'utf8')) as SuiteSummary : undefined;
    if (outcome instanceof Error || outcome.code !== 0 || summary === undefined || summary.failed > 0) {
      say(outcome instanceof Error ? outcome.message : `extension host exit code ${outcome.code}`);
      await screenshot(page, 'in-host-suite');
      if (!(outcome instanceof Error)) keepLogs(outcome, RESULTS_DIR);
    }
    if (summary === undefined) return { passed: 0, failed: 1 };
    // A non-zero host exit with all tests passing (e.g. the module failed after them) still fails.
    if (!(outcome instanceof Error) && outcome.code !== 0 && summary.failed === 0) return { passed: summary.passed, failed: 1 };
    return { passed: summary.passed, failed: summary.failed };
  } finally {
    await context.close();
  }
}

/** Phase 3: the UI scenarios on a workbench with the extension loaded. */
async function runUiScenarios(browser: Browser, server: CodeServer, workspace: string, scratch: string): Promise<SuiteSummary> {
  const { context, page } = await openPage(browser, path.join(scratch, 'console-ui.log'));
  let passed = 0;
  let failed = 0;
  try {
    await page.goto(getWorkbenchUrl({ server, folder: workspace, extensionDevelopmentPath: ROOT }));
    await waitForWorkbench(page, 'ui-hover.svg', WORKBENCH_TIMEOUT_MS);
    for (const [i, scenario] of UI_SCENARIOS.entries()) {
      const t0 = Date.now();
      try {
        await scenario.run(page, { workspace });
        passed++;
        console.log(`  ✓ ui › ${scenario.title} (${Date.now() - t0} ms)`);
      } catch (error) {
        failed++;
        console.log(`  ✗ ui › ${scenario.title} (${Date.now() - t0} ms)`);
        console.log(`      ${(error instanceof Error ? error.message : String(error)).split('\n').join('\n      ')}`);
        await screenshot(page, `ui-${i + 1}`);
      }
      await page.keyboard.press('Escape');
    }
  } catch (error) {
    failed += UI_SCENARIOS.length - passed - failed;
    say(`the workbench for the UI scenarios did not come up: ${error instanceof Error ? error.message : String(error)}`);
    await screenshot(page, 'ui-workbench');
  } finally {
    await context.close();
  }
  console.log(`ui scenarios: ${passed} passed, ${failed} failed`);
  return { passed, failed };
}

async function main(): Promise<number> {
  rmSync(RESULTS_DIR, { recursive: true, force: true });
  mkdirSync(RESULTS_DIR, { recursive: true });
  for (const built of ['dist/client.js', 'dist/server.js', 'out/e2e/suite.js']) {
    if (!existsSync(path.join(ROOT, built))) throw new Error(`${built} is missing: run node scripts/e2e/build.mjs first`);
  }
  const scratch = mkdtempSync(path.join(os.tmpdir(), 'loopwise-e2e-'));
  const workspace = path.join(scratch, 'workspace');
  cpSync(path.join(ROOT, 'test/e2e/workspace'), workspace, { recursive: true });
  cpSync(path.join(ROOT, 'samples'), path.join(workspace, 'samples'), { recursive: true });

  let server: CodeServer | undefined;
  let browser: Browser | undefined;
  let total: SuiteSummary = { passed: 0, failed: 0 };
  /** Process groups of code-server and Chromium, checked after stopping so nothing is left running. */
  const groups = new Set<number>();
  const noteGroups = (): void => getChildGroups().forEach((g) => groups.add(g));
  const stopAll = async (): Promise<void> => {
    await browser?.close().catch(() => undefined);
    await server?.stop();
    const left = await ensureGroupsEnded(groups, 10_000);
    say(left.length === 0 ? 'browser and code-server stopped, nothing left running' : `killed what was left running: ${left.join(', ')}`);
  };
  const onSignal = (signal: NodeJS.Signals): void => {
    say(`${signal}: stopping the browser and code-server`);
    void stopAll().finally(() => process.exit(130));
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    server = await startCodeServer({
      installDir: CODE_SERVER_DIR, stateDir: scratch, folder: workspace,
      env: { LOOPWISE_E2E_RESULTS: path.join(scratch, 'suite-results.json') }, startTimeoutMs: START_TIMEOUT_MS,
    });
    noteGroups();
    say(`code-server ${server.baseUrl} up after ${elapsed()}`);
    browser = await launchBrowser(CHROMIUM);
    noteGroups();
    const suite = await runInHostSuite(browser, server, workspace, scratch);
    say(`in-host suite done after ${elapsed()}`);
    const ui = await runUiScenarios(browser, server, workspace, scratch);
    say(`UI scenarios done after ${elapsed()}`);
    total = { passed: suite.passed + ui.passed, failed: suite.failed + ui.failed };
  } catch (error) {
    say(`run aborted: ${error instanceof Error ? error.stack ?? error.message : String(error)}`);
    total = { passed: total.passed, failed: total.failed + 1 };
  } finally {
    await stopAll();
    if (total.failed > 0) {
      for (const log of ['code-server.log', 'console-suite.log', 'console-ui.log', 'suite-results.json']) {
        if (existsSync(path.join(scratch, log))) cpSync(path.join(scratch, log), path.join(RESULTS_DIR, log));
      }
      say(`logs and screenshots kept in ${path.relative(ROOT, RESULTS_DIR)}/`);
    }
    rmSync(scratch, { recursive: true, force: true });
  }
  say(`finished in ${elapsed()}`);
  console.log(`e2e: ${total.passed} passed, ${total.failed} failed`);
  return total.failed > 0 || total.passed === 0 ? 1 : 0;
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(error);
    console.log('e2e: 0 passed, 1 failed');
    process.exit(1);
  },
);
