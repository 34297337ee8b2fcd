import { defineCheck } from './defineCheck';

/** The file declares no physical size, so every figure rests on an assumed unit. */
export default defineCheck({
  id: 'units-assumed',
  description: 'The file declares no physical size; figures in mm rest on an assumed unit.',
  defaultSeverity: 'warning',
  messages: {
    assumed: 'The file declares no physical size, so one drawing unit is taken as 1 {unit} ({mmPerUnit} mm).',
  },
  run(ctx) {
    const { units } = ctx.read;
    if (units.declared) return;
    ctx.report({
      messageId: 'assumed',
      span: units.span,
      data: { unit: units.assumed ?? 'unit', mmPerUnit: units.mmPerUnit },
    });
  },
});
