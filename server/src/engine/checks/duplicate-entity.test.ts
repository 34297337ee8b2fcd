import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../test/support/applyEdits';
import { dxf } from '../../../../test/support/dxfText';
import { analyze } from '../index';

describe('duplicate-entity', () => {
  it('is silent for two circles of different radius at one centre', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '10', 0, '20', 0, '40', 1], ['0', 'CIRCLE', '8', 'CUT', '10', 0, '20', 0, '40', 2]), 'dxf');
    expect(r.findings.filter((f) => f.checkId === 'duplicate-entity')).toEqual([]);
  });

  it('reports a LINE repeated with another handle, and its fix removes only the copy', () => {
    const a = ['0', 'LINE', '5', '1A', '8', 'CUT', '10', 0, '20', 0, '11', 5, '21', 0];
    const b = ['0', 'LINE', '5', '1B', '8', 'CUT', '10', 0, '20', 0, '11', 5, '21', 0];
    const text = dxf(a, b);
    const f = analyze(text, 'dxf').findings.filter((x) => x.checkId === 'duplicate-entity');
    expect(f.map((x) => x.message)).toEqual(['This LINE repeats the one on line 15 exactly; it would be cut twice.']);
    const fixed = applyEdits(text, f[0].fixes![0].edits);
    expect(fixed).toBe(dxf(a));
    expect(analyze(fixed, 'dxf').findings.filter((x) => x.checkId === 'duplicate-entity')).toEqual([]);
  });
});
