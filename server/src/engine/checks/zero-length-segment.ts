import { getSegmentEnd, getSegmentLength, getVectorLength } from '../geometry/measure';
import { ZERO_LENGTH_MM } from '../geometry/tolerances';
import { defineCheck } from './defineCheck';
import { getSegmentAt, SegmentView } from '../model/packedSegment';

/** The segment looked at, for a contour whose segments are stored. */
const segmentView = new SegmentView();

/** A segment that goes nowhere: a repeated point. Machines may pause on it and leave a burn mark. */
export default defineCheck({
  id: 'zero-length-segment',
  description: 'A segment has (almost) no length: a repeated point where a machine may pause and mark the part.',
  defaultSeverity: 'warning',
  messages: {
    zero: 'Segment of contour #{contour} has zero length ({lengthMm} mm).',
  },
  run(ctx) {
    for (let pos = 0; pos < ctx.contours.length; pos++) {
      // The measures know each contour's shortest segment: a contour whose segments are all long enough needs no look.
      if (ctx.shortestSegmentMm[pos]! >= ZERO_LENGTH_MM) continue;
      const { contour, metrics } = ctx.contours[pos]!;
      for (let i = 0; i < metrics.segmentCount; i++) {
        const segment = getSegmentAt(contour, i, segmentView);
        // A curve is never shorter than its chord, so only a segment whose ends (nearly) meet needs its length.
        const [ex, ey] = getSegmentEnd(segment);
        if (getVectorLength(ex - segment.x0, ey - segment.y0) >= ZERO_LENGTH_MM) continue;
        const lengthMm = getSegmentLength(segment);
        if (lengthMm >= ZERO_LENGTH_MM) continue;
        ctx.report({ messageId: 'zero', span: segment.span, contour: contour.index, data: { contour: contour.index, lengthMm } });
      }
    }
  },
});
