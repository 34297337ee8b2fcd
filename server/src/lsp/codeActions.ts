/**
 * Quick fixes: each fix an engine finding carries becomes a code action. The action is tied to the
 * diagnostic the client sent back by its `data.key`, never by its message text.
 */
import { CodeActionKind } from 'vscode-languageserver';
import type { CodeAction, Diagnostic, TextEdit as LspTextEdit, WorkspaceEdit } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Finding, Fix, OutlineFigures } from '../engine/index';
import { DIAGNOSTIC_SOURCE, getFindingKey, isDiagnosticData, toRange } from './diagnostics';

export interface CodeActionOptions {
  /** The client applies versioned `documentChanges` (`workspace.workspaceEdit.documentChanges`). */
  readonly documentChanges: boolean;
}

function toWorkspaceEdit(fix: Fix, document: TextDocument, options: CodeActionOptions): WorkspaceEdit {
  const edits: LspTextEdit[] = fix.edits.map((e) => ({ range: toRange(document, e.span), newText: e.newText }));
  if (options.documentChanges) {
    // Versioned: the editor refuses the edit if the document changed since this analysis.
    return { documentChanges: [{ textDocument: { uri: document.uri, version: document.version }, edits }] };
  }
  return { changes: { [document.uri]: edits } };
}

/**
 * Code actions for the Loopwise diagnostics in `diagnostics` (the request's context). `result` must
 * be the analysis of exactly `document`'s current text, so the edits' ranges fit it.
 */
export function getCodeActions(
  result: OutlineFigures,
  document: TextDocument,
  diagnostics: readonly Diagnostic[],
  options: CodeActionOptions,
): CodeAction[] {
  const byKey = new Map<string, Finding>();
  for (const finding of result.findings) {
    if (finding.fixes && finding.fixes.length > 0) byKey.set(getFindingKey(finding), finding);
  }
  const actions: CodeAction[] = [];
  for (const diagnostic of diagnostics) {
    if (diagnostic.source !== DIAGNOSTIC_SOURCE || !isDiagnosticData(diagnostic.data)) continue;
    const finding = byKey.get(diagnostic.data.key);
    if (!finding?.fixes) continue;
    finding.fixes.forEach((fix, i) => {
      actions.push({
        title: fix.title,
        kind: CodeActionKind.QuickFix,
        diagnostics: [diagnostic],
        // The first fix is the one the check recommends.
        isPreferred: i === 0,
        edit: toWorkspaceEdit(fix, document, options),
      });
    });
  }
  return actions;
}
