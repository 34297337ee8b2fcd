/**
 * The language server from an independent client: plain JSON-RPC 2.0 over the server's stdio, with
 * the LSP base-protocol framing (`Content-Length: N\r\n\r\n` + N bytes of UTF-8 JSON) written and
 * parsed by hand in this file. No LSP or JSON-RPC library is used on the client side, so what passes
 * here is what any other editor (Neovim, Emacs, Helix, Sublime, …) can rely on.
 *
 * Protocol references: LSP 3.17 "Base Protocol" (header part, content part, UTF-8), "Position"
 * (UTF-16 code units by default), JSON-RPC 2.0 §5.1 (error code −32601, method not found).
 *
 * Figures: the drawing declares 1 user unit = 1 mm (width="100mm" over viewBox 0 0 100 100, SVG 2
 * §8.2 + viewBox scaling). `plate` is a 20 × 10 mm rectangle: perimeter 2(a+b) = 60 mm, area ab =
 * 200 mm². `tab` is a 20 × 10 mm rectangle whose last `V` stops at y = 10.05 instead of 10: gap
 * |10.05 − 10| = 0.05 mm (near-closed below the 0.1 mm default), drawn length 20 + 10 + 20 + 9.95 =
 * 59.95 mm.
 */
import { spawn } from 'node:child_process';
import type { ChildProcessWithoutNullStreams } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const serverPath = fileURLToPath(new URL('../dist/server.js', import.meta.url));
const DEADLINE_MS = 15_000;

// Line 1 starts with a comment holding a character outside the BMP (two UTF-16 code units, four
// UTF-8 bytes) and umlauts (two UTF-8 bytes each), so byte lengths, UTF-16 columns and code points differ.
const DRAWING = [
  '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">',
  '<!-- 🔩 Größe --><path id="plate" d="M 10 10 H 30 V 20 H 10 Z"/>',
  '<path id="tab" d="M 50 10 H 70 V 20 H 50 V 10.05"/>',
  '</svg>',
  '',
].join('\n');
const URI = 'file:///work/stdio%20drawing.svg';

interface Position { line: number; character: number }
interface Range { start: Position; end: Position }
interface Diagnostic { range: Range; code?: string | number; severity?: number; source?: string; message: string }
interface TextEdit { range: Range; newText: string }
type Json = Record<string, unknown>;

/** Line and UTF-16 column of `needle` (JavaScript string indices are UTF-16 code units). */
function positionOf(text: string, needle: string): Position {
  const offset = text.indexOf(needle);
  if (offset < 0) throw new Error(`'${needle}' is not in the text`);
  const before = text.slice(0, offset).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]!.length };
}

function rangeOf(text: string, needle: string): Range {
  const start = positionOf(text, needle);
  return { start, end: { line: start.line, character: start.character + needle.length } };
}

function offsetOf(text: string, p: Position): number {
  const lines = text.split('\n');
  let offset = 0;
  for (let i = 0; i < p.line; i++) offset += lines[i]!.length + 1;
  return offset + p.character;
}

/** Applies LSP text edits (non-overlapping) from the last to the first. */
function applyEdits(text: string, edits: readonly TextEdit[]): string {
  const sorted = [...edits].sort((a, b) => offsetOf(text, b.range.start) - offsetOf(text, a.range.start));
  let out = text;
  for (const e of sorted) out = out.slice(0, offsetOf(text, e.range.start)) + e.newText + out.slice(offsetOf(text, e.range.end));
  return out;
}

/** One framed message: header with the body's length in bytes, blank line, UTF-8 body. */
function frame(message: Json): Buffer {
  const body = Buffer.from(JSON.stringify(message), 'utf8');
  return Buffer.concat([Buffer.from(`Content-Length: ${body.length}\r\n\r\n`, 'ascii'), body]);
}

/** A minimal JSON-RPC client over a child's stdio, framing and parsing by hand. */
class RawClient {
  private buffer = Buffer.alloc(0);
  private nextId = 1;
  private readonly pending = new Map<number, { resolve: (m: Json) => void; reject: (e: Error) => void }>();
  private readonly listeners: ((m: Json) => void)[] = [];
  /** Every message the server sent, in order (for assertions and failure output). */
  readonly received: Json[] = [];
  /** Anything on stdout that was not a well-formed frame. */
  readonly garbage: string[] = [];
  readonly exited: Promise<number | null>;

  constructor(readonly child: ChildProcessWithoutNullStreams, private readonly answer: (method: string, params: unknown) => unknown) {
    child.stdout.on('data', (chunk: Buffer) => this.onData(chunk));
    this.exited = new Promise((resolve) => child.once('exit', (code) => resolve(code)));
  }

  private onData(chunk: Buffer): void {
    this.buffer = Buffer.concat([this.buffer, chunk]);
    for (;;) {
      const headerEnd = this.buffer.indexOf('\r\n\r\n');
      if (headerEnd < 0) return;
      const header = this.buffer.subarray(0, headerEnd).toString('ascii');
      const match = /^Content-Length: (\d+)$/im.exec(header);
      if (!match) {
        this.garbage.push(header);
        this.buffer = this.buffer.subarray(headerEnd + 4);
        continue;
      }
      const length = Number(match[1]);
      const start = headerEnd + 4;
      if (this.buffer.length < start + length) return;
      const body = this.buffer.subarray(start, start + length).toString('utf8');
      this.buffer = this.buffer.subarray(start + length);
      this.dispatch(JSON.parse(body) as Json);
    }
  }

  private dispatch(message: Json): void {
    this.received.push(message);
    expect(message['jsonrpc']).toBe('2.0');
    const id = message['id'];
    if ('method' in message && id !== undefined) {
      // A request from the server (workspace/configuration, client/registerCapability, …).
      this.write({ jsonrpc: '2.0', id, result: this.answer(String(message['method']), message['params']) ?? null });
      return;
    }
    if ('method' in message) {
      for (const listener of [...this.listeners]) listener(message);
      return;
    }
    const waiter = this.pending.get(Number(id));
    if (!waiter) return;
    this.pending.delete(Number(id));
    waiter.resolve(message);
  }

  /** Writes raw bytes, optionally in pieces (to check that the server reassembles split frames). */
  writeBytes(bytes: Buffer, cuts: readonly number[] = []): void {
    let from = 0;
    for (const cut of [...cuts, bytes.length]) {
      this.child.stdin.write(bytes.subarray(from, cut));
      from = cut;
    }
  }

  write(message: Json, cuts: readonly number[] = []): void {
    this.writeBytes(frame(message), cuts);
  }

  /** Sends a request and resolves with the whole response message (result or error). */
  request(method: string, params: unknown): Promise<Json> {
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`no response to ${method} within ${DEADLINE_MS} ms`)), DEADLINE_MS);
      this.pending.set(id, {
        resolve: (m) => { clearTimeout(timer); resolve(m); },
        reject,
      });
      this.write({ jsonrpc: '2.0', id, method, params });
    });
  }

  async result<T>(method: string, params: unknown): Promise<T> {
    const response = await this.request(method, params);
    if (response['error'] !== undefined) throw new Error(`${method} failed: ${JSON.stringify(response['error'])}`);
    return response['result'] as T;
  }

  notify(method: string, params: unknown, cuts: readonly number[] = []): void {
    this.write({ jsonrpc: '2.0', method, params }, cuts);
  }

  /** Resolves with the next notification `method` whose params satisfy `accept`. */
  nextNotification<T>(method: string, accept: (params: T) => boolean = () => true): Promise<T> {
    return new Promise((resolve, reject) => {
      const listener = (m: Json): void => {
        if (m['method'] !== method || !accept(m['params'] as T)) return;
        this.listeners.splice(this.listeners.indexOf(listener), 1);
        clearTimeout(timer);
        resolve(m['params'] as T);
      };
      const timer = setTimeout(() => {
        this.listeners.splice(this.listeners.indexOf(listener), 1);
        reject(new Error(`no ${method} within ${DEADLINE_MS} ms`));
      }, DEADLINE_MS);
      this.listeners.push(listener);
    });
  }
}

interface Published { uri: string; version?: number; diagnostics: Diagnostic[] }

let client: RawClient;
let stderr = '';
const serverRequests: string[] = [];

function published(version: number): Promise<Published> {
  return client.nextNotification<Published>('textDocument/publishDiagnostics', (p) => p.uri === URI && p.version === version);
}

beforeAll(async () => {
  const child = spawn(process.execPath, [serverPath, '--stdio'], { stdio: 'pipe' });
  child.stderr.on('data', (chunk: Buffer) => { stderr += chunk.toString('utf8'); });
  client = new RawClient(child, (method, params) => {
    serverRequests.push(method);
    // workspace/configuration: one (empty) settings object per item, so the defaults apply.
    if (method === 'workspace/configuration') return (params as { items: unknown[] }).items.map(() => ({}));
    return null;
  });
  const init = await client.result<{ capabilities: Json; serverInfo?: { name: string } }>('initialize', {
    processId: process.pid,
    clientInfo: { name: 'raw-json-rpc-test' },
    rootUri: null,
    workspaceFolders: null,
    capabilities: {
      workspace: { configuration: true },
      textDocument: {
        hover: { contentFormat: ['plaintext'] },
        codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix'] } } },
        documentSymbol: { hierarchicalDocumentSymbolSupport: true },
      },
    },
  });
  expect(init.serverInfo?.name).toBe('loopwise');
  expect(init.capabilities).toMatchObject({ hoverProvider: true, documentSymbolProvider: true, codeActionProvider: { codeActionKinds: ['quickfix'] } });
  client.notify('initialized', {});
});

afterAll(async () => {
  if (client.child.exitCode === null) client.child.kill();
  await client.exited;
});

describe('the language server over stdio, framed by hand', () => {
  let diagnostics: Diagnostic[] = [];

  it('publishes diagnostics for a document opened in a frame split mid-header and mid-character', async () => {
    const next = published(1);
    const bytes = frame({ jsonrpc: '2.0', method: 'textDocument/didOpen', params: { textDocument: { uri: URI, languageId: 'svg', version: 1, text: DRAWING } } });
    // Cut inside "Content-Length", and between the bytes of the 4-byte UTF-8 sequence of U+1F529.
    const emoji = bytes.indexOf(Buffer.from('🔩', 'utf8'));
    client.writeBytes(bytes, [7, emoji + 2]);
    ({ diagnostics } = await next);
    const nearClosed = diagnostics.filter((d) => d.code === 'near-closed');
    expect(nearClosed).toHaveLength(1);
    expect(nearClosed[0]).toMatchObject({ source: 'loopwise', severity: 2, range: rangeOf(DRAWING, 'V 10.05') });
    expect(nearClosed[0]!.message).toMatch(/\b0\.05 mm\b/);
    expect(diagnostics.filter((d) => d.code === 'open-contour')).toEqual([]);
  });

  it('answers hover with the rectangle’s figures, positions in UTF-16 code units after a non-BMP character', async () => {
    const position = positionOf(DRAWING, 'H 30');
    // '<!-- 🔩 Größe -->' is 5 + 2 + 1 + 5 + 4 = 17 UTF-16 code units (🔩 counts 2; 16 code points,
    // 22 UTF-8 bytes) and '<path id="plate" d="M 10 10 ' 28 more, so `H 30` starts at column 45.
    expect(position).toEqual({ line: 1, character: 45 });
    const hover = await client.result<{ contents: { kind: string; value: string }; range: Range } | null>('textDocument/hover', { textDocument: { uri: URI }, position });
    expect(hover?.contents.kind).toBe('plaintext');
    expect(hover?.contents.value).toMatch(/Perimeter: 60 mm/);
    expect(hover?.contents.value).toMatch(/Area: 200 mm²/);
    expect(hover?.range).toEqual(rangeOf(DRAWING, 'M 10 10 H 30 V 20 H 10 Z'));
  });

  it('lists one document symbol per contour', async () => {
    const symbols = await client.result<{ name: string; range: Range; selectionRange: Range }[]>('textDocument/documentSymbol', { textDocument: { uri: URI } });
    expect(symbols.map((s) => s.name)).toEqual(['Contour #0 — closed, 60 mm', 'Contour #1 — open (gap 0.05 mm), 59.95 mm']);
    expect(symbols[0]!.selectionRange).toEqual(rangeOf(DRAWING, 'M 10 10 H 30 V 20 H 10 Z'));
    expect(symbols[0]!.range).toEqual(rangeOf(DRAWING, '<path id="plate" d="M 10 10 H 30 V 20 H 10 Z"/>'));
  });

  it('offers the quick fix as plain text edits; applied by hand and sent back, the finding goes away', async () => {
    const [nearClosed] = diagnostics.filter((d) => d.code === 'near-closed');
    const actions = await client.result<{ title: string; kind: string; edit: { changes?: Record<string, TextEdit[]> } }[]>('textDocument/codeAction', {
      textDocument: { uri: URI }, range: nearClosed!.range, context: { diagnostics: [nearClosed] },
    });
    const fixes = actions.filter((a) => a.kind === 'quickfix');
    expect(fixes).toHaveLength(1);
    // No documentChanges capability was announced, so the edit comes as `changes`.
    const edits = fixes[0]!.edit.changes?.[URI];
    expect(edits).toBeDefined();
    const fixed = applyEdits(DRAWING, edits!);
    // The end moves onto the start (50, 10) and Z closes the path (SVG 2 Paths, "The closepath command").
    expect(/id="tab" d="([^"]*)"/.exec(fixed)?.[1]?.replace(/\s+/g, ' ')).toMatch(/^M 50 10 H 70 V 20 H 50 V ?10 ?Z$/);
    const next = published(2);
    client.notify('textDocument/didChange', { textDocument: { uri: URI, version: 2 }, contentChanges: [{ text: fixed }] });
    const after = await next;
    expect(after.diagnostics.filter((d) => d.code === 'near-closed' || d.code === 'open-contour')).toEqual([]);
  });

  it('answers an unknown request with JSON-RPC error −32601 and keeps serving', async () => {
    const response = await client.request('loopwise/noSuchMethod', {});
    expect((response['error'] as { code: number }).code).toBe(-32601);
    const symbols = await client.result<unknown[]>('textDocument/documentSymbol', { textDocument: { uri: URI } });
    expect(symbols).toHaveLength(2);
  });

  it('wrote nothing but frames to stdout and asked the client for its settings', () => {
    expect(client.garbage).toEqual([]);
    expect(serverRequests).toContain('workspace/configuration');
  });

  it('shuts down and exits with code 0', async () => {
    const response = await client.request('shutdown', null);
    expect(response).toMatchObject({ result: null });
    expect(response['error']).toBeUndefined();
    client.notify('exit', null);
    expect(await client.exited).toBe(0);
    expect(stderr).not.toMatch(/Error|exception/i);
  });
});
