import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { describe, it } from './harness';
import { findAt, openFixture, waitForDiagnostics } from './helpers';

async function setTolerance(valueMm: number | undefined): Promise<void> {
  await vscode.workspace.getConfiguration('loopwise').update('nearClosedToleranceMm', valueMm, vscode.ConfigurationTarget.Global);
}

describe('settings', () => {
  it('re-analyses when loopwise.nearClosedToleranceMm changes: a 0.5 mm gap turns near-closed at 1 mm and open again at 0.1 mm', async () => {
    const document = await openFixture('tolerance.svg');
    try {
      // Gap |10.5 − 10| = 0.5 mm (test/e2e/workspace/README.md); default tolerance 0.1 mm.
      await waitForDiagnostics(document, 'open-contour at "V 10.5" (tolerance 0.1 mm)', (ds) => findAt(document, ds, 'open-contour', 'V 10.5') !== undefined);
      await setTolerance(1);
      const relaxed = await waitForDiagnostics(document, 'near-closed at "V 10.5" (tolerance 1 mm)', (ds) =>
        findAt(document, ds, 'near-closed', 'V 10.5') !== undefined && findAt(document, ds, 'open-contour', 'V 10.5') === undefined);
      assert.match(findAt(document, relaxed, 'near-closed', 'V 10.5')!.message, /\b0\.5 mm\b/);
      await setTolerance(0.1);
      await waitForDiagnostics(document, 'open-contour at "V 10.5" again (tolerance 0.1 mm)', (ds) =>
        findAt(document, ds, 'open-contour', 'V 10.5') !== undefined && findAt(document, ds, 'near-closed', 'V 10.5') === undefined);
    } finally {
      await setTolerance(undefined);
    }
  });

  it('re-analyses when the tolerance shrinks below a gap: 0.05 mm turns open-contour at 0.01 mm', async () => {
    const document = await openFixture('gaps.svg');
    try {
      await waitForDiagnostics(document, 'near-closed at "V 10.05"', (ds) => findAt(document, ds, 'near-closed', 'V 10.05') !== undefined);
      await setTolerance(0.01);
      await waitForDiagnostics(document, 'open-contour at "V 10.05" (tolerance 0.01 mm)', (ds) =>
        findAt(document, ds, 'open-contour', 'V 10.05') !== undefined && findAt(document, ds, 'near-closed', 'V 10.05') === undefined);
    } finally {
      await setTolerance(undefined);
    }
    await waitForDiagnostics(document, 'near-closed at "V 10.05" after the setting is removed', (ds) => findAt(document, ds, 'near-closed', 'V 10.05') !== undefined);
  });
});
