import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { EXTENSION_ID, openFixture, waitForDiagnostics, withCode } from './helpers';

describe('the extension', () => {
  it('is installed from the development path and activates when an SVG is open', async () => {
    const extension = vscode.extensions.getExtension(EXTENSION_ID);
    assert.ok(extension, `${EXTENSION_ID} is loaded`);
    await openFixture('rectangle.svg');
    await extension.activate();
    assert.equal(extension.isActive, true);
  });

  it('registers the loopwise.reanalyze command, which runs without error', async () => {
    const commands = await vscode.commands.getCommands(true);
    assert.ok(commands.includes('loopwise.reanalyze'), 'loopwise.reanalyze is registered');
    const document = await openFixture('gaps.svg');
    await waitForDiagnostics(document, 'an open-contour finding', (ds) => withCode(ds, 'open-contour').length > 0);
    await vscode.commands.executeCommand('loopwise.reanalyze');
    // Re-analysing an unchanged file keeps its findings.
    await waitForDiagnostics(document, 'the open-contour finding after re-analysis', (ds) => withCode(ds, 'open-contour').length === 1);
  });
});
