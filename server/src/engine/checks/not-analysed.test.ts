import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../test/support/applyEdits';
import { analyze } from '../index';

/** An ASCII DXF text (millimetres) from group pairs of entities. */
const dxf = (...entities: (string | number)[][]) =>
  ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', ...entities.flat(), '0', 'ENDSEC', '0', 'EOF'].join('\n') + '\n';
const line = (x0: number, y0: number, x1: number, y1: number) => ['0', 'LINE', '8', 'CUT', '10', x0, '20', y0, '11', x1, '21', y1];

describe('not-analysed', () => {
  it('is silent for a drawing of outlines only', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '10', 0, '20', 0, '40', 1]), 'dxf');
    expect(r.findings.filter((f) => f.checkId === 'not-analysed')).toEqual([]);
  });

  it('lists MTEXT and DIMENSION entities once per type, as information', () => {
    const r = analyze(dxf(['0', 'MTEXT', '8', 'CUT', '1', 'a'], ['0', 'MTEXT', '8', 'CUT', '1', 'b'], ['0', 'DIMENSION', '8', 'CUT']), 'dxf');
    const f = r.findings.filter((x) => x.checkId === 'not-analysed');
    expect(f.map((x) => [x.severity, x.message])).toEqual([
      ['info', 'Not analysed: 2 MTEXT entities (not cutting outlines).'],
      ['info', 'Not analysed: 1 DIMENSION entities (not cutting outlines).'],
    ]);
  });

  it('lists paper-space entities (group 67 = 1) and leaves them out', () => {
    const r = analyze(dxf(['0', 'CIRCLE', '8', 'CUT', '67', 1, '10', 0, '20', 0, '40', 1]), 'dxf');
    expect(r.contours).toEqual([]);
    expect(r.findings.map((x) => x.messageId)).toEqual(['paperSpace']);
  });
});
