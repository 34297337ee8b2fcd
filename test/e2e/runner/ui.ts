/**
 * UI scenarios: what a user sees in the workbench, driven through the page with Playwright after the
 * in-host suite. Each waits on what it looks for (Playwright's auto-waiting locators with a
 * deadline), never on fixed sleeps. Fixtures: test/e2e/workspace/README.md.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import type { Page } from 'playwright-core';

export interface UiContext {
  /** The scratch workspace folder code-server has open (files on disk). */
  readonly workspace: string;
}

export interface UiScenario {
  readonly title: string;
  run(page: Page, context: UiContext): Promise<void>;
}

const UI_TIMEOUT_MS = 30_000;

/** Waits until the workbench shows the workspace's files in the explorer. */
export async function waitForWorkbench(page: Page, fileName: string, timeoutMs: number): Promise<void> {
  await page.locator('.monaco-workbench').waitFor({ state: 'visible', timeout: timeoutMs });
  await page.locator('.explorer-folders-view .monaco-list-row', { hasText: fileName }).first().waitFor({ state: 'visible', timeout: timeoutMs });
}

/** Opens a workspace file through Quick Open (Ctrl+P), as a user would, and waits for its tab. */
async function openFile(page: Page, fileName: string): Promise<void> {
  await page.locator('.monaco-workbench').click({ position: { x: 700, y: 5 } }).catch(() => undefined);
  await page.keyboard.press('Control+P');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
  await input.fill(fileName);
  await page.locator('.quick-input-list .monaco-list-row', { hasText: fileName }).first().waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
  await page.keyboard.press('Enter');
  await page.locator('.tabs-container .tab.active', { hasText: fileName }).waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
}

/** Runs a command from the command palette (F1) by its title. */
async function runCommand(page: Page, title: string): Promise<void> {
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
  await input.fill(`>${title}`);
  await page.locator('.quick-input-list .monaco-list-row', { hasText: title }).first().waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
  await page.keyboard.press('Enter');
}

/** Moves the cursor to the first occurrence of `needle` in `text` (+ `delta`) with Go to Line (Ctrl+G, `:line:column`). */
async function goTo(page: Page, text: string, needle: string, delta = 0): Promise<void> {
  const offset = text.indexOf(needle);
  if (offset < 0) throw new Error(`"${needle}" is not in the file`);
  const lines = text.slice(0, offset + delta).split('\n');
  await page.keyboard.press('Control+G');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
  await input.fill(`:${lines.length}:${lines[lines.length - 1]!.length + 1}`);
  await page.keyboard.press('Enter');
  await input.waitFor({ state: 'hidden', timeout: UI_TIMEOUT_MS });
}

export const UI_SCENARIOS: readonly UiScenario[] = [
  {
    title: 'the Problems panel lists the open contour of ui-problems.svg with its 3 mm gap',
    async run(page) {
      await openFile(page, 'ui-problems.svg');
      await runCommand(page, 'View: Focus Problems');
      // Gap |13 − 10| = 3 mm (fixture README); the row carries the message and the check id.
      const row = page.locator('.markers-panel .monaco-list-row', { hasText: /is open: its end is 3 mm from its start/ });
      await row.first().waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      const text = await row.first().innerText();
      if (!text.includes('open-contour')) throw new Error(`the Problems row does not name open-contour: ${text}`);
    },
  },
  {
    title: 'hovering the path data of ui-hover.svg shows a card with the 120 mm perimeter',
    async run(page) {
      await openFile(page, 'ui-hover.svg');
      const editor = page.locator('.editor-instance .monaco-editor').first();
      await editor.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      // The token that holds the path data, inside the rendered line of the <path> element.
      const token = editor.locator('.view-line span span', { hasText: 'H 50' }).first();
      await token.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      const box = await token.boundingBox();
      if (!box) throw new Error('the path data is not on screen');
      const hover = page.locator('.monaco-hover:not(.hidden)', { hasText: 'Perimeter' });
      // Move onto the text (the card appears after editor.hover.delay); the deadline bounds the wait.
      await page.mouse.move(box.x + 2, box.y + box.height / 2);
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2, { steps: 5 });
      await hover.first().waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      // Rectangle perimeter 2(a+b) = 2(40 + 20) = 120 mm (REFERENCES.md §2.3).
      const text = await hover.first().innerText();
      if (!/Perimeter\s+120 mm/.test(text)) throw new Error(`the hover card does not show a 120 mm perimeter:\n${text}`);
    },
  },
  {
    title: 'a quick fix chosen from the light-bulb menu closes the contour of ui-quickfix.svg, and the saved file on disk holds the fix',
    async run(page, { workspace }) {
      const file = path.join(workspace, 'ui-quickfix.svg');
      const before = readFileSync(file, 'utf8');
      await openFile(page, 'ui-quickfix.svg');
      // The warning squiggle shows the near-closed finding has arrived (gap |10.04 − 10| = 0.04 mm).
      await page.locator('.editor-instance .squiggly-warning').first().waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      await goTo(page, before, 'V 10.04', 3);
      // The light bulb: a widget beside the code, or a glyph-margin decoration when the line starts with code.
      const bulb = page.locator('.editor-instance .lightBulbWidget:visible, .editor-instance .glyph-margin-widgets [class*="gutter-lightbulb"]').first();
      await bulb.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      await bulb.click();
      const item = page.locator('.action-widget .monaco-list-row', { hasText: /Close the contour/ }).first();
      await item.waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      // The menu lays a pointer block over the page until the mouse moves; move onto the item, then click it.
      const box = await item.boundingBox();
      if (!box) throw new Error('the quick-fix item is not on screen');
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2, { steps: 5 });
      await page.locator('.context-view-pointerBlock').waitFor({ state: 'detached', timeout: UI_TIMEOUT_MS });
      await item.click();
      // Applied: the tab turns dirty; save and wait until it is clean again, i.e. written to disk.
      await page.locator('.tabs-container .tab.active.dirty', { hasText: 'ui-quickfix.svg' }).waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      await page.keyboard.press('Control+S');
      await page.locator('.tabs-container .tab.active:not(.dirty)', { hasText: 'ui-quickfix.svg' }).waitFor({ state: 'visible', timeout: UI_TIMEOUT_MS });
      const after = readFileSync(file, 'utf8');
      // SVG 2 Paths, "The closepath command": the last point moves onto the start (10, 10) and Z closes
      // the path, so no 0.04 mm sliver is cut; nothing else in the file changes.
      const d = /id="door" d="([^"]*)"/.exec(after)?.[1] ?? '';
      if (!/^M 10 10 H 40 V 30 H 10 V 10 ?Z$/.test(d)) throw new Error(`the path data on disk is not closed onto its start: "${d}"`);
      if (after.replace(d, '@') !== before.replace('M 10 10 H 40 V 30 H 10 V 10.04', '@')) {
        throw new Error(`more than the path data changed on disk:\n${after}`);
      }
      // And the warning goes away.
      await page.locator('.editor-instance .squiggly-warning').first().waitFor({ state: 'detached', timeout: UI_TIMEOUT_MS });
    },
  },
];
