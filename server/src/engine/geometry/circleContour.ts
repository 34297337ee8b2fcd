/**
 * Contours that are whole circles: their roundness in closed form.
 *
 * A closed contour made only of arcs of one circle (centre c, radius r), swept one way through one
 * full turn and joined end to end, lies in the annulus r ± d about c, with d the spread of the arcs'
 * centres and radii, their own deviation from a circle (`getArcCircle`) and half the largest gap
 * between consecutive arcs. Winding once around c, it holds the disc of radius r − d about c and lies
 * in the disc of radius r + d, so [derived here] the inscribed radius ρ and the enclosing radius R
 * both lie within r ± d, and the minimum zone (ISO 12181) is at most 2d. These are the figures, their
 * centres c, and their stated bounds: exact for a circle drawn as one (a DXF CIRCLE, an SVG circle),
 * where the searches of roundness.ts would flatten it and search it to 1e-8 of its size.
 */
import type { Contour } from '../types';
import { getArcCircle } from './hull';
import { getVectorLength } from './length';
import { getSegmentAt, getSegmentCount, SegmentView } from '../model/packedSegment';

/** The segment getContourCircle looks at, for a contour whose segments are stored. */
const segmentView = new SegmentView();

/** Largest spread of the arcs' centres and radii, and of their gaps, relative to the contour's size
 *  (bbox diagonal), for the contour to count as one circle. [common practice, no source] */
export const CIRCLE_SPREAD_RELATIVE = 1e-9;

export interface ContourCircle {
  readonly cx: number;
  readonly cy: number;
  readonly r: number;
  /** d: the contour lies within r ± d of (cx, cy). */
  readonly deviationMm: number;
}

/** The circle a closed contour draws (see the module comment), or null when it draws anything else. */
export function getContourCircle(contour: Contour, sizeMm: number): ContourCircle | null {
  const count = getSegmentCount(contour);
  const tolerance = CIRCLE_SPREAD_RELATIVE * sizeMm;
  if (count === 0 || !(tolerance > 0)) return null;
  let cx = 0, cy = 0, r = 0, sweep = 0, spread = 0, gap = 0;
  // The end of the segment before the one looked at (the last one's, before the first).
  const last = getSegmentAt(contour, count - 1, segmentView);
  let previousX = last.x1, previousY = last.y1;
  for (let i = 0; i < count; i++) {
    const s = getSegmentAt(contour, i, segmentView);
    if (s.kind !== 'arc') return null;
    const circle = getArcCircle(s, tolerance);
    // Every arc turns the way of the first that turns at all.
    if (!circle || s.sweep * sweep < 0) return null;
    if (i === 0) { cx = circle.cx; cy = circle.cy; r = circle.r; }
    spread = Math.max(spread, getVectorLength(circle.cx - cx, circle.cy - cy) + Math.abs(circle.r - r) + circle.deviationMm);
    gap = Math.max(gap, getVectorLength(s.x0 - previousX, s.y0 - previousY));
    previousX = s.x1; previousY = s.y1;
    sweep += s.sweep;
  }
  if (!(spread <= tolerance && gap <= tolerance && Math.abs(Math.abs(sweep) - 2 * Math.PI) <= 1e-12 * count)) return null;
  return { cx, cy, r, deviationMm: spread + gap / 2 };
}
