import { defineCheck } from './defineCheck';

/** Two different contours cross: the parts they cut out overlap. */
export default defineCheck({
  id: 'contours-cross',
  description: 'Two different contours cross each other, so the parts they cut out overlap.',
  defaultSeverity: 'error',
  messages: {
    crossing: 'Crosses contour {otherContour} at ({xMm}, {yMm}) mm: the two parts overlap.',
  },
  run(ctx) {
    const r = ctx.geometry.intersections;
    for (const x of r.intersections) {
      if (x.kind !== 'crossing' || x.a.contour === x.b.contour) continue;
      ctx.report({
        messageId: 'crossing',
        span: x.b.span,
        data: { otherContour: ctx.contours[x.a.contour]!.contour.index, xMm: x.x, yMm: x.y },
        contour: ctx.contours[x.b.contour]!.contour.index,
        related: [{ span: x.a.span, message: 'The crossing segment of the other contour.' }],
      });
    }
  },
});
