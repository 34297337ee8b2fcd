import { SymbolKind } from 'vscode-languageserver';
import type { Range } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { analyze } from '../engine/index';
import { getDocumentSymbols, getSymbolName } from './symbols';
import { makeContour, openMetrics, rectangleMetrics, spanOf } from './testing/fakeResult';

const text = '<svg>\n<rect id="plate" width="10" height="20"/>\n<path id="hook" d="M0 0 L3 0 L3 4"/>\n</svg>';
const doc = TextDocument.create('file:///s.svg', 'xml', 1, text);
const rectSpan = spanOf(text, '<rect id="plate" width="10" height="20"/>');
const pathTag = spanOf(text, '<path id="hook" d="M0 0 L3 0 L3 4"/>');
const pathData = spanOf(text, 'M0 0 L3 0 L3 4');
// 10 × 20 mm rectangle: drawn length = perimeter 2(a+b) = 60 mm.
const rect = { contour: makeContour({ index: 0, span: rectSpan, element: 'rect', id: 'plate' }), metrics: rectangleMetrics(10, 20) };
// Open path (0,0) → (3,0) → (3,4): drawn length 3 + 4 = 7 mm; gap hypot(3, 4) = 5 mm (3-4-5 triangle).
const hook = {
  contour: makeContour({ index: 1, span: pathData, elementSpan: pathTag, closed: false, id: 'hook' }),
  metrics: openMetrics(7, 5, [0, 0, 3, 4]),
};

/** The text a range covers, counted by splitting lines (independent of TextDocument). */
function textAt(source: string, range: Range): string {
  const lines = source.split('\n');
  if (range.start.line === range.end.line) return lines[range.start.line]!.slice(range.start.character, range.end.character);
  return [
    lines[range.start.line]!.slice(range.start.character),
    ...lines.slice(range.start.line + 1, range.end.line),
    lines[range.end.line]!.slice(0, range.end.character),
  ].join('\n');
}

describe('getDocumentSymbols', () => {
  it('gives one symbol per contour, named with its 0-based number, status and drawn length', () => {
    const symbols = getDocumentSymbols([rect, hook], doc);
    expect(symbols.map((s) => s.name)).toEqual(['Contour #0 — closed, 60 mm', 'Contour #1 — open (gap 5 mm), 7 mm']);
    expect(symbols.map((s) => s.detail)).toEqual(['rect #plate', 'path #hook']);
    expect(symbols.every((s) => s.kind === SymbolKind.Object)).toBe(true);
  });

  it('spans the element and selects the contour’s own text', () => {
    const [r, h] = getDocumentSymbols([rect, hook], doc);
    // A shape element is both the element and the contour.
    expect(textAt(text, r!.range)).toBe('<rect id="plate" width="10" height="20"/>');
    expect(textAt(text, r!.selectionRange)).toBe('<rect id="plate" width="10" height="20"/>');
    // A path: the start tag, and the subpath's commands inside it (line 2, `M` after `<path id="hook" d="`, 19 characters).
    expect(textAt(text, h!.range)).toBe('<path id="hook" d="M0 0 L3 0 L3 4"/>');
    expect(h!.selectionRange).toEqual({ start: { line: 2, character: 19 }, end: { line: 2, character: 33 } });
  });

  it('says "closed (gap …)" for a contour closed within the tolerance', () => {
    const m = { ...rectangleMetrics(10, 20), gapMm: 0.02 };
    expect(getSymbolName({ contour: rect.contour, metrics: m })).toBe('Contour #0 — closed (gap 0.02 mm), 60 mm');
  });

  it('keeps the selection inside the range when the contour’s text lies elsewhere (a <use> instance)', () => {
    const use = spanOf(text, '<rect');
    const placed = { contour: makeContour({ index: 2, span: pathData, elementSpan: use }), metrics: rectangleMetrics(1, 1) };
    const [s] = getDocumentSymbols([placed], doc);
    expect(s!.range).toEqual(s!.selectionRange);
    expect(textAt(text, s!.range)).toBe('<rect');
  });

  it('returns no symbols for a file without contours', () => {
    expect(getDocumentSymbols([], doc)).toEqual([]);
  });
});

describe('getDocumentSymbols on analysed files', () => {
  /** Every selection range lies inside its range (LSP 3.17 DocumentSymbol; VS Code rejects the outline otherwise). */
  function expectNested(document: TextDocument, symbols: ReturnType<typeof getDocumentSymbols>): void {
    for (const s of symbols) {
      expect(document.offsetAt(s.range.start)).toBeLessThanOrEqual(document.offsetAt(s.selectionRange.start));
      expect(document.offsetAt(s.selectionRange.end)).toBeLessThanOrEqual(document.offsetAt(s.range.end));
    }
  }

  it('SVG: two subpaths of one path and a <use> of a rect', () => {
    const svg = [
      '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">',
      '<defs><rect id="r" width="2" height="3"/></defs>',
      '<path d="M 10 10 H 30 V 20 H 10 Z M 40 10 H 50"/>',
      '<use href="#r" x="60" y="60"/>',
      '</svg>',
    ].join('\n');
    const document = TextDocument.create('file:///a.svg', 'xml', 1, svg);
    const symbols = getDocumentSymbols(analyze(svg, 'svg').contours, document);
    // 1 user unit = 1 mm (width 100mm over viewBox 100). Rectangle 20 × 10: 2(20 + 10) = 60 mm;
    // the open subpath 40 → 50: 10 mm drawn, gap 10 mm; the used rect 2 × 3: 2(2 + 3) = 10 mm.
    expect(symbols.map((s) => s.name)).toEqual([
      'Contour #0 — closed, 60 mm',
      'Contour #1 — open (gap 10 mm), 10 mm',
      'Contour #2 — closed, 10 mm',
    ]);
    expect(symbols.map((s) => textAt(svg, s.selectionRange))).toEqual(['M 10 10 H 30 V 20 H 10 Z', 'M 40 10 H 50', '<use href="#r" x="60" y="60"/>']);
    expect(textAt(svg, symbols[0]!.range)).toBe('<path d="M 10 10 H 30 V 20 H 10 Z M 40 10 H 50"/>');
    expectNested(document, symbols);
  });

  it('DXF: a closed LWPOLYLINE spans its entity', () => {
    const dxf = [
      '0', 'SECTION', '2', 'ENTITIES',
      '0', 'LWPOLYLINE', '8', '0', '90', '4', '70', '1',
      '10', '0', '20', '0', '10', '20', '20', '0', '10', '20', '20', '10', '10', '0', '20', '10',
      '0', 'ENDSEC', '0', 'EOF', '',
    ].join('\n');
    const document = TextDocument.create('file:///a.dxf', 'dxf', 1, dxf);
    const symbols = getDocumentSymbols(analyze(dxf, 'dxf').contours, document);
    // 20 × 10 (mm assumed without $INSUNITS): 2(20 + 10) = 60 mm.
    expect(symbols.map((s) => s.name)).toEqual(['Contour #0 — closed, 60 mm']);
    expect(symbols[0]!.detail).toBe('LWPOLYLINE layer 0');
    // The entity: from its `0 LWPOLYLINE` group to the end of its last group, up to the next `0`.
    const entity = dxf.slice(dxf.indexOf('0\nLWPOLYLINE'), dxf.indexOf('0\nENDSEC'));
    expect(textAt(dxf, symbols[0]!.range)).toBe(entity);
    expect(textAt(dxf, symbols[0]!.selectionRange)).toBe(entity);
    expectNested(document, symbols);
  });
});
