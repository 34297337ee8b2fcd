/**
 * The file-wide geometry of one analysis, computed once and shared by the result and the checks:
 * intersections and double cuts (intersect.ts), nesting and parts (nesting.ts), and the file summary.
 * The contours' roundness and hull come later, apart (shapes.ts): no check needs them.
 */
import type { ContourOverlap, FileSummary, MeasuredContour, OutlineGeometry, SelfIntersection } from '../types';
import { findIntersections, type IntersectionResult } from './intersect';
import { getFileSummary, getNesting, type Nesting } from './nesting';

/** The lists of every contour that has no self-intersection, or no overlap (frozen: shared). */
const NO_SELF_INTERSECTIONS: readonly SelfIntersection[] = Object.freeze([]);
const NO_OVERLAPS: readonly ContourOverlap[] = Object.freeze([]);

/** True when the contour crosses itself (a touch is not a crossing). */
export function isSelfCrossing(geometry: OutlineGeometry): boolean {
  return geometry.selfIntersections.some((x) => x.kind === 'crossing');
}

export interface FileGeometry {
  /** Places in it are positions in the analysed contour list (equal to contour indices). */
  readonly intersections: IntersectionResult;
  readonly nesting: Nesting;
  /** Per contour, by position. */
  readonly contours: readonly OutlineGeometry[];
  readonly summary: FileSummary;
}

/**
 * Computes the file's geometry. `checkCancelled` is called between stages and throws to stop; the
 * intersection search also polls `isCancelled` inside its loop.
 */
export function getFileGeometry(
  contours: readonly MeasuredContour[],
  checkCancelled: () => void,
  isCancelled?: () => boolean,
): FileGeometry {
  const intersections = findIntersections(contours.map((c) => c.contour), { reuseBuffers: true, ...(isCancelled ? { isCancelled } : {}) });
  checkCancelled();
  const nesting = getNesting(contours);
  checkCancelled();

  // Most contours meet nothing: they share one frozen empty list, and only contours with
  // intersections or overlaps get their own.
  const self: (SelfIntersection[] | undefined)[] = new Array(contours.length);
  for (const x of intersections.intersections) {
    if (x.a.contour !== x.b.contour) continue;
    (self[x.b.contour] ??= []).push({ xMm: x.x, yMm: x.y, kind: x.kind, span: x.b.span, otherSpan: x.a.span });
  }
  const overlaps: (ContourOverlap[] | undefined)[] = new Array(contours.length);
  for (const o of intersections.overlaps) {
    const a = contours[o.a.contour]!.contour.index, b = contours[o.b.contour]!.contour.index;
    (overlaps[o.b.contour] ??= []).push({ otherContour: a, lengthMm: o.length, span: o.b.span, otherSpan: o.a.span });
    if (o.a.contour !== o.b.contour) (overlaps[o.a.contour] ??= []).push({ otherContour: b, lengthMm: o.length, span: o.a.span, otherSpan: o.b.span });
  }

  const perContour: OutlineGeometry[] = new Array(contours.length);
  for (let pos = 0; pos < contours.length; pos++) {
    perContour[pos] = {
      selfIntersections: self[pos] ?? NO_SELF_INTERSECTIONS,
      overlaps: overlaps[pos] ?? NO_OVERLAPS,
      parent: nesting.parent[pos] ?? null,
      depth: nesting.depth[pos] ?? 0,
    };
  }
  return { intersections, nesting, contours: perContour, summary: getFileSummary(contours, nesting) };
}
