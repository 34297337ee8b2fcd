import { CodeActionKind } from 'vscode-languageserver';
import type { TextEdit } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import type { Finding } from '../engine/index';
import { getCodeActions } from './codeActions';
import { toDiagnostic } from './diagnostics';
import { makeContour, makeResult, openGeometry, openMetrics, spanOf } from './testing/fakeResult';

const text = '<svg>\n<path d="M0 0H10V10H0V0.05"/>\n</svg>';
const doc = TextDocument.create('file:///c.svg', 'xml', 3, text);
const endSpan = spanOf(text, 'V0.05');
// The closing fix of REFERENCES.md §5.4: move the last point onto the start and add Z.
const fix = { title: 'Close contour #0', edits: [{ span: endSpan, newText: 'V0Z' }] };
const nearClosed: Finding = {
  checkId: 'near-closed',
  messageId: 'gap',
  span: endSpan,
  contour: 0,
  data: { gapMm: 0.05 },
  fixes: [fix],
  severity: 'warning',
  message: 'Contour #0 is not closed.',
};
const contour = { contour: makeContour({ span: spanOf(text, 'M0 0H10V10H0V0.05'), closed: false }), metrics: openMetrics(39.95, 0.05, [0, 0, 10, 10]),
  // Hull of its points: the 10 × 10 square (area 100, perimeter 40).
  geometry: openGeometry({ areaMm2: 100, perimeterMm: 40 }) };
const result = makeResult([contour], [nearClosed]);
const diagnostic = toDiagnostic(nearClosed, doc, { relatedInformation: false });

describe('getCodeActions', () => {
  it('offers the finding’s fix as the preferred quick fix for its diagnostic', () => {
    const [action, ...rest] = getCodeActions(result, doc, [diagnostic], { documentChanges: false });
    expect(rest).toEqual([]);
    expect(action).toMatchObject({ title: 'Close contour #0', kind: CodeActionKind.QuickFix, isPreferred: true, diagnostics: [diagnostic] });
    const edits = action?.edit?.changes?.['file:///c.svg'] as TextEdit[];
    expect(TextDocument.applyEdits(doc, edits)).toBe('<svg>\n<path d="M0 0H10V10H0V0Z"/>\n</svg>');
  });

  it('uses a versioned document edit when the client supports documentChanges', () => {
    const [action] = getCodeActions(result, doc, [diagnostic], { documentChanges: true });
    expect(action?.edit?.documentChanges).toEqual([
      // `V0.05` on line 1 after `<path d="` (9) and `M0 0H10V10H0` (12), counted in the literal.
      { textDocument: { uri: 'file:///c.svg', version: 3 }, edits: [{ range: { start: { line: 1, character: 21 }, end: { line: 1, character: 26 } }, newText: 'V0Z' }] },
    ]);
  });

  it('finds the finding by its key even when the client shows another message text', () => {
    const shown = { ...diagnostic, message: 'something else entirely' };
    expect(getCodeActions(result, doc, [shown], { documentChanges: false })).toHaveLength(1);
  });

  it('offers nothing for diagnostics of other sources or of findings that are gone', () => {
    const foreign = { ...diagnostic, source: 'xml' };
    const stale = { ...diagnostic, data: { checkId: 'near-closed', key: 'near-closed:gap:0:1:2' } };
    expect(getCodeActions(result, doc, [foreign, stale, { ...diagnostic, data: undefined }], { documentChanges: false })).toEqual([]);
  });

  it('offers nothing for a finding without fixes', () => {
    const withoutFix: Finding = { ...nearClosed, fixes: undefined };
    const d = toDiagnostic(withoutFix, doc, { relatedInformation: false });
    expect(getCodeActions(makeResult([contour], [withoutFix]), doc, [d], { documentChanges: false })).toEqual([]);
  });
});
