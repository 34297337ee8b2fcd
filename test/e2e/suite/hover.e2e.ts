import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { getHoverText, openFixture, positionOf } from './helpers';

describe('hover', () => {
  it('shows the perimeter and area of a closed 20 mm × 10 mm rectangle over its path data', async () => {
    const document = await openFixture('rectangle.svg');
    // The extension is active (earlier test), so the language client has sent didOpen before this
    // request: the server answers from the document's current text.
    const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', document.uri, positionOf(document, 'H 30'));
    const text = getHoverText(hovers ?? []);
    // Rectangle perimeter 2(a+b) = 2(20 + 10) = 60 mm; area ab = 200 mm² (REFERENCES.md §2.3).
    assert.match(text, /Perimeter\s*\|\s*60 mm/, `hover text:\n${text}`);
    assert.match(text, /Area\s*\|\s*200 mm²/, `hover text:\n${text}`);
  });

  it('shows nothing outside any contour', async () => {
    const document = await openFixture('rectangle.svg');
    const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', document.uri, new vscode.Position(0, 1));
    assert.doesNotMatch(getHoverText(hovers ?? []), /Perimeter/);
  });
});
