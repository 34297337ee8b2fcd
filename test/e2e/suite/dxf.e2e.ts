import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { getCode, getHoverText, getSymbols, openFixture, positionOf, revertAndClose, waitForDiagnostics, withCode } from './helpers';

// samples/fernhollow-lamp-panel-loose.dxf ($INSUNITS 4: 1 unit = 1 mm), figures from samples/README.md,
// worked by hand: the 120 × 80 mm panel edge with r 10 corners is four loose LINEs and four ARCs; the
// left LINE runs from (0, 70) to (0, 10.06), 0.06 mm short of the corner arc's end (0, 10).
//   drawn length  = 2(100 + 60) + 2π·10 − 0.06 = 320 + 62.832 − 0.06 = 382.772 mm
//   once closed:  perimeter 2(100 + 60) + 2π·10 = 382.832 mm; area 120·80 − (4 − π)·10² = 9514.159 mm²
//   window CIRCLE r 12: 2π·12 = 75.398 mm, π·12² = 452.389 mm²
const SAMPLE = 'samples/fernhollow-lamp-panel-loose.dxf';
/** The LINE entity that stops short (handle 11E), as its group lines read in the file. */
const SHORT_LINE = '0\nLINE\n5\n11E\n8\nCUT\n10\n0\n20\n70\n30\n0\n11\n0\n21\n10.06\n31\n0\n';

async function hoverText(document: vscode.TextDocument, needle: string): Promise<string> {
  const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', document.uri, positionOf(document, needle));
  return getHoverText(hovers ?? []);
}

describe('DXF', () => {
  it('opens the loose lamp panel as dxf and reports its 0.06 mm gap as near-closed on the LINE that stops short', async () => {
    const document = await openFixture(SAMPLE);
    assert.equal(document.languageId, 'dxf', 'the extension contributes the dxf language for .dxf files');
    const diagnostics = await waitForDiagnostics(document, 'near-closed and not-analysed', (ds) =>
      withCode(ds, 'near-closed').length === 1 && withCode(ds, 'not-analysed').length === 1);
    const [nearClosed] = withCode(diagnostics, 'near-closed');
    assert.match(nearClosed!.message, /\b0\.06 mm\b/);
    assert.equal(nearClosed!.severity, vscode.DiagnosticSeverity.Warning);
    assert.equal(document.getText(nearClosed!.range), SHORT_LINE);
    const [notAnalysed] = withCode(diagnostics, 'not-analysed');
    assert.match(notAnalysed!.message, /\bTEXT \(1 entity;/);
    assert.equal(notAnalysed!.severity, vscode.DiagnosticSeverity.Information);
    assert.deepEqual(diagnostics.filter((d) => d.source === 'loopwise').map(getCode).sort(), ['near-closed', 'not-analysed']);
  });

  it('shows the round window’s perimeter and area on hover over the CIRCLE', async () => {
    const document = await openFixture(SAMPLE);
    const text = await hoverText(document, '0\nCIRCLE\n5\n120\n');
    assert.match(text, /Perimeter\s*\|\s*75\.398 mm/, `hover text:\n${text}`);
    assert.match(text, /Area\s*\|\s*452\.389 mm²/, `hover text:\n${text}`);
  });

  it('lists the chained edge and the window as document symbols', async () => {
    const document = await openFixture(SAMPLE);
    const symbols = await getSymbols(document);
    assert.deepEqual(symbols.map((s) => s.name), ['Contour #0 — open (gap 0.06 mm), 382.772 mm', 'Contour #1 — closed, 75.398 mm']);
    assert.match(document.getText(symbols[1]!.range), /^0\nCIRCLE\n5\n120\n/);
  });

  it('closes the edge with its quick fix: 10.06 becomes 10 and the closed edge measures 382.832 mm and 9514.159 mm²', async () => {
    const document = await openFixture(SAMPLE);
    const before = document.getText();
    const diagnostics = await waitForDiagnostics(document, 'near-closed', (ds) => withCode(ds, 'near-closed').length === 1);
    const [nearClosed] = withCode(diagnostics, 'near-closed');
    const actions = await vscode.commands.executeCommand<(vscode.CodeAction | vscode.Command)[]>(
      'vscode.executeCodeActionProvider', document.uri, nearClosed!.range, vscode.CodeActionKind.QuickFix.value,
    );
    const fixes = (actions ?? []).filter((a): a is vscode.CodeAction => 'edit' in a && a.edit !== undefined);
    assert.equal(fixes.length, 1, `one quick fix (code actions: ${(actions ?? []).map((a) => a.title).join('; ') || 'none'})`);
    assert.equal(await vscode.workspace.applyEdit(fixes[0]!.edit!), true);
    try {
      // Only the LINE's end y changes: 21 / 10.06 → 21 / 10 (onto the arc's end at (0, 10)).
      assert.equal(document.getText(), before.replace(SHORT_LINE, SHORT_LINE.replace('21\n10.06\n', '21\n10\n')));
      await waitForDiagnostics(document, 'no near-closed or open-contour after the fix', (ds) =>
        withCode(ds, 'near-closed').length === 0 && withCode(ds, 'open-contour').length === 0);
      // The closed chain is one symbol now; hover where it points (the text of the chain's first entity).
      const symbols = await getSymbols(document);
      assert.deepEqual(symbols.map((s) => s.name), ['Contour #0 — closed, 382.832 mm', 'Contour #1 — closed, 75.398 mm']);
      const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', document.uri, symbols[0]!.selectionRange.start);
      const text = getHoverText(hovers ?? []);
      assert.match(text, /Perimeter\s*\|\s*382\.832 mm/, `hover text:\n${text}`);
      assert.match(text, /Area\s*\|\s*9514\.159 mm²/, `hover text:\n${text}`);
    } finally {
      await revertAndClose(document);
    }
  });
});
