import { defineCheck } from './defineCheck';

/** A contour that touches itself without crossing: a vertex on an edge, two vertices at one point, a tangency. */
export default defineCheck({
  id: 'self-touch',
  description: 'A contour touches itself without crossing (a vertex on one of its own edges, a tangency).',
  defaultSeverity: 'warning',
  messages: {
    touch: 'Contour touches itself at ({xMm}, {yMm}) mm: the part hangs together by a single point there.',
  },
  run(ctx) {
    const r = ctx.geometry.intersections;
    for (const x of r.intersections) {
      if (x.kind !== 'touch' || x.a.contour !== x.b.contour) continue;
      ctx.report({
        messageId: 'touch',
        span: x.b.span,
        data: { xMm: x.x, yMm: x.y },
        contour: ctx.contours[x.b.contour]!.contour.index,
        related: [{ span: x.a.span, message: 'The other place where the contour meets this point.' }],
      });
    }
  },
});
