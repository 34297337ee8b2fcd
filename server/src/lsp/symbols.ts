/**
 * Document symbols (outline, breadcrumbs, "Go to Symbol in Editor"): one symbol per contour, in
 * document order, named with its 0-based number, whether it is closed and its drawn length, so the
 * outline reads like the CLI table ("Contour #0 — closed, 60 mm").
 *
 * Range: the element or entity the contour came from (SVG start tag, DXF entity), widened to cover
 * the contour's own text; selection range: the contour's text (the subpath's commands, the shape
 * element, the entity). LSP requires the selection range to lie inside the range: a contour placed by
 * `<use>` has its text elsewhere in the file, so both ranges are then the `<use>` tag.
 */
import { SymbolKind } from 'vscode-languageserver';
import type { DocumentSymbol } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { formatNumber, getPlacement } from '../engine/index';
import type { ContourMetrics, ContourOutline } from '../engine/index';
import { toRange } from './diagnostics';

/** What a symbol needs of a contour's result (the file-wide geometry is not read). */
export interface SymbolSource {
  readonly contour: Omit<ContourOutline, 'segmentSpans'>;
  readonly metrics: ContourMetrics;
}

/** "closed, 60 mm", "closed (gap 0.02 mm), 60 mm" or "open (gap 5 mm), 7 mm": status and drawn length. */
export function describeContour(entry: SymbolSource): string {
  const { metrics } = entry;
  const gap = `gap ${formatNumber(metrics.gapMm)} mm`;
  const status = metrics.closed ? (metrics.gapMm > 0 ? `closed (${gap})` : 'closed') : `open (${gap})`;
  return `${status}, ${formatNumber(metrics.lengthMm)} mm`;
}

export function getSymbolName(entry: SymbolSource): string {
  return `Contour #${entry.contour.index} — ${describeContour(entry)}`;
}

/** Where the contour came from: element or entity name, id or handle, DXF layer. */
export function getSymbolDetail(entry: SymbolSource): string {
  const { contour } = entry;
  return [contour.element, contour.id !== undefined ? `#${contour.id}` : '', contour.layer !== undefined ? `layer ${contour.layer}` : '']
    .filter((s) => s !== '')
    .join(' ');
}

export function getDocumentSymbols(contours: readonly SymbolSource[], document: TextDocument): DocumentSymbol[] {
  return contours.map((entry) => {
    const { span, elementSpan } = entry.contour;
    const selection = getPlacement(entry.contour);
    // Own text: the range widens the element over it (a DXF chain's text runs on past its first
    // entity). Text elsewhere (a `<use>` instance): the placing element stands for both.
    const full = selection === span ? { start: elementSpan.start, end: Math.max(elementSpan.end, span.end) } : elementSpan;
    return {
      name: getSymbolName(entry),
      detail: getSymbolDetail(entry),
      kind: SymbolKind.Object,
      range: toRange(document, full),
      selectionRange: toRange(document, selection),
    };
  });
}
