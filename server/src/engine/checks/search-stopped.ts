import { MAX_WINDING_TESTS } from '../geometry/nesting';
import { defineCheck } from './defineCheck';

/**
 * A file-wide search reached its limit and stopped: the search for crossings, touches and double cuts
 * (intersect.ts MAX_PIECE_PAIRS, MAX_MEETINGS), whose findings so far are reported by those checks, or
 * the one for which contours lie inside which (nesting.ts MAX_WINDING_TESTS), which leaves later
 * contours unplaced.
 */
export default defineCheck({
  id: 'search-stopped',
  description: 'A search stopped at its limit: the file may have more crossings, touches and double cuts than are reported, or holes and parts that are not known.',
  defaultSeverity: 'warning',
  messages: {
    pairs: 'Stopped looking for crossings, touches and double cuts after {limit} pairs of segments that lie close together: there may be more than are reported. Look for many copies of one outline stacked on one another.',
    meetings: 'Stopped looking for crossings, touches and double cuts after {limit} places where segments meet: there may be more than are reported. Look for many copies of one outline stacked on one another, or many lines through one point.',
    nesting: 'Stopped finding which contours lie inside which after {limit} tests, at this contour: from here on, holes and parts are not known and the summary counts them as outer boundaries. Look for many copies of one outline stacked on one another.',
  },
  run(ctx) {
    const { stopped, intersections, overlaps } = ctx.geometry.intersections;
    if (stopped && ctx.contours.length > 0) {
      // Where the crowd is: the first meeting found, or else the first contour.
      const span = intersections[0]?.b.span ?? overlaps[0]?.b.span ?? ctx.contours[0]!.contour.span;
      ctx.report({ messageId: stopped.reason, span, data: { limit: stopped.limit } });
    }
    const at = ctx.geometry.nesting.stoppedAt;
    if (at !== null) ctx.report({ messageId: 'nesting', span: ctx.contours[at]!.contour.span, data: { limit: MAX_WINDING_TESTS } });
  },
});
