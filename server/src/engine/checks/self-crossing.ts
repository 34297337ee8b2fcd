import { defineCheck } from './defineCheck';

/** A contour that crosses itself: the cutter path cuts through material it has already separated. */
export default defineCheck({
  id: 'self-crossing',
  description: 'A contour crosses itself (figure-eight, bow-tie, looped curve).',
  defaultSeverity: 'error',
  messages: {
    crossing: 'Contour crosses itself at ({xMm}, {yMm}) mm.',
    unresolved: 'Could not decide whether the contour crosses itself near ({xMm}, {yMm}) mm: the curves stay within 1e-9 of each other too long (subdivision limit reached).',
  },
  run(ctx) {
    const r = ctx.geometry.intersections;
    for (const x of r.intersections) {
      if (x.kind !== 'crossing' || x.a.contour !== x.b.contour) continue;
      ctx.report({
        messageId: 'crossing',
        span: x.b.span,
        data: { xMm: x.x, yMm: x.y },
        contour: ctx.contours[x.b.contour]!.contour.index,
        related: [{ span: x.a.span, message: 'The other segment of the crossing.' }],
      });
    }
    for (const u of r.unresolved) {
      ctx.report({
        messageId: 'unresolved',
        span: u.b.span,
        data: { xMm: u.x, yMm: u.y },
        contour: ctx.contours[u.b.contour]!.contour.index,
        related: [{ span: u.a.span, message: 'The other curve.' }],
      });
    }
  },
});
