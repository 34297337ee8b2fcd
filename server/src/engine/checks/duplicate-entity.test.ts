import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../test/support/applyEdits';
import { analyze } from '../index';

/** An ASCII DXF text (millimetres) from group pairs of entities. */
const dxf = (...entities: (string | number)[][]) =>
  ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', ...entities.flat(), '0', 'ENDSEC', '0', 'EOF'].join('\n') + '\n';
const line = (x0: number, y0: number, x1: number, y1: number) => ['0', 'LINE', '8', 'CUT', '10', x0, '20', y0, '11', x1, '21', y1];

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
