import { defineCheck } from './defineCheck';

/**
 * A contour whose end is farther from its start than the near-closed tolerance. A cutter follows the
 * stroke, not the fill, so the part is not cut free (SVG 2 Painting: fill closes open subpaths
 * implicitly, which is why the gap is invisible in a viewer).
 */
export default defineCheck({
  id: 'open-contour',
  description: 'A contour ends away from its start, so the part it outlines is not cut free.',
  defaultSeverity: 'error',
  messages: {
    gap: 'Contour #{contour} is open: its end is {gapMm} mm from its start.',
  },
  run(ctx) {
    for (const { contour, metrics } of ctx.contours) {
      if (metrics.closed || metrics.segmentCount === 0) continue;
      if (metrics.gapMm <= ctx.options.nearClosedToleranceMm) continue;
      ctx.report({
        messageId: 'gap',
        span: contour.endSpan,
        contour: contour.index,
        data: { contour: contour.index, gapMm: metrics.gapMm },
        related: [{ span: contour.startSpan, message: `Contour #${contour.index} starts here.` }],
      });
    }
  },
});
