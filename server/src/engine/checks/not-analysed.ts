import { defineCheck } from './defineCheck';

/**
 * Parts of a DXF drawing that are not cutting outlines, or are set aside: text, hatches, dimensions,
 * points, meshes and other entities; entities on frozen or switched-off layers and on layers the
 * settings ignore (`ignoredLayers`); paper-space entities.
 * The DXF reader reports them so nothing is skipped silently.
 */
export default defineCheck({
  id: 'not-analysed',
  description: 'Entities that are not outlines (text, hatches, dimensions, points, meshes, …), entities on frozen, switched-off or ignored layers and paper-space entities are listed but not analysed.',
  defaultSeverity: 'info',
  messages: {
    entities: 'Not analysed: {entity} ({count|entity|entities}; not cutting outlines).',
    hiddenLayer: 'Layer {layer} is {state}: {count|entity|entities} not analysed.',
    ignoredLayer: 'Layer {layer} is ignored by the settings: {count|entity|entities} not analysed.',
    paperSpace: 'Not analysed: {count|paper-space entity|paper-space entities} (only model space holds outlines).',
  },
});
