import fc from 'fast-check';
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

  it('agrees at every offset with a character-by-character count of line breaks (brute force; seed 77)', () => {
    const reference = (text: string, offset: number) => {
      let line = 1, start = 0;
      for (let i = 0; i < offset; i++) {
        if (text[i] === '\r' && text[i + 1] === '\n') continue; // CRLF: the LF ends the line
        if (text[i] === '\r' || text[i] === '\n') {
          line++;
          start = i + 1;
        }
      }
      return { line, column: offset - start + 1 };
    };
    fc.assert(
      fc.property(fc.array(fc.constantFrom('\r', '\n', 'x', '\r\n'), { maxLength: 40 }).map((parts) => parts.join('')), (text) => {
        const index = createLineIndex(text);
        for (let offset = 0; offset <= text.length; offset++) expect(index.at(offset)).toEqual(reference(text, offset));
      }),
      { seed: 77, numRuns: 500 },
    );
  });
});
