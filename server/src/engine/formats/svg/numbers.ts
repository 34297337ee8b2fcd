/**
 * Numbers and number lists in SVG attribute values (points, viewBox, transform arguments).
 *
 * Grammar: SVG 2 "Basic data types" / CSS Syntax <number>: sign? (digits ("." digits?)? | "." digits)
 * (("e" | "E") sign? digits)?. A trailing point (`23.`) is accepted as SVG 1.1 did (REFERENCES §5.1).
 * A number ends where the next character cannot continue it, so `10-5` is two numbers and `0.6.5` is
 * 0.6 then .5. Separators are comma-wsp: whitespace with at most one comma (SVG 1.1 §4.2 / SVG 2
 * "comma-wsp"). Whitespace is space, tab, CR, LF and form feed (SVG 2 / XML S production).
 */

export function isSvgWhitespace(code: number): boolean {
  return code === 0x20 || code === 0x09 || code === 0x0a || code === 0x0d || code === 0x0c;
}

function isDigit(code: number): boolean {
  return code >= 0x30 && code <= 0x39;
}

/** End index of the number that starts at `i` (exclusive), or -1 when no number starts there. */
export function scanNumber(text: string, i: number, end: number = text.length): number {
  let j = i;
  let c = text.charCodeAt(j);
  if (c === 0x2b || c === 0x2d) c = text.charCodeAt(++j); // + -
  const intStart = j;
  while (j < end && isDigit(text.charCodeAt(j))) j++;
  let digits = j - intStart;
  if (j < end && text.charCodeAt(j) === 0x2e) {
    const fracStart = ++j;
    while (j < end && isDigit(text.charCodeAt(j))) j++;
    digits += j - fracStart;
  }
  if (digits === 0) return -1;
  const e = text.charCodeAt(j);
  if (j < end && (e === 0x65 || e === 0x45)) {
    let k = j + 1;
    const s = text.charCodeAt(k);
    if (s === 0x2b || s === 0x2d) k++;
    const expStart = k;
    while (k < end && isDigit(text.charCodeAt(k))) k++;
    // A bare `e` is not part of the number (REFERENCES §5.1): the caller then meets it as garbage.
    if (k > expStart) j = k;
  }
  return j;
}

export interface NumberToken {
  readonly value: number;
  /** Index of the first character in the scanned string. */
  readonly start: number;
  /** Index after the last character. */
  readonly end: number;
}

export interface NumberListError {
  readonly start: number;
  readonly end: number;
  readonly detail: string;
}

export interface NumberList {
  /** The numbers read before the first error (all of them when there is none). */
  readonly numbers: readonly NumberToken[];
  readonly error?: NumberListError;
}

/** Index of the end of the offending token starting at `i`: up to the next separator. */
function getBadTokenEnd(text: string, i: number, end: number): number {
  let j = i + 1;
  while (j < end) {
    const c = text.charCodeAt(j);
    if (isSvgWhitespace(c) || c === 0x2c) break;
    j++;
  }
  return j;
}

/** Reads a comma-wsp separated list of numbers from text[start, end). */
export function parseNumberList(text: string, start = 0, end = text.length): NumberList {
  const numbers: NumberToken[] = [];
  let i = start;
  while (i < end && isSvgWhitespace(text.charCodeAt(i))) i++;
  let commaAt = -1;
  while (i < end) {
    const numberEnd = scanNumber(text, i, end);
    if (numberEnd < 0) {
      const badEnd = getBadTokenEnd(text, i, end);
      return { numbers, error: { start: i, end: badEnd, detail: `'${text.slice(i, badEnd)}' is not a number` } };
    }
    const value = Number(text.slice(i, numberEnd));
    if (!Number.isFinite(value)) {
      return { numbers, error: { start: i, end: numberEnd, detail: `${text.slice(i, numberEnd)} is out of range` } };
    }
    numbers.push({ value, start: i, end: numberEnd });
    i = numberEnd;
    commaAt = -1;
    while (i < end) {
      const c = text.charCodeAt(i);
      if (isSvgWhitespace(c)) i++;
      else if (c === 0x2c && commaAt < 0) commaAt = i++;
      else break;
    }
    if (i < end && text.charCodeAt(i) === 0x2c) {
      return { numbers, error: { start: i, end: i + 1, detail: 'two commas in a row' } };
    }
  }
  if (commaAt >= 0) return { numbers, error: { start: commaAt, end: commaAt + 1, detail: 'a comma with no number after it' } };
  return { numbers };
}
