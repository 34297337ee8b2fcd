import { isSelfCrossing } from '../geometry/fileGeometry';
import { defineCheck } from './defineCheck';

/** Largest mean width 2A/L (mm) of a closed contour that is reported as enclosing no area. A sliver
 *  this thin cannot be cut as a part (kerfs are ≥ 0.05 mm). Quantity: length · mm · absolute.
 *  Source: common practice, no source (mean width of a thin strip of length L/2 and area A is 2A/L). */
export const DEGENERATE_MEAN_WIDTH_MM = 1e-3;

/** A closed contour that encloses (almost) no area: a line drawn out and back, or a collapsed shape. */
export default defineCheck({
  id: 'degenerate-area',
  description: 'A closed contour encloses (almost) no area: its mean width 2A/L is below 1 µm.',
  defaultSeverity: 'warning',
  messages: {
    degenerate: 'Closed contour encloses almost no area: {areaMm2} mm² for {perimeterMm} mm of outline.',
  },
  run(ctx) {
    // Lobes of a self-crossing contour cancel in the signed area; self-crossing reports those.
    ctx.contours.forEach(({ contour, metrics, geometry }) => {
      if (!metrics.closed || isSelfCrossing(geometry) || metrics.areaMm2.value === null || metrics.perimeterMm.value === null) return;
      const area = metrics.areaMm2.value, perimeter = metrics.perimeterMm.value;
      if (perimeter <= 0 || (2 * area) / perimeter > DEGENERATE_MEAN_WIDTH_MM) return;
      ctx.report({
        messageId: 'degenerate',
        span: contour.span,
        data: { areaMm2: area, perimeterMm: perimeter },
        contour: contour.index,
      });
    });
  },
});
