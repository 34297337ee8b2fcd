import { defineCheck } from './defineCheck';

/**
 * DXF entities that leave the drawing plane: an extrusion direction or normal that is not ±Z, or points
 * at different heights. A 2D cutting outline cannot follow them, so they are not analysed
 * (REFERENCES.md §6.5: an extrusion not parallel to Z tilts the entity's plane).
 */
export default defineCheck({
  id: 'out-of-plane',
  description: 'A DXF entity that does not lie in the drawing plane (tilted extrusion direction, ends at different heights) is not analysed.',
  defaultSeverity: 'warning',
  messages: {
    tilted: 'Not analysed: this {entity} is outside the drawing plane ({detail}).',
  },
});
