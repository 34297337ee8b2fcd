/** Opens the VS Code workbench served by code-server in headless Chromium. */
import { appendFileSync } from 'node:fs';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import type { CodeServer } from './codeServer';

/** Flags for Debian's Chromium in a container: no sandbox, no GPU, nothing that calls home. */
const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync',
];

export function launchBrowser(executablePath: string): Promise<Browser> {
  // launch() starts from a fresh temporary profile each time.
  return chromium.launch({ executablePath, args: CHROMIUM_ARGS, headless: true });
}

export interface WorkbenchOptions {
  readonly server: CodeServer;
  readonly folder: string;
  readonly extensionDevelopmentPath: string;
  /** Compiled test module the extension host runs; omit to just load the extension. */
  readonly extensionTestsPath?: string;
}

/**
 * The workbench URL. `payload` carries the extension-development arguments the desktop app would
 * take on its command line, as vscode-remote:// URIs on the server's authority.
 */
export function getWorkbenchUrl(options: WorkbenchOptions): string {
  const remote = (p: string) => `vscode-remote://${options.server.authority}${p}`;
  const payload: [string, string][] = [['extensionDevelopmentPath', remote(options.extensionDevelopmentPath)]];
  if (options.extensionTestsPath !== undefined) payload.push(['extensionTestsPath', remote(options.extensionTestsPath)]);
  const query = new URLSearchParams({ folder: options.folder, payload: JSON.stringify(payload) });
  return `${options.server.baseUrl}/?${query.toString()}`;
}

export interface OpenedPage {
  readonly context: BrowserContext;
  readonly page: Page;
}

/** A page in a fresh context whose console goes to `consoleLog`; `onLine` sees every console text. */
export async function openPage(browser: Browser, consoleLog: string, onLine?: (text: string) => void): Promise<OpenedPage> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
  const page = await context.newPage();
  page.on('console', (message) => {
    const text = message.text();
    appendFileSync(consoleLog, `[${message.type()}] ${text}\n`);
    onLine?.(text);
  });
  page.on('pageerror', (error) => appendFileSync(consoleLog, `[pageerror] ${error.stack ?? error.message}\n`));
  return { context, page };
}
