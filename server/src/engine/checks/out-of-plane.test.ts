import { describe, expect, it } from 'vitest';
import { dxf } from '../../../../test/support/dxfText';
import { analyze } from '../index';

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
