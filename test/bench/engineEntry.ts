/** What the benches time of the engine, bundled by shippedEngine.ts. */
export { analyze, analyzeOutlines, DEFAULT_OPTIONS, getFormatForPath } from '../../server/src/engine/index';
export { readDxf } from '../../server/src/engine/formats/dxf/readDxf';
