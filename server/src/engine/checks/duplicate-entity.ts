import { defineCheck } from './defineCheck';

/**
 * A DXF entity that repeats an earlier one exactly (same type, layer and values; only the handle may
 * differ): the cutter would run the same path twice. The copy is left out of the analysis; the fix
 * removes it.
 */
export default defineCheck({
  id: 'duplicate-entity',
  description: 'An entity repeats an earlier one exactly, so its path would be cut twice.',
  defaultSeverity: 'warning',
  messages: {
    duplicate: 'This {entity} repeats the one on line {line} exactly; it would be cut twice.',
  },
});
