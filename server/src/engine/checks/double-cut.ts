import { defineCheck } from './defineCheck';

/** Two stretches of outline lie on top of each other: the machine would cut the same line twice. */
export default defineCheck({
  id: 'double-cut',
  description: 'Outline that lies on top of other outline (collinear lines, co-circular arcs, duplicated curves or whole contours): it would be cut twice.',
  defaultSeverity: 'warning',
  messages: {
    sameContour: 'Contour runs back over itself for {lengthMm} mm: that stretch would be cut twice.',
    otherContour: 'Runs on top of contour {otherContour} for {lengthMm} mm: that stretch would be cut twice.',
  },
  run(ctx) {
    const r = ctx.geometry.intersections;
    for (const o of r.overlaps) {
      const same = o.a.contour === o.b.contour;
      const other = ctx.contours[o.a.contour]!.contour.index;
      ctx.report({
        messageId: same ? 'sameContour' : 'otherContour',
        span: o.b.span,
        data: same ? { lengthMm: o.length } : { otherContour: other, lengthMm: o.length },
        contour: ctx.contours[o.b.contour]!.contour.index,
        related: [{ span: o.a.span, message: 'The outline it runs on top of.' }],
      });
    }
  },
});
