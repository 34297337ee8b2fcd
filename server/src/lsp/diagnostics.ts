/**
 * Engine findings → LSP diagnostics. The engine speaks UTF-16 offsets and its own severities; the
 * conversion to lines, characters and protocol enums happens here, once.
 */
import { DiagnosticSeverity } from 'vscode-languageserver';
import type { Diagnostic, DiagnosticRelatedInformation, Range } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Finding, Severity, SourceSpan } from '../engine/index';

export const DIAGNOSTIC_SOURCE = 'loopwise';

/** What every Loopwise diagnostic carries in `data`, so a code action finds its finding again. */
export interface DiagnosticData {
  readonly checkId: string;
  readonly key: string;
}

export interface DiagnosticOptions {
  /** The client shows `relatedInformation` (`textDocument.publishDiagnostics.relatedInformation`). */
  readonly relatedInformation: boolean;
}

export function toRange(document: TextDocument, span: SourceSpan): Range {
  return { start: document.positionAt(span.start), end: document.positionAt(span.end) };
}

export function toDiagnosticSeverity(severity: Severity): DiagnosticSeverity {
  switch (severity) {
    case 'error':
      return DiagnosticSeverity.Error;
    case 'warning':
      return DiagnosticSeverity.Warning;
    case 'info':
      return DiagnosticSeverity.Information;
  }
}

/**
 * A key that names a finding within one analysis of one text: check, message, contour and span.
 * It never uses the message text, which depends on number formatting and may be reworded.
 */
export function getFindingKey(finding: Finding): string {
  return [finding.checkId, finding.messageId, finding.contour ?? '', finding.span.start, finding.span.end].join(':');
}

export function isDiagnosticData(data: unknown): data is DiagnosticData {
  if (typeof data !== 'object' || data === null) return false;
  const d = data as Record<string, unknown>;
  return typeof d.checkId === 'string' && typeof d.key === 'string';
}

export function toDiagnostic(finding: Finding, document: TextDocument, options: DiagnosticOptions): Diagnostic {
  const data: DiagnosticData = { checkId: finding.checkId, key: getFindingKey(finding) };
  const diagnostic: Diagnostic = {
    range: toRange(document, finding.span),
    severity: toDiagnosticSeverity(finding.severity),
    source: DIAGNOSTIC_SOURCE,
    code: finding.checkId,
    message: finding.message,
    data,
  };
  if (options.relatedInformation && finding.related && finding.related.length > 0) {
    diagnostic.relatedInformation = finding.related.map(
      (place): DiagnosticRelatedInformation => ({
        location: { uri: document.uri, range: toRange(document, place.span) },
        message: place.message,
      }),
    );
  }
  return diagnostic;
}
