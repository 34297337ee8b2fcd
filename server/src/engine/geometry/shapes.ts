/**
 * The contours' shapes: roundness and hull (roundness.ts), measured after the findings. No check needs
 * them, and on a huge contour they take about as long as the rest of the analysis, so the language
 * server publishes the findings first and the hover cards get these figures a moment later.
 */
import type { ContourGeometry, ContourMetrics, ContourShape, OutlineContourResult, OutlineGeometry } from '../types';
import { isSelfCrossing } from './fileGeometry';
import { getRoundness } from './roundness';

/**
 * Each contour's roundness and hull, by position. `checkCancelled` is called between contours and
 * throws to stop.
 */
export function measureContourShapes(
  contours: readonly OutlineContourResult[],
  checkCancelled: () => void,
): ContourShape[] {
  const shapes: ContourShape[] = new Array(contours.length);
  for (let pos = 0; pos < contours.length; pos++) {
    const { contour, metrics, geometry } = contours[pos]!;
    shapes[pos] = getRoundness(contour, metrics, isSelfCrossing(geometry));
    checkCancelled();
  }
  return shapes;
}

/**
 * The contours with their shapes (`shapes` by position), as new objects: the engine's contours or the
 * figures the language server keeps (engine/figures.ts). Written out field by field, not spread, so
 * that every object of a kind shares one layout.
 */
export function withContourShapes<C>(
  contours: readonly { readonly contour: C; readonly metrics: ContourMetrics; readonly geometry: OutlineGeometry }[],
  shapes: readonly ContourShape[],
): { readonly contour: C; readonly metrics: ContourMetrics; readonly geometry: ContourGeometry }[] {
  const out: { contour: C; metrics: ContourMetrics; geometry: ContourGeometry }[] = new Array(contours.length);
  for (let pos = 0; pos < contours.length; pos++) {
    const { contour, metrics, geometry: g } = contours[pos]!;
    const { roundness, hull } = shapes[pos]!;
    out[pos] = {
      contour,
      metrics,
      geometry: { selfIntersections: g.selfIntersections, overlaps: g.overlaps, parent: g.parent, depth: g.depth, roundness, hull },
    };
  }
  return out;
}
