import * as assert from 'node:assert/strict';
import { makeAbsolute, parseSVG } from 'svg-path-parser';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { findAt, getPathData, openFixture, revertAndClose, waitForDiagnostics, withCode } from './helpers';

/** The path data as absolute commands with their end points, read by svg-path-parser (an independent parser). */
function readCommands(d: string): string[] {
  return makeAbsolute(parseSVG(d)).map((c) => (c.code === 'Z' ? 'Z' : `${c.code} ${c.x} ${c.y}`));
}

async function applyOnlyQuickFix(document: vscode.TextDocument, diagnostic: vscode.Diagnostic): Promise<vscode.CodeAction> {
  const actions = await vscode.commands.executeCommand<(vscode.CodeAction | vscode.Command)[]>(
    'vscode.executeCodeActionProvider', document.uri, diagnostic.range, vscode.CodeActionKind.QuickFix.value,
  );
  const all = actions ?? [];
  // The API command returns the actions for the range without their `diagnostics`, so they are told
  // apart by kind: the fixture has one finding, so one quick fix is expected at its range.
  const fixes = all.filter((a): a is vscode.CodeAction => 'edit' in a && a.edit !== undefined
    && a.kind !== undefined && vscode.CodeActionKind.QuickFix.contains(a.kind));
  const titles = all.map((a) => a.title).join('; ');
  assert.equal(fixes.length, 1, `one quick fix for "${diagnostic.message}" (code actions: ${titles || 'none'})`);
  const fix = fixes[0]!;
  assert.equal(await vscode.workspace.applyEdit(fix.edit!), true, 'the edit applies');
  return fix;
}

describe('quick fix', () => {
  it('closes a near-closed contour: the end moves onto the start, Z is added, the finding goes away', async () => {
    const document = await openFixture('fix-near-closed.svg');
    const before = document.getText();
    const diagnostics = await waitForDiagnostics(document, 'near-closed at "V 10.05"', (ds) => findAt(document, ds, 'near-closed', 'V 10.05') !== undefined);
    await applyOnlyQuickFix(document, findAt(document, diagnostics, 'near-closed', 'V 10.05')!);

    const after = document.getText();
    // Only the path data changes.
    const d = getPathData(after, 'lid');
    assert.equal(after.replace(d, '@'), before.replace(getPathData(before, 'lid'), '@'));
    // SVG 2 Paths, "The closepath command": Z closes the subpath back to its start (10, 10); the last
    // drawn point must be the start itself, so no 0.05 mm sliver is cut.
    assert.deepEqual(readCommands(d), ['M 10 10', 'H 30 10', 'V 30 20', 'H 10 20', 'V 10 10', 'Z']);

    await waitForDiagnostics(document, 'no near-closed or open-contour finding after the fix', (ds) =>
      withCode(ds, 'near-closed').length === 0 && withCode(ds, 'open-contour').length === 0);
    await revertAndClose(document);
  });

  it('closes a contour that ends exactly on its start by adding Z', async () => {
    const document = await openFixture('fix-touching.svg');
    const diagnostics = await waitForDiagnostics(document, 'near-closed at "V 10"', (ds) => findAt(document, ds, 'near-closed', 'V 10') !== undefined);
    await applyOnlyQuickFix(document, findAt(document, diagnostics, 'near-closed', 'V 10')!);
    const d = getPathData(document.getText(), 'lid');
    // The drawn points stay as they were (SVG 2 Paths: Z adds the closing segment, here of length 0).
    assert.deepEqual(readCommands(d), ['M 10 10', 'H 30 10', 'V 30 20', 'H 10 20', 'V 10 10', 'Z']);
    assert.equal(d.replace(/\s*Z$/, ''), 'M 10 10 H 30 V 20 H 10 V 10');
    await waitForDiagnostics(document, 'no near-closed finding after the fix', (ds) => withCode(ds, 'near-closed').length === 0);
    await revertAndClose(document);
  });
});
