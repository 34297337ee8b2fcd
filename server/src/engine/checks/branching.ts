import { defineCheck } from './defineCheck';

/**
 * Three or more loose DXF entity ends meeting at one point: the outline branches there, so it cannot
 * be followed as one cut. The reader joins two of the ends and leaves the others open.
 */
export default defineCheck({
  id: 'branching',
  description: 'Three or more entity ends meet at one point, so the outline branches and cannot be followed as a single cut.',
  defaultSeverity: 'warning',
  messages: {
    branch: '{count} entities end at ({xMm}, {yMm}) mm: the outline branches here.',
  },
});
