import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../test/support/applyEdits';
import { analyze } from '../index';

/** An ASCII DXF text (millimetres) from group pairs of entities. */
const dxf = (...entities: (string | number)[][]) =>
  ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', ...entities.flat(), '0', 'ENDSEC', '0', 'EOF'].join('\n') + '\n';
const line = (x0: number, y0: number, x1: number, y1: number) => ['0', 'LINE', '8', 'CUT', '10', x0, '20', y0, '11', x1, '21', y1];

describe('branching', () => {
  it('is silent for loose lines that chain into one closed outline', () => {
    const r = analyze(dxf(line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 0)), 'dxf');
    expect(r.findings.filter((f) => f.checkId === 'branching')).toEqual([]);
  });

  it('reports a T junction of three line ends with the other entities as related places', () => {
    const text = dxf(line(0, 0, 10, 0), line(10, 0, 20, 0), line(10, 0, 10, 10));
    const f = analyze(text, 'dxf').findings.filter((x) => x.checkId === 'branching');
    expect(f.map((x) => [x.severity, x.message])).toEqual([['warning', '3 entities end at (10, 0) mm: the outline branches here.']]);
    expect(f[0].related!.map((r) => text.slice(r.span.start, r.span.end).split('\n')[1])).toEqual(['LINE', 'LINE']);
  });
});
