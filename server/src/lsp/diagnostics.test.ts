import { DiagnosticSeverity } from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import type { Finding } from '../engine/index';
import { getFindingKey, isDiagnosticData, toDiagnostic, toDiagnosticSeverity } from './diagnostics';
import { spanOf } from './testing/fakeResult';

const text = '<svg>\n  <path d="M0 0 L10 0 L10 10"/>\n</svg>\n';
const doc = TextDocument.create('file:///a.svg', 'xml', 1, text);

function finding(fields: Partial<Finding>): Finding {
  return {
    checkId: 'open-contour',
    messageId: 'gap',
    span: spanOf(text, 'L10 10'),
    data: { gapMm: 14.142 },
    contour: 0,
    severity: 'error',
    message: 'Contour #0 is open: its end is 14.142 mm from its start.',
    ...fields,
  };
}

describe('toDiagnostic', () => {
  it('turns offsets into the line and UTF-16 character of the span', () => {
    // Counted in the literal: line 1 is `  <path d="M0 0 L10 0 L10 10"/>`; `L10 10` starts at column 22
    // (2 spaces + `<path` 5 + space + `d="` 3 = 11 for `M`, then `M0 0 ` 5 and `L10 0 ` 6).
    const d = toDiagnostic(finding({}), doc, { relatedInformation: false });
    expect(d.range).toEqual({ start: { line: 1, character: 22 }, end: { line: 1, character: 28 } });
  });

  it('counts an astral character before the span as two characters (LSP Position: UTF-16 code units by default)', () => {
    const emojiText = '<!-- 📐 --><path d="M0 0 L5 0"/>';
    const emojiDoc = TextDocument.create('file:///b.svg', 'xml', 1, emojiText);
    const span = spanOf(emojiText, 'L5 0');
    // "<!-- " (5) + 📐 (2 UTF-16 units) + " -->" (4) + '<path d="' (9) + 'M0 0 ' (5) = 25.
    expect(toDiagnostic(finding({ span }), emojiDoc, { relatedInformation: false }).range.start).toEqual({ line: 0, character: 25 });
  });

  it('names the check in code and source and keeps the message', () => {
    const d = toDiagnostic(finding({}), doc, { relatedInformation: false });
    expect(d.code).toBe('open-contour');
    expect(d.source).toBe('loopwise');
    expect(d.message).toBe('Contour #0 is open: its end is 14.142 mm from its start.');
    expect(d.codeDescription).toBeUndefined();
  });

  it('carries the check id and a key that does not depend on the message text', () => {
    const a = toDiagnostic(finding({}), doc, { relatedInformation: false });
    const b = toDiagnostic(finding({ message: 'reworded' }), doc, { relatedInformation: false });
    expect(a.data).toEqual({ checkId: 'open-contour', key: getFindingKey(finding({})) });
    expect(b.data).toEqual(a.data);
    expect(isDiagnosticData(a.data)).toBe(true);
  });

  it('gives different keys to findings of the same check at different places', () => {
    const other = finding({ span: spanOf(text, 'L10 0') });
    expect(getFindingKey(other)).not.toBe(getFindingKey(finding({})));
  });

  it('maps engine severities to LSP severities (LSP 3.17 DiagnosticSeverity: 1 error, 2 warning, 3 information)', () => {
    expect(toDiagnosticSeverity('error')).toBe(1);
    expect(toDiagnosticSeverity('warning')).toBe(2);
    expect(toDiagnosticSeverity('info')).toBe(3);
    expect(toDiagnostic(finding({ severity: 'warning' }), doc, { relatedInformation: false }).severity).toBe(DiagnosticSeverity.Warning);
  });

  it('adds related places only when the client shows them', () => {
    const related = [{ span: spanOf(text, 'M0 0'), message: 'Contour #0 starts here.' }];
    const withInfo = toDiagnostic(finding({ related }), doc, { relatedInformation: true });
    // `M0 0` starts at column 11 of line 1, counted in the literal.
    expect(withInfo.relatedInformation).toEqual([
      {
        location: { uri: 'file:///a.svg', range: { start: { line: 1, character: 11 }, end: { line: 1, character: 15 } } },
        message: 'Contour #0 starts here.',
      },
    ]);
    expect(toDiagnostic(finding({ related }), doc, { relatedInformation: false }).relatedInformation).toBeUndefined();
  });

  it('rejects data that is not a Loopwise payload', () => {
    expect(isDiagnosticData(undefined)).toBe(false);
    expect(isDiagnosticData({ checkId: 'open-contour' })).toBe(false);
    expect(isDiagnosticData('open-contour')).toBe(false);
  });
});
