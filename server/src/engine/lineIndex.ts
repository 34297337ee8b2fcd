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
  // The next LF and the next CR, each found by indexOf (a native scan) and looked for again only once
  // passed: a file with no CR is scanned for CR once.
  let lf = text.indexOf('\n');
  let cr = text.indexOf('\r');
  while (lf >= 0 || cr >= 0) {
    if (cr >= 0 && (lf < 0 || cr < lf)) {
      const crlf = lf === cr + 1;
      const next = crlf ? lf + 1 : cr + 1;
      starts.push(next);
      if (crlf) lf = text.indexOf('\n', next);
      cr = text.indexOf('\r', next);
    } else {
      starts.push(lf + 1);
      lf = text.indexOf('\n', lf + 1);
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
