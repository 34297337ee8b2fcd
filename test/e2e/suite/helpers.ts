/** Helpers for the in-host tests: open fixtures, wait on editor events with a deadline, read results. */
import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';

/** How long to wait for the language server to publish after a change (ends as soon as it does). */
export const PUBLISH_TIMEOUT_MS = 30_000;

export const EXTENSION_ID = 'loopwise.loopwise';

export function getFixtureUri(name: string): vscode.Uri {
  const folder = vscode.workspace.workspaceFolders?.[0];
  assert.ok(folder, 'the test workspace folder is open');
  return vscode.Uri.joinPath(folder.uri, name);
}

export async function openFixture(name: string): Promise<vscode.TextDocument> {
  const document = await vscode.workspace.openTextDocument(getFixtureUri(name));
  await vscode.window.showTextDocument(document, { preview: false });
  return document;
}

/** The diagnostic's code as a string, whether or not it carries a documentation link. */
export function getCode(diagnostic: vscode.Diagnostic): string {
  const { code } = diagnostic;
  if (code === undefined) return '';
  return typeof code === 'object' ? String(code.value) : String(code);
}

function describeDiagnostics(document: vscode.TextDocument, diagnostics: readonly vscode.Diagnostic[]): string {
  if (diagnostics.length === 0) return '(none)';
  return diagnostics
    .map((d) => `${getCode(d)} at "${document.getText(d.range)}" ${d.range.start.line + 1}:${d.range.start.character + 1}: ${d.message}`)
    .join('\n        ');
}

/**
 * Resolves with the document's diagnostics once `predicate` holds for them: checks now, then on
 * every `languages.onDidChangeDiagnostics` for the document, until `timeoutMs` has passed.
 */
export function waitForDiagnostics(
  document: vscode.TextDocument,
  what: string,
  predicate: (diagnostics: readonly vscode.Diagnostic[]) => boolean,
  timeoutMs = PUBLISH_TIMEOUT_MS,
): Promise<vscode.Diagnostic[]> {
  const uri = document.uri.toString();
  return new Promise((resolve, reject) => {
    let settled = false;
    const check = (): void => {
      if (settled) return;
      const current = vscode.languages.getDiagnostics(document.uri);
      if (!predicate(current)) return;
      settled = true;
      clearTimeout(timer);
      subscription.dispose();
      resolve(current);
    };
    const subscription = vscode.languages.onDidChangeDiagnostics((event) => {
      if (event.uris.some((u) => u.toString() === uri)) check();
    });
    const timer = setTimeout(() => {
      if (settled) return;
      settled = true;
      subscription.dispose();
      const current = vscode.languages.getDiagnostics(document.uri);
      reject(new Error(`waited ${timeoutMs} ms for ${what} in ${document.uri.path}; diagnostics now:\n        ${describeDiagnostics(document, current)}`));
    }, timeoutMs);
    check();
  });
}

/** Loopwise's diagnostics with the given code. */
export function withCode(diagnostics: readonly vscode.Diagnostic[], code: string): vscode.Diagnostic[] {
  return diagnostics.filter((d) => getCode(d) === code);
}

/** The diagnostic with `code` whose range covers exactly `text`, if any. */
export function findAt(
  document: vscode.TextDocument,
  diagnostics: readonly vscode.Diagnostic[],
  code: string,
  text: string,
): vscode.Diagnostic | undefined {
  return withCode(diagnostics, code).find((d) => document.getText(d.range) === text);
}

/** The position of the first occurrence of `needle` in the document (plus `delta` characters). */
export function positionOf(document: vscode.TextDocument, needle: string, delta = 0): vscode.Position {
  const offset = document.getText().indexOf(needle);
  assert.ok(offset >= 0, `"${needle}" occurs in ${document.uri.path}`);
  return document.positionAt(offset + delta);
}

/** The text of a hover's contents, markdown or plain. */
export function getHoverText(hovers: readonly vscode.Hover[]): string {
  return hovers
    .flatMap((h) => h.contents)
    .map((c) => (typeof c === 'string' ? c : c.value))
    .join('\n');
}

/** The document symbols as VS Code's outline gets them (DocumentSymbol: range, selection range, detail). */
export async function getSymbols(document: vscode.TextDocument): Promise<vscode.DocumentSymbol[]> {
  const symbols = await vscode.commands.executeCommand<vscode.DocumentSymbol[] | undefined>('vscode.executeDocumentSymbolProvider', document.uri);
  return symbols ?? [];
}

/** The `d` attribute of the path with the given id. */
export function getPathData(text: string, id: string): string {
  const element = new RegExp(`<path\\b[^>]*\\bid="${id}"[^>]*>`).exec(text);
  assert.ok(element, `a <path id="${id}"> exists`);
  const d = /\bd="([^"]*)"/.exec(element[0]);
  assert.ok(d, `<path id="${id}"> has a d attribute`);
  return d[1]!;
}

/** Reverts the active editor's unsaved edits so later tests see the fixture as it is on disk. */
export async function revertAndClose(document: vscode.TextDocument): Promise<void> {
  await vscode.window.showTextDocument(document);
  await vscode.commands.executeCommand('workbench.action.files.revert');
  await vscode.commands.executeCommand('workbench.action.closeActiveEditor');
}

/** Reverts every unsaved document and closes all editors (after a failed test, so the next starts clean). */
export async function resetEditors(): Promise<void> {
  for (const document of vscode.workspace.textDocuments) {
    if (!document.isDirty || document.isUntitled) continue;
    await vscode.window.showTextDocument(document);
    await vscode.commands.executeCommand('workbench.action.files.revert');
  }
  await vscode.commands.executeCommand('workbench.action.closeAllEditors');
}
