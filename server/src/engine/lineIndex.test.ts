import { describe, expect, it } from 'vitest';
import { createLineIndex } from './lineIndex';

// Source: LSP specification, "Position" — lines end at \n, \r\n or \r; characters count UTF-16 code units.
describe('createLineIndex', () => {
  it('counts LF, CRLF and lone CR as one line break each', () => {
    const text = 'a\nbc\r\nd\re';
    const index = createLineIndex(text);
    expect(index.at(0)).toEqual({ line: 1, column: 1 });
    expect(index.at(text.indexOf('c'))).toEqual({ line: 2, column: 2 });
    expect(index.at(text.indexOf('d'))).toEqual({ line: 3, column: 1 });
    expect(index.at(text.indexOf('e'))).toEqual({ line: 4, column: 1 });
  });

  it('counts a character outside the basic plane as two columns', () => {
    const text = '\u{1F600}x';
    expect(createLineIndex(text).at(text.indexOf('x'))).toEqual({ line: 1, column: 3 });
  });

  it('clamps offsets past the end to the end', () => {
    expect(createLineIndex('ab').at(99)).toEqual({ line: 1, column: 3 });
  });
});
