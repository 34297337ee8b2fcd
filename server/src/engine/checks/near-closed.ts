import { defineCheck } from './defineCheck';

/**
 * An open contour whose end lies within the near-closed tolerance of its start: almost certainly meant
 * to be closed. Left as it is, a cutter leaves a nick (or a tab) at the gap and stops and starts there.
 */
export default defineCheck({
  id: 'near-closed',
  description: 'A contour ends at or very near its start without being closed; the joint is not cut as one.',
  defaultSeverity: 'warning',
  messages: {
    gap: 'Contour #{contour} is not closed: its end is {gapMm} mm from its start (near-closed tolerance {toleranceMm} mm).',
    touching: 'Contour #{contour} ends exactly on its start but is not closed, so the joint is not cut as one.',
  },
  run(ctx) {
    const toleranceMm = ctx.options.nearClosedToleranceMm;
    for (const { contour, metrics } of ctx.contours) {
      if (metrics.closed || metrics.segmentCount === 0) continue;
      if (metrics.gapMm > toleranceMm) continue;
      ctx.report({
        messageId: metrics.gapMm === 0 ? 'touching' : 'gap',
        span: contour.endSpan,
        contour: contour.index,
        data: { contour: contour.index, gapMm: metrics.gapMm, toleranceMm },
        related: [{ span: contour.startSpan, message: `Contour #${contour.index} starts here.` }],
        ...(contour.closeFix ? { fixes: [contour.closeFix] } : {}),
      });
    }
  },
});
