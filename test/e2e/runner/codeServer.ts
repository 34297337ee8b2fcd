/** Starts code-server (VS Code 1.100 served to a browser) on a free loopback port and stops it again. */
import { spawn, type ChildProcess } from 'node:child_process';
import { createWriteStream, existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import * as path from 'node:path';

export interface CodeServer {
  readonly host: string;
  readonly port: number;
  /** `HOST:PORT`, the remote authority of `vscode-remote://` URIs. */
  readonly authority: string;
  readonly baseUrl: string;
  readonly logFile: string;
  /** Resolves when the process has exited (for any reason). */
  readonly exited: Promise<number | null>;
  stop(): Promise<void>;
}

export interface CodeServerOptions {
  /** The unpacked code-server package (scripts/e2e/install.sh). */
  readonly installDir: string;
  /** Scratch folder for user data, extensions, config and the log. */
  readonly stateDir: string;
  readonly folder: string;
  /** Extra environment; the extension host inherits it. */
  readonly env: Readonly<Record<string, string>>;
  readonly startTimeoutMs: number;
}

/** User settings that keep prompts, tours and network look-ups out of the tests. */
const USER_SETTINGS = {
  'security.workspace.trust.enabled': false,
  'workbench.startupEditor': 'none',
  'workbench.welcomePage.walkthroughs.openOnInstall': false,
  'workbench.tips.enabled': false,
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'extensions.ignoreRecommendations': true,
  'telemetry.telemetryLevel': 'off',
  'update.mode': 'none',
  'chat.commandCenter.enabled': false,
  'editor.hover.delay': 200,
  'files.autoSave': 'off',
  // No backups of unsaved editors: a test that fails before reverting its edits must not hand a dirty
  // editor to the next window (the UI scenarios).
  'files.hotExit': 'off',
  // SVG files open as text (the built-in image preview would take them otherwise).
  'workbench.editorAssociations': { '*.svg': 'default' },
};

export async function getFreePort(host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, host, () => {
      const address = server.address();
      const port = typeof address === 'object' && address !== null ? address.port : 0;
      server.close(() => (port > 0 ? resolve(port) : reject(new Error('no free port'))));
    });
  });
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** Polls `url` until it answers 200, the process exits or the deadline passes. */
async function waitForHealth(url: string, exited: Promise<number | null>, timeoutMs: number): Promise<void> {
  let exitCode: number | null | undefined;
  void exited.then((code) => { exitCode = code; });
  const deadline = Date.now() + timeoutMs;
  let lastError = '';
  while (Date.now() < deadline) {
    if (exitCode !== undefined) throw new Error(`code-server exited with ${exitCode} before it answered`);
    try {
      const response = await fetch(url, { signal: AbortSignal.timeout(2_000) });
      if (response.ok) return;
      lastError = `HTTP ${response.status}`;
    } catch (error) {
      lastError = error instanceof Error ? error.message : String(error);
    }
    await delay(100);
  }
  throw new Error(`code-server did not answer ${url} within ${timeoutMs} ms (last: ${lastError})`);
}

export async function startCodeServer(options: CodeServerOptions): Promise<CodeServer> {
  const entry = path.join(options.installDir, 'out/node/entry.js');
  if (!existsSync(path.join(options.installDir, '.complete')) || !existsSync(entry)) {
    throw new Error(`code-server is not installed in ${options.installDir}: run scripts/e2e/install.sh`);
  }
  const host = '127.0.0.1';
  const port = await getFreePort(host);
  const userDataDir = path.join(options.stateDir, 'user-data');
  const extensionsDir = path.join(options.stateDir, 'extensions');
  const configFile = path.join(options.stateDir, 'config.yaml');
  const logFile = path.join(options.stateDir, 'code-server.log');
  mkdirSync(path.join(userDataDir, 'User'), { recursive: true });
  mkdirSync(extensionsDir, { recursive: true });
  writeFileSync(path.join(userDataDir, 'User', 'settings.json'), JSON.stringify(USER_SETTINGS, null, 2));
  writeFileSync(configFile, `bind-addr: ${host}:${port}\nauth: none\ncert: false\n`);

  const log = createWriteStream(logFile);
  const child: ChildProcess = spawn(process.execPath, [
    entry,
    '--auth', 'none',
    '--bind-addr', `${host}:${port}`,
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-workspace-trust',
    '--user-data-dir', userDataDir,
    '--extensions-dir', extensionsDir,
    '--config', configFile,
    options.folder,
  ], {
    env: { ...process.env, ...options.env },
    stdio: ['ignore', 'pipe', 'pipe'],
    // Its own process group, so stopping it also ends the extension host and the file watcher.
    detached: true,
  });
  child.stdout?.pipe(log, { end: false });
  child.stderr?.pipe(log, { end: false });
  const exited = new Promise<number | null>((resolve) => {
    child.once('exit', (code) => resolve(code));
    child.once('error', () => resolve(-1));
  });

  const signalGroup = (signal: NodeJS.Signals): void => {
    if (child.pid === undefined) return;
    try {
      process.kill(-child.pid, signal);
    } catch {
      // Already gone.
    }
  };
  let stopped: Promise<void> | undefined;
  const stop = (): Promise<void> => {
    stopped ??= (async () => {
      signalGroup('SIGTERM');
      const timer = setTimeout(() => signalGroup('SIGKILL'), 5_000);
      await exited;
      clearTimeout(timer);
      // Children that ignored SIGTERM (the extension host may linger) go too.
      signalGroup('SIGKILL');
      await new Promise<void>((resolve) => log.end(resolve));
    })();
    return stopped;
  };

  const authority = `${host}:${port}`;
  const baseUrl = `http://${authority}`;
  try {
    await waitForHealth(`${baseUrl}/healthz`, exited, options.startTimeoutMs);
  } catch (error) {
    await stop();
    throw error;
  }
  return { host, port, authority, baseUrl, logFile, exited, stop };
}
