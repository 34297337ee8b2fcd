import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { findAt, getCode, openFixture, waitForDiagnostics, withCode } from './helpers';

// Fixtures: test/e2e/workspace/README.md (1 user unit = 1 mm; gaps worked out from the coordinates).
describe('diagnostics', () => {
  it('reports a 0.05 mm gap as near-closed on the command that ends the contour', async () => {
    const document = await openFixture('gaps.svg');
    const diagnostics = await waitForDiagnostics(document, 'near-closed at "V 10.05"', (ds) => findAt(document, ds, 'near-closed', 'V 10.05') !== undefined);
    const nearClosed = findAt(document, diagnostics, 'near-closed', 'V 10.05')!;
    // |10.05 − 10| = 0.05 mm, below the default tolerance of 0.1 mm (package.json contributes).
    assert.match(nearClosed.message, /\b0\.05 mm\b/);
    assert.equal(nearClosed.severity, vscode.DiagnosticSeverity.Warning);
    assert.equal(nearClosed.source, 'loopwise');
  });

  it('reports a 2 mm gap as open-contour with the gap in the message', async () => {
    const document = await openFixture('gaps.svg');
    const diagnostics = await waitForDiagnostics(document, 'open-contour at "V 52"', (ds) => findAt(document, ds, 'open-contour', 'V 52') !== undefined);
    const open = findAt(document, diagnostics, 'open-contour', 'V 52')!;
    // |52 − 50| = 2 mm.
    assert.match(open.message, /\b2 mm\b/);
    assert.equal(open.severity, vscode.DiagnosticSeverity.Error);
    // Each contour is reported once, under one id: the near-closed one is not also open.
    assert.equal(diagnostics.filter((d) => d.source === 'loopwise').length, 2);
  });

  it('reports the documented problems of the lamp-panel-draft sample', async () => {
    const document = await openFixture('samples/lamp-panel-draft.svg');
    // Expected figures: samples/README.md (worked out by hand from the drawing).
    const diagnostics = await waitForDiagnostics(document, 'near-closed, open-contour and zero-length-segment', (ds) =>
      ['near-closed', 'open-contour', 'zero-length-segment'].every((code) => ds.some((d) => getCode(d) === code)),
    );
    const [open] = withCode(diagnostics, 'open-contour');
    assert.ok(open);
    assert.match(open.message, /\b21\.633 mm\b/);
    const [nearClosedVent] = withCode(diagnostics, 'near-closed');
    assert.ok(nearClosedVent);
    assert.match(nearClosedVent.message, /\b0\.04 mm\b/);
  });
});
