import { describe, expect, it } from 'vitest';
import { getGroupValueKind, GroupScanner } from './groups';

describe('GroupScanner', () => {
  it('reads code and value lines with their offsets, LF and CRLF alike (REFERENCES.md §6.1)', () => {
    for (const eol of ['\n', '\r\n']) {
      const text = ['  0', 'LINE', ' 10', '1.5  ', '999', 'note'].join(eol) + eol;
      const sc = new GroupScanner(text);
      const got: [number, string, number][] = [];
      while (sc.next()) got.push([sc.code, sc.value, sc.number]);
      expect(got).toEqual([[0, 'LINE', Number.NaN], [10, '1.5', 1.5], [999, 'note', Number.NaN]]);
      expect(sc.problems).toEqual([]);
    }
  });

  it('keeps the position of each pair', () => {
    const text = '0\nSECTION\n2\nENTITIES\n';
    const sc = new GroupScanner(text);
    sc.next();
    sc.next();
    expect([sc.codeStart, sc.codeLine, text.slice(sc.valueStart, sc.valueEnd), sc.pairEnd]).toEqual([10, 2, 'ENTITIES', text.length]);
  });

  it('types values by group code range (REFERENCES.md §6.2)', () => {
    expect([0, 8, 10, 40, 62, 90, 105, 210, 290, 330, 999, 1010, 1071].map(getGroupValueKind)).toEqual(
      ['string', 'string', 'float', 'float', 'int', 'int', 'string', 'float', 'bool', 'string', 'string', 'float', 'int']);
  });

  it('reports an integer group holding a fraction at its value line', () => {
    const text = '70\n1.5\n';
    const sc = new GroupScanner(text);
    sc.next();
    expect(sc.number).toBeNaN();
    expect(sc.problems[0].span).toEqual({ start: 3, end: 6 });
  });
});
