/**
 * Figures of one contour: gap, drawn length, perimeter, signed area, orientation, isoperimetric
 * quotient and deficit, exact bounding box. Per-segment helpers are re-exported so callers have one
 * import for "measure a segment".
 */
import { CompensatedSum, getSegmentArea } from './area';
import { setSegmentBounds, type Box } from './bounds';
import { getSegmentLengthFlagged, getVectorLength } from './length';
import { getSegmentAt, getSegmentCount, SegmentView } from '../model/packedSegment';
import type { Contour, ContourMetrics, Measured, YAxis } from '../types';

export { CompensatedSum, getSegmentArea } from './area';
export { getBezierCriticalParameters, getSegmentBounds, getSegmentEnd, getSegmentPoint, getSegmentStart, setSegmentBounds } from './bounds';
export type { Box } from './bounds';
export { getArcLength, getArcLengthEstimate, getBezierLength, getSegmentLength, getSegmentLengthEstimate, getVectorLength } from './length';
export type { LengthEstimate } from './length';

/** measureContour's figures plus what it knows about their accuracy. */
export interface DetailedContourMetrics {
  readonly metrics: ContourMetrics;
  /** True when some Bézier length stopped at BEZIER_LENGTH_MAX_DEPTH (see LengthEstimate). */
  readonly lengthDepthCapped: boolean;
  /** Length of the shortest segment (getSegmentLength's value): Infinity when there is none, NaN when a length is NaN. */
  readonly shortestSegmentMm: number;
}

/** What measuring a contour learns beside its figures. */
interface MeasureFacts {
  depthCapped: boolean;
  shortestSegmentMm: number;
}

const OPEN: Measured = { value: null, reason: 'open contour' };
const ZERO_LENGTH: Measured = { value: null, reason: 'zero length' };
/** Coordinates near the double limit (~1e154 and up) overflow squares and products. */
const OVERFLOW: Measured = { value: null, reason: 'numeric overflow' };

/**
 * Measures a contour (see measureContour) and also reports whether a Bézier length hit the
 * quadrature's depth cap.
 *
 * Definitions:
 * - gapMm: 0 when closed, else the distance from the last segment's end to the start point.
 * - lengthMm: Σ segment lengths, plus the closing chord when closed and the last end ≠ start.
 * - signed area: Green's theorem over the segments and the closing chord, from the start point as
 *   local origin (so the closing chord, which ends at the origin, contributes exactly 0), summed
 *   with Neumaier compensation (REFERENCES §4.1, §7.4). For a self-crossing loop it is the
 *   winding-number-weighted area ∫ w(x, y) dA, so lobes of opposite turn cancel; areaMm2 = |that|.
 * - q = 4πA/L² with A = areaMm2 and deficit L² − 4πA (REFERENCES §1–2): closed contours with L > 0.
 * - Where squares or products overflow (coordinates beyond ~1e154 mm) a figure is
 *   { value: null, reason: 'numeric overflow' } instead of NaN or Infinity.
 * - orientation: a positive signed area is clockwise on screen for y-down files and
 *   counter-clockwise for y-up files (types.ts convention); null when the area is undefined or 0.
 */
export function measureContourDetailed(contour: Contour, yAxis: YAxis): DetailedContourMetrics {
  const facts: MeasureFacts = { depthCapped: false, shortestSegmentMm: Infinity };
  const metrics = measure(contour, yAxis, facts);
  return { metrics, lengthDepthCapped: facts.depthCapped, shortestSegmentMm: facts.shortestSegmentMm };
}

/** Scratch box of measure (filled per segment, read at once; nothing is kept between calls). */
const segmentBox: Box = [0, 0, 0, 0];
/** The segment measure looks at, for a contour whose segments are stored. */
const segmentView = new SegmentView();

/** measureContourDetailed's figures; `facts` (fresh) learns the depth cap and the shortest segment. */
function measure(contour: Contour, yAxis: YAxis, facts: MeasureFacts): ContourMetrics {
  const { closed, startX, startY } = contour;
  const count = getSegmentCount(contour);
  const length = new CompensatedSum();
  const area = new CompensatedSum();
  const box = segmentBox;
  let minX = startX, minY = startY, maxX = startX, maxY = startY;
  let endX = startX, endY = startY;
  let shortest = Infinity; // NaN, once met, stays
  for (let i = 0; i < count; i++) {
    const s = getSegmentAt(contour, i, segmentView);
    const segmentLength = getSegmentLengthFlagged(s, facts);
    length.add(segmentLength);
    if (segmentLength < shortest || segmentLength !== segmentLength) shortest = segmentLength;
    area.add(getSegmentArea(s, startX, startY));
    setSegmentBounds(s, box);
    if (box[0] < minX) minX = box[0];
    if (box[1] < minY) minY = box[1];
    if (box[2] > maxX) maxX = box[2];
    if (box[3] > maxY) maxY = box[3];
  }
  if (count > 0) {
    const last = getSegmentAt(contour, count - 1, segmentView);
    switch (last.kind) {
      case 'line':
      case 'arc':
        endX = last.x1; endY = last.y1;
        break;
      case 'quad':
        endX = last.x2; endY = last.y2;
        break;
      case 'cubic':
        endX = last.x3; endY = last.y3;
    }
  }
  facts.shortestSegmentMm = shortest;
  const endToStart = getVectorLength(startX - endX, startY - endY);
  if (closed) length.add(endToStart);
  const lengthMm = length.value;

  let perimeterMm: Measured = OPEN;
  let signedAreaMm2: Measured = OPEN;
  let areaMm2: Measured = OPEN;
  let q: Measured = OPEN;
  let deficitMm2: Measured = OPEN;
  let orientation: ContourMetrics['orientation'] = null;
  const signed = area.value;
  if (closed && !(Number.isFinite(signed) && Number.isFinite(lengthMm))) {
    // Coordinates near the double limit overflow the products; say so rather than return NaN.
    perimeterMm = Number.isFinite(lengthMm) ? { value: lengthMm } : OVERFLOW;
    signedAreaMm2 = areaMm2 = q = deficitMm2 = OVERFLOW;
  } else if (closed) {
    const absolute = Math.abs(signed);
    perimeterMm = { value: lengthMm };
    signedAreaMm2 = { value: signed };
    areaMm2 = { value: absolute };
    if (lengthMm > 0) {
      const l2 = lengthMm * lengthMm;
      const qValue = (4 * Math.PI * absolute) / l2;
      const deficit = l2 - 4 * Math.PI * absolute;
      q = Number.isFinite(l2) ? { value: qValue } : OVERFLOW;
      deficitMm2 = Number.isFinite(deficit) ? { value: deficit } : OVERFLOW;
    } else {
      q = ZERO_LENGTH;
      deficitMm2 = ZERO_LENGTH;
    }
    if (signed !== 0) orientation = (signed > 0) === (yAxis === 'down') ? 'cw' : 'ccw';
  }

  return {
    closed,
    gapMm: closed ? 0 : endToStart,
    lengthMm,
    perimeterMm,
    signedAreaMm2,
    areaMm2,
    orientation,
    q,
    deficitMm2,
    bboxMm: [minX, minY, maxX, maxY],
    segmentCount: count,
  };
}

/**
 * The figures of one contour, in the file's axes and mm (definitions at measureContourDetailed).
 * Lengths of lines and arcs are exact, of Béziers within BEZIER_LENGTH_REL_TOL; the rare case where
 * the quadrature hit its depth cap is dropped here (ContourMetrics has no field for it) — callers
 * that need it use measureContourDetailed.
 */
export function measureContour(contour: Contour, yAxis: YAxis): ContourMetrics {
  return measure(contour, yAxis, { depthCapped: false, shortestSegmentMm: Infinity });
}
