/**
 * The server's two answers per analysis, in process: an analyser whose shapes (roundness and hull)
 * wait for a gate shows that the problems are published, and code actions and symbols answered, while
 * the shapes are still being measured, and that only a hover waits for them.
 */
import { PassThrough } from 'node:stream';
import { createConnection } from 'vscode-languageserver/node';
import {
  CodeActionRequest,
  createProtocolConnection,
  DidOpenTextDocumentNotification,
  DocumentSymbolRequest,
  HoverRequest,
  InitializedNotification,
  InitializeRequest,
  PublishDiagnosticsNotification,
  StreamMessageReader,
  StreamMessageWriter,
} from 'vscode-languageserver-protocol/node';
import type { ProtocolConnection, PublishDiagnosticsParams } from 'vscode-languageserver-protocol/node';
import { afterEach, describe, expect, it } from 'vitest';
import { analyzeOutlines, measureShapes, toFigures, withShapes } from '../engine/index';
import type { AnalysisFigures, FileFormat, OutlineFigures } from '../engine/index';
import type { Analyser, JobOptions } from './analyser';
import { startServer } from './server';

/** Runs the engine on this thread, but measures the shapes only once `open()` is called. */
class GatedAnalyser implements Analyser {
  private release: () => void = () => {};
  private readonly gate = new Promise<void>((resolve) => (this.release = resolve));
  shapesMeasured = false;

  open(): void {
    this.release();
  }

  async analyse(text: string, format: FileFormat, options: JobOptions, isOutdated: () => boolean, onOutlines?: (f: OutlineFigures) => void): Promise<AnalysisFigures | undefined> {
    const outlines = analyzeOutlines(text, format, { ...options, isCancelled: isOutdated });
    const figures = toFigures(outlines);
    onOutlines?.(figures);
    await this.gate;
    this.shapesMeasured = true;
    return withShapes(figures, measureShapes(outlines));
  }

  async dispose(): Promise<void> {}
}

// 10 × 20 mm rectangle (1 user unit = 1 mm: width="100mm" over viewBox 0 0 100 100, SVG 2 §8.2) and an open path.
const DRAWING = '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><path d="M 10 10 H 20 V 30 H 10 Z"/><path d="M 40 10 L 60 10 L 60 30"/></svg>';
const uri = 'file:///work/gated.svg';

let client: ProtocolConnection | undefined;
afterEach(() => {
  client?.dispose();
  client = undefined;
});

/** A client talking to a server started in this process on `analyser`, initialised. */
async function connect(analyser: Analyser): Promise<ProtocolConnection> {
  const up = new PassThrough(), down = new PassThrough();
  startServer(createConnection(new StreamMessageReader(up), new StreamMessageWriter(down)), analyser);
  client = createProtocolConnection(new StreamMessageReader(down), new StreamMessageWriter(up));
  client.listen();
  await client.sendRequest(InitializeRequest.type, {
    processId: null, rootUri: null, workspaceFolders: null,
    capabilities: { textDocument: { codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix'] } } } } },
  });
  await client.sendNotification(InitializedNotification.type, {});
  return client;
}

describe('the server publishes problems before the shapes are measured', () => {
  it('publishes, answers code actions and symbols with the shapes still pending, and answers the hover once they are measured', async () => {
    const analyser = new GatedAnalyser();
    const c = await connect(analyser);
    const published = new Promise<PublishDiagnosticsParams>((resolve) => c.onNotification(PublishDiagnosticsNotification.type, resolve));
    await c.sendNotification(DidOpenTextDocumentNotification.type, { textDocument: { uri, languageId: 'xml', version: 1, text: DRAWING } });
    const p = await published;
    expect(p.diagnostics.map((d) => d.code)).toEqual(['open-contour']);
    let hovered = false;
    const hover = c.sendRequest(HoverRequest.type, { textDocument: { uri }, position: { line: 0, character: DRAWING.indexOf('H 20') } }).then((h) => {
      hovered = true;
      return h;
    });
    const symbols = await c.sendRequest(DocumentSymbolRequest.type, { textDocument: { uri } });
    expect(symbols).toHaveLength(2);
    const actions = await c.sendRequest(CodeActionRequest.type, { textDocument: { uri }, range: p.diagnostics[0]!.range, context: { diagnostics: p.diagnostics } });
    expect(Array.isArray(actions)).toBe(true);
    expect(analyser.shapesMeasured).toBe(false);
    expect(hovered).toBe(false);
    analyser.open();
    const value = ((await hover)?.contents as { value: string }).value;
    expect(analyser.shapesMeasured).toBe(true);
    // The rectangle is its own hull: area ab = 200 mm², perimeter 2(a + b) = 60 mm.
    expect(value).toContain('Convex hull');
    expect(value).toMatch(/area 200 mm², perimeter 60 mm/);
  });
});
