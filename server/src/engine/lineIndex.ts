/**
 * Offset → 1-based line and column (UTF-16 code units, as editors count), for adapters that print
 * positions (the CLI). Line breaks are LF, CRLF or lone CR, as in the LSP specification.
 */
export interface LineColumn {
  readonly line: number;
  readonly column: number;
}

export interface LineIndex {
  at(offset: number): LineColumn;
}

export function createLineIndex(text: string): LineIndex {
  const starts: number[] = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 13 /* \r */) {
      if (text.charCodeAt(i + 1) === 10) i++;
      starts.push(i + 1);
    } else if (c === 10 /* \n */) {
      starts.push(i + 1);
    }
  }
  return {
    at(offset: number): LineColumn {
      const o = Math.max(0, Math.min(offset, text.length));
      let lo = 0;
      let hi = starts.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (starts[mid]! <= o) lo = mid;
        else hi = mid - 1;
      }
      return { line: lo + 1, column: o - starts[lo]! + 1 };
    },
  };
}
