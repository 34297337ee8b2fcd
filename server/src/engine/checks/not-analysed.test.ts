import { describe, expect, it } from 'vitest';
import { dxf } from '../../../../test/support/dxfText';
import { analyze } from '../index';


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
