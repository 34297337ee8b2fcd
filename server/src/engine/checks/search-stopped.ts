import { defineCheck } from './defineCheck';

/**
 * The file-wide search for crossings, touches and double cuts reached one of its limits
 * (intersect.ts MAX_PIECE_PAIRS, MAX_MEETINGS) and stopped: what it found is reported by those
 * checks, and there may be more.
 */
export default defineCheck({
  id: 'search-stopped',
  description: 'The search for crossings, touches and double cuts stopped at its limit: the file may have more of them than are reported.',
  defaultSeverity: 'warning',
  messages: {
    pairs: 'Stopped looking for crossings, touches and double cuts after {limit} pairs of segments that lie close together: there may be more than are reported. Look for many copies of one outline stacked on one another.',
    meetings: 'Stopped looking for crossings, touches and double cuts after {limit} places where segments meet: there may be more than are reported. Look for many copies of one outline stacked on one another, or many lines through one point.',
  },
  run(ctx) {
    const { stopped, intersections, overlaps } = ctx.geometry.intersections;
    if (!stopped || ctx.contours.length === 0) return;
    // Where the crowd is: the first meeting found, or else the first contour.
    const span = intersections[0]?.b.span ?? overlaps[0]?.b.span ?? ctx.contours[0]!.contour.span;
    ctx.report({ messageId: stopped.reason, span, data: { limit: stopped.limit } });
  },
});
