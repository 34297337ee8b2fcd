import { describe, expect, it } from 'vitest';
import { getGroupValueKind, GroupScanner, parseDecimal } from './groups';

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

  it('converts every value exactly as Number does, whether parsed in place or not (ECMA-262 StringToNumber)', () => {
    // Seeded decimals of every shape: signs, blanks, leading zeros, 1–17 significant digits, up to 24
    // decimals, exponents, and text that is no number at all; each value line's number must be the
    // double Number gives (−0 included), and NaN with a problem exactly where Number gives NaN.
    let seed = 7;
    const rand = (k: number) => Math.floor(((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * k);
    const digits = (k: number) => Array.from({ length: k }, () => rand(10)).join('');
    const values: string[] = ['0', '-0', '+0', '.5', '5.', '-.5', '.', '-', '+', '1e3', '1E-2', '0x1A', 'Infinity', '1_0', '--1', '1.2.3',
      ' 12', '\t-3.25', '9007199254740991', '9007199254740993', '0.1', '0.30000000000000004', '123456789012345678901234', '1.7976931348623157e308'];
    for (let k = 0; k < 3000; k++) {
      const int = digits(rand(12)), frac = digits(rand(25));
      values.push(`${['', '-', '+', ' ', ' -'][rand(5)]}${int}${rand(4) > 0 ? `.${frac}` : ''}${rand(20) === 0 ? `e${rand(40) - 20}` : ''}`);
    }
    const text = values.map((v) => `40\n${v}\n`).join('');
    const sc = new GroupScanner(text);
    const got: number[] = [];
    while (sc.next()) got.push(sc.number);
    const expected = values.map((v) => {
      const n = v.trim() === '' ? Number.NaN : Number(v);
      return Number.isFinite(n) ? n : Number.NaN;
    });
    expect(got).toHaveLength(values.length);
    for (let k = 0; k < values.length; k++) expect(Object.is(got[k], expected[k]), `"${values[k]}": ${got[k]} vs ${expected[k]}`).toBe(true);
    expect(sc.problems).toHaveLength(expected.filter(Number.isNaN).length);
    // The fast path declines what it cannot decide exactly, so Number decides it.
    expect([parseDecimal('1e3', 0, 3), parseDecimal('9007199254740993', 0, 16), parseDecimal('.', 0, 1)]).toEqual([Number.NaN, Number.NaN, Number.NaN]);
    expect(parseDecimal('x-12.50', 1, 7)).toBe(-12.5);
  });

  it('reads every pair as a line-by-line reading does: offsets, trimmed ends, line numbers and numbers (REFERENCES.md §6.1, §6.2)', () => {
    // Seeded pairs of every shape the one-pass path meets or declines: padded codes, LF and CRLF,
    // trailing blanks, tabs, blank and signed values, exponents, names, integers holding fractions,
    // and a last value line with or without its line end. Expected: the text split into lines.
    let seed = 11;
    const rand = (k: number) => Math.floor(((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * k);
    const pick = <T,>(xs: readonly T[]) => xs[rand(xs.length)];
    const codes = [0, 8, 10, 20, 40, 62, 70, 90, 210, 290, 330, 999, 1010, 1071, 12345];
    const values = ['LINE', ' CUT ', '', '  ', '1.5', '-0', '+7', '.5', '5.', '-', '1e3', '12 ', '\t-3.25', '3.0', '2.5', '00042', '9007199254740993', 'x1'];
    for (let round = 0; round < 200; round++) {
      const lines: string[] = [];
      for (let k = rand(12); k >= 0; k--) {
        lines.push(`${pick(['', ' ', '  '])}${pick(codes)}${pick(['', ' ', '\t', '\r'])}`, `${pick(values)}${pick(['', ' ', '\r', '\t '])}`);
      }
      const text = lines.map((l) => `${l}${pick(['\n', '\r\n'])}`).join('').replace(/\r?\n$/, rand(2) ? '' : '\n');
      const sc = new GroupScanner(text);
      const got: unknown[] = [];
      while (sc.next()) got.push([sc.code, sc.codeStart, sc.codeEnd, sc.codeLine, sc.valueStart, sc.valueEnd, sc.pairEnd, sc.number]);
      // The reference: lines and their offsets, each line's end trimmed of blanks.
      const starts = [0];
      for (let i = 0; i < text.length; i++) if (text[i] === '\n') starts.push(i + 1);
      const lineEnd = (k: number) => {
        let e = k + 1 < starts.length ? starts[k + 1] - 1 : text.length;
        while (e > starts[k] && ' \t\r'.includes(text[e - 1])) e--;
        return e;
      };
      const expected: unknown[] = [];
      // A pair needs its value line: an empty last line without its line end is no line (a truncated pair).
      for (let k = 0; 2 * k + 1 < lines.length && starts[2 * k + 1] < text.length; k++) {
        const c = 2 * k, v = 2 * k + 1;
        const code = Number(text.slice(starts[c], lineEnd(c)));
        const raw = text.slice(starts[v], lineEnd(v));
        const kind = getGroupValueKind(code);
        let number = kind === 'string' || raw.trim() === '' ? Number.NaN : Number(raw);
        if (!Number.isFinite(number) || (kind !== 'float' && !Number.isInteger(number))) number = Number.NaN;
        const pairEnd = v + 1 < starts.length ? starts[v + 1] : text.length;
        expected.push([code, starts[c], lineEnd(c), c, starts[v], lineEnd(v), pairEnd, number]);
      }
      expect(got, JSON.stringify(text)).toEqual(expected);
    }
  });

  it('reads names as String.prototype.trim does, one string per repeated name (ECMA-262 trim)', () => {
    const names = ['LINE', ' LINE', 'LINE', '\u00a0ARC', 'ARC\u00a0', 'A B', '', '  ', 'ÉCROU', 'LINE'];
    const sc = new GroupScanner(names.map((v) => `0\n${v}\n`).join(''));
    const got: string[] = [];
    while (sc.next()) got.push(sc.name);
    expect(got).toEqual(names.map((v) => v.trim()));
  });
});
