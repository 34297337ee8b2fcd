/**
 * An analysis without its segment geometry: what the editor adapters read (figures, spans, findings).
 * A million-segment contour is tens of megabytes of objects; its figures are a few hundred bytes plus
 * one packed array of segment spans, so they cross from an analysis worker to the protocol thread
 * in milliseconds instead of seconds.
 */
import { withContourShapes } from './geometry/shapes';
import { getSegmentAt, getSegmentCount, SegmentView } from './model/packedSegment';
import type { AnalysisResult, Contour, ContourResult, ContourShape, OutlineAnalysis, OutlineContourResult, SourceSpan } from './types';

/** A contour without segments; `segmentSpans` holds each segment's source span as [start, end, start, end, …]. */
export interface ContourOutline extends Omit<Contour, 'segments' | 'stored'> {
  readonly segmentSpans: Int32Array;
}

/** The figures of an outline analysis's contour (no roundness and hull yet). */
export interface OutlineContourFigures extends Omit<OutlineContourResult, 'contour'> {
  readonly contour: ContourOutline;
}

export interface ContourFigures extends Omit<ContourResult, 'contour'> {
  readonly contour: ContourOutline;
}

/** The figures of an outline analysis: what the diagnostics need. */
export interface OutlineFigures extends Omit<OutlineAnalysis, 'contours'> {
  readonly contours: readonly OutlineContourFigures[];
}

export interface AnalysisFigures extends OutlineFigures {
  readonly contours: readonly ContourFigures[];
}

export function toFigures(result: AnalysisResult): AnalysisFigures;
export function toFigures(result: OutlineAnalysis): OutlineFigures;
export function toFigures(result: OutlineAnalysis): OutlineFigures {
  return {
    ...result,
    contours: result.contours.map(({ contour, ...rest }) => ({ ...rest, contour: toOutline(contour) })),
  };
}

/** Where toOutline reads the spans of a contour whose segments are stored. */
const spanView = new SegmentView();

/**
 * A contour's fields but its segments, and the segments' spans. The fields are copied by name,
 * passing over the two that hold the segments: reading `segments` of a contour whose segments are
 * stored would make them.
 */
function toOutline(contour: Contour): ContourOutline {
  const outline: Record<string, unknown> = {};
  for (const key of Object.keys(contour)) if (key !== 'segments' && key !== 'stored') outline[key] = contour[key as keyof Contour];
  const count = getSegmentCount(contour);
  const segmentSpans = new Int32Array(2 * count);
  for (let i = 0; i < count; i++) {
    const span = getSegmentAt(contour, i, spanView).span; // made on each read
    segmentSpans[2 * i] = span.start;
    segmentSpans[2 * i + 1] = span.end;
  }
  return { ...(outline as unknown as Omit<ContourOutline, 'segmentSpans'>), segmentSpans };
}

/** The figures with each contour's roundness and hull (`shapes` by position, from `measureShapes`). */
export function withShapes(figures: OutlineFigures, shapes: readonly ContourShape[]): AnalysisFigures {
  return { ...figures, contours: withContourShapes(figures.contours, shapes) };
}

/**
 * Where a contour stands in the document: its own text, or — for an instance whose text is elsewhere
 * (an SVG `use` of a shape in `defs`) — the element that places it.
 */
export function getPlacement(contour: { readonly span: SourceSpan; readonly elementSpan: SourceSpan }): SourceSpan {
  const { span, elementSpan } = contour;
  return span.start >= elementSpan.start && span.start <= elementSpan.end ? span : elementSpan;
}

/**
 * The contour whose text holds `offset` (for hovers), or undefined. A contour's own text wins over
 * the element around it, and of several the smallest. DXF contours chained from loose entities hold
 * the offset on any of their entities, not only the first.
 */
export function getContourAt(result: AnalysisFigures, offset: number): ContourFigures | undefined {
  let best: ContourFigures | undefined;
  for (const c of result.contours) {
    const { span, elementSpan, segmentSpans } = c.contour;
    const own = (offset >= span.start && offset < span.end) || (result.format === 'dxf' && holdsAny(segmentSpans, offset));
    if (!own && !(offset >= elementSpan.start && offset < elementSpan.end)) continue;
    const size = span.end - span.start;
    if (!best || (own && size < best.contour.span.end - best.contour.span.start)) best = c;
  }
  return best;
}

function holdsAny(spans: Int32Array, offset: number): boolean {
  for (let i = 0; i < spans.length; i += 2) if (offset >= spans[i]! && offset < spans[i + 1]!) return true;
  return false;
}
