/**
 * The language server as an editor sees it: the bundled dist/server.js (built by globalSetup) runs
 * as a real process over stdio, and this suite talks LSP to it with vscode-jsonrpc. Every wait is
 * on a notification or a response, never a fixed sleep.
 *
 * Figures: the test drawing declares 1 user unit = 1 mm (width="100mm" over viewBox 0 0 100 100,
 * SVG 2 §8.2 "The initial viewport" + viewBox scaling), so coordinates read as millimetres.
 */
import { spawn } from 'node:child_process';
import type { ChildProcessWithoutNullStreams } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter } from 'vscode-jsonrpc/node';
import type { MessageConnection } from 'vscode-jsonrpc/node';
import {
  CodeActionRequest,
  ConfigurationRequest,
  DidChangeConfigurationNotification,
  DidChangeTextDocumentNotification,
  DidCloseTextDocumentNotification,
  DidOpenTextDocumentNotification,
  ExitNotification,
  HoverRequest,
  InitializedNotification,
  InitializeRequest,
  LogMessageNotification,
  MessageType,
  PublishDiagnosticsNotification,
  ShutdownRequest,
} from 'vscode-languageserver-protocol';
import type { CodeAction, Diagnostic, LogMessageParams, Position, PublishDiagnosticsParams, TextEdit } from 'vscode-languageserver-protocol';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReanalyzeRequest } from '../server/src/lsp/protocol';

const serverPath = fileURLToPath(new URL('../dist/server.js', import.meta.url));

const DRAWING = [
  '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">',
  '  <path id="plate" d="M 10 10 H 20 V 30 H 10 Z"/>',
  '  <path id="hook" d="M 40 10 L 60 10 L 60 30"/>',
  '  <path id="tab" d="M 70 10 L 90 10 L 90 30 L 70 10.05"/>',
  '</svg>',
  '',
].join('\n');

/** Line and UTF-16 column of `needle`, counted by splitting the text into lines (independent of TextDocument). */
function positionOf(text: string, needle: string, from = 0): Position {
  const offset = text.indexOf(needle, from);
  if (offset < 0) throw new Error(`'${needle}' is not in the text`);
  const before = text.slice(0, offset).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]!.length };
}

function rangeOf(text: string, needle: string, from = 0) {
  const start = positionOf(text, needle, from);
  return { start, end: { line: start.line, character: start.character + needle.length } };
}

/** mulberry32 (Tommy Ettinger, public domain): a small seeded PRNG, so the random file is the same every run. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Session {
  child: ChildProcessWithoutNullStreams;
  connection: MessageConnection;
  logs: LogMessageParams[];
  settings: Record<string, unknown>;
  /** Resolves with the next diagnostics published for `uri` that satisfy `accept`. */
  nextDiagnostics(uri: string, accept?: (p: PublishDiagnosticsParams) => boolean): Promise<PublishDiagnosticsParams>;
}

function startSession(): Session {
  const child = spawn(process.execPath, [serverPath, '--stdio'], { stdio: 'pipe' });
  const connection = createMessageConnection(new StreamMessageReader(child.stdout), new StreamMessageWriter(child.stdin));
  const logs: LogMessageParams[] = [];
  const waiters: { uri: string; accept: (p: PublishDiagnosticsParams) => boolean; resolve: (p: PublishDiagnosticsParams) => void }[] = [];
  const session: Session = {
    child,
    connection,
    logs,
    settings: {},
    nextDiagnostics(uri, accept = () => true) {
      return new Promise((resolve) => waiters.push({ uri, accept, resolve }));
    },
  };
  connection.onNotification(PublishDiagnosticsNotification.type, (p) => {
    for (let i = waiters.length - 1; i >= 0; i--) {
      const w = waiters[i]!;
      if (w.uri === p.uri && w.accept(p)) {
        waiters.splice(i, 1);
        w.resolve(p);
      }
    }
  });
  connection.onNotification(LogMessageNotification.type, (p) => logs.push(p));
  connection.onRequest(ConfigurationRequest.type, (p) => p.items.map(() => session.settings));
  connection.listen();
  return session;
}

let s: Session;
const uri = 'file:///work/drawing.svg';

function open(docUri: string, text: string, version = 1): Promise<PublishDiagnosticsParams> {
  const published = s.nextDiagnostics(docUri, (p) => p.version === version || p.version === undefined);
  void s.connection.sendNotification(DidOpenTextDocumentNotification.type, {
    textDocument: { uri: docUri, languageId: 'xml', version, text },
  });
  return published;
}

function byCode(diagnostics: readonly Diagnostic[], code: string): Diagnostic[] {
  return diagnostics.filter((d) => d.code === code);
}

beforeAll(async () => {
  s = startSession();
  const init = await s.connection.sendRequest(InitializeRequest.type, {
    processId: process.pid,
    rootUri: null,
    workspaceFolders: null,
    capabilities: {
      workspace: { configuration: true, workspaceEdit: { documentChanges: true } },
      textDocument: {
        publishDiagnostics: { relatedInformation: true },
        hover: { contentFormat: ['markdown', 'plaintext'] },
        codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix'] } } },
      },
    },
  });
  expect(init.capabilities.hoverProvider).toBe(true);
  await s.connection.sendNotification(InitializedNotification.type, {});
});

afterAll(async () => {
  const exited = new Promise<number | null>((resolve) => s.child.once('exit', (code) => resolve(code)));
  await s.connection.sendRequest(ShutdownRequest.type);
  await s.connection.sendNotification(ExitNotification.type);
  // vscode-languageserver exits with 0 after shutdown + exit (LSP 3.17 "exit" notification).
  expect(await exited).toBe(0);
  s.connection.dispose();
});

describe('the language server over stdio', () => {
  let published: PublishDiagnosticsParams;

  beforeAll(async () => {
    published = await open(uri, DRAWING);
  });

  it('reports the open and the near-closed path at their last command, and nothing for the closed rectangle', () => {
    expect(published.version).toBe(1);
    const open = byCode(published.diagnostics, 'open-contour');
    const near = byCode(published.diagnostics, 'near-closed');
    expect(open).toHaveLength(1);
    expect(near).toHaveLength(1);
    // The checks report the contour's end span: the last drawing command in the d text.
    expect(open[0]!.range).toEqual(rangeOf(DRAWING, 'L 60 30'));
    expect(near[0]!.range).toEqual(rangeOf(DRAWING, 'L 70 10.05'));
    expect(open[0]!.source).toBe('loopwise');
    const plateLine = positionOf(DRAWING, 'id="plate"').line;
    expect(published.diagnostics.filter((d) => d.range.start.line === plateLine)).toEqual([]);
  });

  it('points the related information at the contour start', () => {
    const [near] = byCode(published.diagnostics, 'near-closed');
    expect(near!.relatedInformation?.map((r) => r.location.range)).toEqual([rangeOf(DRAWING, 'M 70 10')]);
  });

  it('shows the rectangle’s figures in a hover over its path data', async () => {
    const hover = await s.connection.sendRequest(HoverRequest.type, {
      textDocument: { uri },
      position: positionOf(DRAWING, 'V 30 H 10'),
    });
    expect(hover?.range).toEqual(rangeOf(DRAWING, 'M 10 10 H 20 V 30 H 10 Z'));
    const value = (hover?.contents as { value: string }).value;
    // 10 × 20 mm rectangle: rectangle perimeter 2(a+b) = 60 mm, rectangle area ab = 200 mm².
    expect(value).toContain('60 mm');
    expect(value).toContain('200 mm²');
    expect(value).toContain('plate');
    expect(value).not.toContain('NaN');
  });

  it('answers null for a hover outside every contour', async () => {
    const hover = await s.connection.sendRequest(HoverRequest.type, { textDocument: { uri }, position: { line: 0, character: 2 } });
    expect(hover).toBeNull();
  });

  it('closes the near-closed path with a quick fix that edits only that path’s d attribute', async () => {
    const [near] = byCode(published.diagnostics, 'near-closed');
    const actions = (await s.connection.sendRequest(CodeActionRequest.type, {
      textDocument: { uri },
      range: near!.range,
      context: { diagnostics: [near!] },
    })) as CodeAction[];
    expect(actions).toHaveLength(1);
    const [action] = actions;
    expect(action!.kind).toBe('quickfix');
    expect(action!.isPreferred).toBe(true);
    expect(action!.diagnostics).toEqual([near]);
    const change = action!.edit?.documentChanges?.[0] as { textDocument: { uri: string; version: number }; edits: TextEdit[] };
    expect(change.textDocument).toEqual({ uri, version: 1 });

    const fixed = TextDocument.applyEdits(TextDocument.create(uri, 'xml', 1, DRAWING), change.edits);
    // Everything outside the tab path's d value is byte-for-byte the same.
    const dStart = DRAWING.indexOf('M 70 10 L 90');
    const dEnd = DRAWING.indexOf('"', dStart);
    const suffix = DRAWING.slice(dEnd);
    expect(fixed.slice(0, dStart)).toBe(DRAWING.slice(0, dStart));
    expect(fixed.endsWith(suffix)).toBe(true);
    expect(fixed.slice(dStart, fixed.length - suffix.length)).toMatch(/[Zz]\s*$/);

    const republished = s.nextDiagnostics(uri, (p) => p.version === 2);
    await s.connection.sendNotification(DidChangeTextDocumentNotification.type, {
      textDocument: { uri, version: 2 },
      contentChanges: [{ text: fixed }],
    });
    const after = await republished;
    expect(byCode(after.diagnostics, 'near-closed')).toEqual([]);
    expect(byCode(after.diagnostics, 'open-contour')).toHaveLength(1);
  });

  it('publishes only for the latest version when edits come faster than the delay', async () => {
    const seen: (number | undefined)[] = [];
    const last = s.nextDiagnostics(uri, (p) => {
      seen.push(p.version);
      return p.version === 5;
    });
    for (const version of [3, 4, 5]) {
      await s.connection.sendNotification(DidChangeTextDocumentNotification.type, {
        textDocument: { uri, version },
        contentChanges: [{ text: DRAWING }],
      });
    }
    await last;
    expect(seen).toEqual([5]);
  });

  it('re-analyses open files with the new settings when the configuration changes', async () => {
    s.settings = { severity: { 'open-contour': 'off' }, nearClosedToleranceMm: 0.1 };
    const republished = s.nextDiagnostics(uri, (p) => byCode(p.diagnostics, 'open-contour').length === 0);
    await s.connection.sendNotification(DidChangeConfigurationNotification.type, { settings: { loopwise: s.settings } });
    const after = await republished;
    expect(byCode(after.diagnostics, 'near-closed')).toHaveLength(1);
    s.settings = {};
  });

  it('skips the DXF layers named in the ignoredLayers setting once the configuration changes', async () => {
    // An open LINE on layer ENGRAVE ($INSUNITS 4 = mm, DXF reference "HEADER section group codes").
    const dxfUri = 'file:///work/engrave.dxf';
    const text = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES',
      '0', 'LINE', '8', 'ENGRAVE', '10', '0', '20', '0', '11', '30', '21', '0', '0', 'ENDSEC', '0', 'EOF', ''].join('\n');
    const before = await open(dxfUri, text);
    expect(byCode(before.diagnostics, 'open-contour')).toHaveLength(1);
    s.settings = { ignoredLayers: ['engrave'] };
    const republished = s.nextDiagnostics(dxfUri, (p) => byCode(p.diagnostics, 'open-contour').length === 0);
    await s.connection.sendNotification(DidChangeConfigurationNotification.type, { settings: { loopwise: s.settings } });
    const after = await republished;
    expect(byCode(after.diagnostics, 'not-analysed').map((d) => d.message)).toEqual(['Layer ENGRAVE is ignored by the settings: 1 entity not analysed.']);
    s.settings = {};
    const restored = s.nextDiagnostics(dxfUri, (p) => byCode(p.diagnostics, 'open-contour').length === 1);
    await s.connection.sendNotification(DidChangeConfigurationNotification.type, { settings: { loopwise: s.settings } });
    await restored;
    await s.connection.sendNotification(DidCloseTextDocumentNotification.type, { textDocument: { uri: dxfUri } });
  });

  it('re-analyses every open file on request and counts their problems', async () => {
    const result = await s.connection.sendRequest(ReanalyzeRequest, {});
    expect(result).toEqual({ documents: 1, findings: 2 });
  });

  it('publishes no problems for files it does not read and clears them when a file closes', async () => {
    const notes = await open('file:///work/notes.txt', 'M 0 0 L 10 0');
    expect(notes.diagnostics).toEqual([]);
    const cleared = s.nextDiagnostics(uri);
    await s.connection.sendNotification(DidCloseTextDocumentNotification.type, { textDocument: { uri } });
    expect((await cleared).diagnostics).toEqual([]);
  });
});

describe('the language server on hostile input', () => {
  const random = mulberry32(20261202);
  const garbage = Array.from({ length: 4096 }, () => String.fromCharCode(Math.floor(random() * 0x10000))).join('');
  // 2 MiB of random printable ASCII and markup characters, so the reader sees many tags and numbers.
  const alphabet = '<>/="\' MmLlHhVvCcSsQqTtAaZz0123456789.-,e\n\tsvgpathd';
  const big = Array.from({ length: 2 * 1024 * 1024 }, () => alphabet[Math.floor(random() * alphabet.length)]).join('');
  // About 2 MiB of well-formed markup whose path data is random, so the path parser and the
  // measures see thousands of contours (the random text above stops at its first XML error).
  const pathAlphabet = 'MmLlHhVvCcSsQqTtAaZz0123456789.-, ';
  const paths: string[] = ['<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="0 0 200 200">'];
  for (let size = 0; size < 2 * 1024 * 1024; ) {
    const length = 20 + Math.floor(random() * 180);
    const d = 'M' + Array.from({ length }, () => pathAlphabet[Math.floor(random() * pathAlphabet.length)]).join('');
    const line = `<path d="${d}"/>`;
    paths.push(line);
    size += line.length + 1;
  }
  paths.push('</svg>');
  const inputs: [string, string][] = [
    ['file:///work/malformed.svg', '<svg width="10mm" height="10mm"><path d="M0 0 L10 0 L10 10"<<</svg <rect width=">'],
    ['file:///work/garbage.svg', garbage],
    ['file:///work/big-random.svg', big],
    ['file:///work/big-random-paths.svg', paths.join('\n')],
  ];

  it('answers for each file and still serves requests afterwards', async () => {
    for (const [docUri, text] of inputs) {
      const published = await open(docUri, text);
      expect(Array.isArray(published.diagnostics)).toBe(true);
    }
    const control = 'file:///work/control.svg';
    await open(control, DRAWING);
    const hover = await s.connection.sendRequest(HoverRequest.type, {
      textDocument: { uri: control },
      position: positionOf(DRAWING, 'H 20'),
    });
    expect((hover?.contents as { value: string }).value).toContain('60 mm'); // rectangle perimeter 2(a+b)
    expect(s.child.exitCode).toBeNull();
    expect(s.logs.filter((l) => l.type === MessageType.Error).map((l) => l.message)).toEqual([]);
  }, 60000);

  it('serves hovers on another file while a huge file is still being analysed', async () => {
    const control = 'file:///work/responsive-control.svg';
    await open(control, DRAWING);
    // One path of 400 000 line segments (about 9 MB): its analysis takes seconds, on a worker thread.
    const n = 400_000;
    const d = ['M100 0'];
    for (let k = 1; k < n; k++) d.push(`L${(100 * Math.cos((2 * Math.PI * k) / n)).toFixed(4)} ${(100 * Math.sin((2 * Math.PI * k) / n)).toFixed(4)}`);
    const huge = `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="-100 -100 200 200"><path d="${d.join(' ')}Z"/></svg>`;
    // Hover on the small file every 50 ms until the huge file's problems arrive. Analysed on the
    // protocol thread, one hover would wait for the whole analysis; on a worker, none waits long.
    let analysed = false;
    const started = performance.now();
    const hugePublished = open('file:///work/huge.svg', huge).then((p) => {
      analysed = true;
      return p;
    });
    const latencies: number[] = [];
    while (!analysed) {
      const t = performance.now();
      const hover = await s.connection.sendRequest(HoverRequest.type, { textDocument: { uri: control }, position: positionOf(DRAWING, 'H 20') });
      latencies.push(performance.now() - t);
      expect((hover?.contents as { value: string }).value).toContain('60 mm'); // rectangle perimeter 2(a+b)
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect((await hugePublished).diagnostics).toEqual([]);
    const total = performance.now() - started;
    expect(latencies.length).toBeGreaterThan(4);
    expect(Math.max(...latencies)).toBeLessThan(total / 2);
  }, 60000);

  it('publishes a huge file’s problems, and answers a hover sent with it once the hull is measured (worker replies joined)', async () => {
    // One open path of 300 000 line segments on a circle of radius 100 mm, the last ~1.2° missing.
    const n = 300_000, drawn = n - 1000;
    const d = ['M100 0'];
    for (let k = 1; k <= drawn; k++) d.push(`L${(100 * Math.cos((2 * Math.PI * k) / n)).toFixed(4)} ${(100 * Math.sin((2 * Math.PI * k) / n)).toFixed(4)}`);
    const text = `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="-100 -100 200 200"><path d="${d.join(' ')}"/></svg>`;
    const hugeUri = 'file:///work/huge-open.svg';
    const events: string[] = [];
    const published = open(hugeUri, text).then((p) => {
      events.push('diagnostics');
      return p;
    });
    // Asked at once, the hover waits for the same run as the diagnostics, up to the hull's figures.
    const hover = s.connection.sendRequest(HoverRequest.type, { textDocument: { uri: hugeUri }, position: positionOf(text, 'M100 0') }).then((h) => {
      events.push('hover');
      return h;
    });
    const [p, h] = await Promise.all([published, hover]);
    expect(events).toEqual(['diagnostics', 'hover']);
    expect(byCode(p.diagnostics, 'open-contour')).toHaveLength(1);
    // The hull of an arc of 358.8° on r = 100 is nearly the disc: perimeter just under 2π·100 ≈ 628.3 mm.
    const value = (h?.contents as { value: string }).value;
    expect(value).toContain('Convex hull');
    expect(value).toMatch(/perimeter 628\.\d+ mm/);
  }, 60000);
});
