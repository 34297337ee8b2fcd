/**
 * The file-wide geometry of one analysis, computed once and shared by the result and the checks:
 * intersections and double cuts (intersect.ts), nesting and parts (nesting.ts), then per contour
 * roundness and hull (roundness.ts), and the file summary.
 */
import type { ContourGeometry, ContourOverlap, FileSummary, MeasuredContour, SelfIntersection } from '../types';
import { findIntersections, type IntersectionResult } from './intersect';
import { getFileSummary, getNesting, type Nesting } from './nesting';
import { getRoundness } from './roundness';

export interface FileGeometry {
  /** Places in it are positions in the analysed contour list (equal to contour indices). */
  readonly intersections: IntersectionResult;
  readonly nesting: Nesting;
  /** Per contour, by position. */
  readonly contours: readonly ContourGeometry[];
  readonly summary: FileSummary;
}

/**
 * Computes the file's geometry. `checkCancelled` is called between stages and between contours and
 * throws to stop; the intersection search also polls `isCancelled` inside its loop.
 */
export function getFileGeometry(
  contours: readonly MeasuredContour[],
  checkCancelled: () => void,
  isCancelled?: () => boolean,
): FileGeometry {
  const intersections = findIntersections(contours.map((c) => c.contour), isCancelled ? { isCancelled } : {});
  checkCancelled();
  const nesting = getNesting(contours);
  checkCancelled();

  const self: SelfIntersection[][] = contours.map(() => []);
  for (const x of intersections.intersections) {
    if (x.a.contour !== x.b.contour) continue;
    self[x.b.contour]!.push({ xMm: x.x, yMm: x.y, kind: x.kind, span: x.b.span, otherSpan: x.a.span });
  }
  const overlaps: ContourOverlap[][] = contours.map(() => []);
  for (const o of intersections.overlaps) {
    const a = contours[o.a.contour]!.contour.index, b = contours[o.b.contour]!.contour.index;
    overlaps[o.b.contour]!.push({ otherContour: a, lengthMm: o.length, span: o.b.span, otherSpan: o.a.span });
    if (o.a.contour !== o.b.contour) overlaps[o.a.contour]!.push({ otherContour: b, lengthMm: o.length, span: o.a.span, otherSpan: o.b.span });
  }

  const perContour: ContourGeometry[] = [];
  contours.forEach(({ contour, metrics }, pos) => {
    const selfCrossing = self[pos]!.some((x) => x.kind === 'crossing');
    const { roundness, hull } = getRoundness(contour, metrics, selfCrossing);
    perContour.push({
      selfIntersections: self[pos]!,
      overlaps: overlaps[pos]!,
      parent: nesting.parent[pos] ?? null,
      depth: nesting.depth[pos] ?? 0,
      roundness,
      hull,
    });
    checkCancelled();
  });
  return { intersections, nesting, contours: perContour, summary: getFileSummary(contours, nesting) };
}
