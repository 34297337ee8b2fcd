import * as assert from 'node:assert/strict';
import { describe, it } from './harness';
import { getSymbols, openFixture, waitForDiagnostics, withCode } from './helpers';

describe('document symbols', () => {
  it('lists every contour of symbols.svg with its number, status and drawn length, selecting its own text', async () => {
    const document = await openFixture('symbols.svg');
    // The first publish means the server has read the file; the symbols come from the same analysis.
    await waitForDiagnostics(document, 'the open-contour finding of the open subpath', (ds) => withCode(ds, 'open-contour').length === 1);
    const symbols = await getSymbols(document);
    // Figures (test/e2e/workspace/README.md): frame 40 × 30 mm, 2(a+b) = 140 mm; slot 20 × 10 mm,
    // 2(a+b) = 60 mm; open subpath (60,40) → (80,40) → (80,45): drawn 20 + 5 = 25 mm, gap √(20² + 5²) = 20.616 mm.
    assert.deepEqual(symbols.map((s) => s.name), [
      'Contour #0 — closed, 140 mm',
      'Contour #1 — closed, 60 mm',
      'Contour #2 — open (gap 20.616 mm), 25 mm',
    ]);
    assert.deepEqual(symbols.map((s) => s.detail), ['rect #frame', 'path #slots', 'path #slots']);
    assert.deepEqual(symbols.map((s) => document.getText(s.selectionRange)), [
      '<rect id="frame" x="5" y="5" width="40" height="30" fill="none" stroke="black"/>',
      'M 60 10 H 80 V 20 H 60 Z',
      'M 60 40 H 80 V 45',
    ]);
    const pathTag = '<path id="slots" d="M 60 10 H 80 V 20 H 60 Z M 60 40 H 80 V 45" fill="none" stroke="black"/>';
    assert.deepEqual(symbols.map((s) => document.getText(s.range)), [
      '<rect id="frame" x="5" y="5" width="40" height="30" fill="none" stroke="black"/>', pathTag, pathTag,
    ]);
  });
});
