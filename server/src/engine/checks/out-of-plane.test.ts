import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../test/support/applyEdits';
import { analyze } from '../index';

/** An ASCII DXF text (millimetres) from group pairs of entities. */
const dxf = (...entities: (string | number)[][]) =>
  ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', ...entities.flat(), '0', 'ENDSEC', '0', 'EOF'].join('\n') + '\n';
const line = (x0: number, y0: number, x1: number, y1: number) => ['0', 'LINE', '8', 'CUT', '10', x0, '20', y0, '11', x1, '21', y1];

describe('out-of-plane', () => {
  it('is silent for an ARC mirrored by extrusion (0, 0, -1), which stays in the plane (REFERENCES.md §6.5)', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '10', 5, '20', 0, '40', 2, '210', 0, '220', 0, '230', -1]), 'dxf');
    expect(r.findings.filter((f) => f.checkId === 'out-of-plane')).toEqual([]);
    expect(r.contours).toHaveLength(1);
  });

  it('warns about a LWPOLYLINE on the tilted plane N = (0.6, 0, 0.8) of REFERENCES.md §6.5 and leaves it out', () => {
    const r = analyze(dxf(['0', 'LWPOLYLINE', '8', 'CUT', '90', 2, '70', 0, '10', 0, '20', 0, '10', 1, '20', 0, '210', 0.6, '220', 0, '230', 0.8]), 'dxf');
    expect(r.contours).toEqual([]);
    expect(r.findings.map((f) => [f.checkId, f.severity])).toEqual([['out-of-plane', 'warning']]);
  });
});
