import { describe, expect, it } from 'vitest';
import { dxf, line } from '../../../../test/support/dxfText';
import { analyze } from '../index';

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
