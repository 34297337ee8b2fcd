/**
 * Streaming, position-keeping scanner of ASCII DXF group pairs.
 *
 * An ASCII DXF file is a sequence of line pairs: a group-code line (an integer, possibly padded with
 * spaces) and a value line (REFERENCES.md §6.1, DXF Reference "DXF Format"). The scanner walks the
 * text once, never splits it into lines or objects, and exposes the current pair through plain
 * fields: where its code line and value line are, the code, and the value (raw text or converted
 * number). LF and CRLF line ends are both accepted; trailing spaces, tabs and CR are trimmed from
 * values (§6.1).
 *
 * Malformed input never throws: a code line that is not an integer, a code line with no value line
 * after it (truncated file) and a value that is not a number where the group code requires one are
 * collected in `problems` with the exact line span, and scanning goes on (after a bad code line it
 * resynchronises at the next line that reads `0`, the start of the next entity or section).
 */
import type { RawFinding, SourceSpan } from '../../types';

/** The 22-byte sentinel that starts a binary DXF file (REFERENCES.md §6.6). */
export const BINARY_DXF_SENTINEL = 'AutoCAD Binary DXF\r\n\x1a\0';

/** Value type of a group code (REFERENCES.md §6.2, DXF Reference "Group Code Value Types"). */
export type GroupValueKind = 'string' | 'float' | 'int' | 'bool';

/** The value kind of a group code; unknown codes read as strings. */
export function getGroupValueKind(code: number): GroupValueKind {
  if (code < 10) return 'string';
  if (code < 60) return 'float'; // 10–39 points, 40–59 doubles
  if (code < 80) return 'int'; // 60–79 int16
  if (code >= 90 && code < 100) return 'int'; // int32
  if (code >= 110 && code < 150) return 'float';
  if (code >= 160 && code < 180) return 'int'; // int64, int16
  if (code >= 210 && code < 240) return 'float'; // extrusion and other doubles
  if (code >= 270 && code < 290) return 'int';
  if (code >= 290 && code < 300) return 'bool';
  if (code >= 370 && code < 390) return 'int';
  if (code >= 400 && code < 410) return 'int';
  if (code >= 420 && code < 430) return 'int';
  if (code >= 440 && code < 460) return 'int';
  if (code >= 460 && code < 470) return 'float';
  if (code >= 1010 && code < 1060) return 'float';
  if (code >= 1060 && code < 1072) return 'int';
  return 'string';
}

/** Group codes below this have a precomputed kind: 0 string, 1 float, 2 integer or boolean. */
const KIND_TABLE_SIZE = 1072;
const KIND_TABLE = new Uint8Array(KIND_TABLE_SIZE);
for (let c = 0; c < KIND_TABLE_SIZE; c++) {
  const k = getGroupValueKind(c);
  KIND_TABLE[c] = k === 'float' ? 1 : k === 'string' ? 0 : 2;
}

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const MINUS = 45;
const PLUS = 43;
const POINT = 46;
/** Slots of a scanner's name cache (a power of two). */
const NAME_CACHE_SIZE = 256;

function isBlank(c: number): boolean {
  return c === SPACE || c === TAB || c === CR;
}

/** Exact powers of ten (every one up to 10²² is a double). */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * The value of text [start, end) when it is a plain decimal, optional blanks and sign, digits, an
 * optional point and digits, whose digits read as an integer below 2⁵³ and that has at most 22
 * decimals; NaN for anything else (exponents, more digits, other characters), which the caller then
 * converts with `Number`. Both numbers of m / 10^k are exact, so their IEEE quotient is the correctly
 * rounded value of the decimal, the very double `Number` gives (ECMA-262 StringToNumber rounds
 * correctly; Clinger's fast path): no string is sliced for the common value.
 */
export function parseDecimal(text: string, start: number, end: number): number {
  let i = start;
  while (i < end && (text.charCodeAt(i) === SPACE || text.charCodeAt(i) === TAB)) i++;
  const sign = i < end ? text.charCodeAt(i) : 0;
  if (sign === MINUS || sign === PLUS) i++;
  let m = 0, digits = 0, decimals = 0;
  for (; i < end; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) break;
    m = m * 10 + d;
    digits++;
  }
  if (i < end && text.charCodeAt(i) === POINT) {
    for (i++; i < end; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9) break;
      m = m * 10 + d;
      digits++;
      decimals++;
    }
  }
  if (i !== end || digits === 0 || !(m < 2 ** 53) || decimals >= POWERS_OF_TEN.length) return Number.NaN;
  const v = decimals === 0 ? m : m / POWERS_OF_TEN[decimals];
  return sign === MINUS ? -v : v;
}

/** Parses a group-code line's text [start, end) as a non-negative integer; -1 when it is not one. */
function parseCode(text: string, start: number, end: number): number {
  let i = start;
  while (i < end && (text.charCodeAt(i) === SPACE || text.charCodeAt(i) === TAB)) i++;
  let j = end;
  while (j > i && isBlank(text.charCodeAt(j - 1))) j--;
  if (i === j) return -1;
  let v = 0;
  for (let k = i; k < j; k++) {
    const d = text.charCodeAt(k) - 48;
    if (d < 0 || d > 9) return -1;
    v = v * 10 + d;
  }
  return v;
}

/**
 * Pull scanner: call `next()` until it returns false; after each true the fields describe one pair.
 * Offsets are UTF-16 offsets into the text; line numbers are 0-based.
 */
export class GroupScanner {
  readonly text: string;
  /** Problems met so far (parse-error / dxf). */
  readonly problems: RawFinding[] = [];
  /** Group code of the current pair. */
  code = -1;
  /** Start of the current pair's code line (the span of an entity starts here). */
  codeStart = 0;
  /** End of the code line's text (before its line end). */
  codeEnd = 0;
  /** 0-based line number of the code line. */
  codeLine = 0;
  /** Start of the value line. */
  valueStart = 0;
  /** End of the value text, trailing blanks and CR trimmed. */
  valueEnd = 0;
  /** Offset just after the value line's line end (start of the next pair). */
  pairEnd = 0;
  /** The line end the file uses (from its first line), for inserted text. */
  readonly eol: string;
  private pos = 0;
  private line = 0;

  constructor(text: string, start = 0) {
    this.text = text;
    this.pos = start;
    const firstLf = text.indexOf('\n');
    this.eol = firstLf > 0 && text.charCodeAt(firstLf - 1) === CR ? '\r\n' : '\n';
  }

  /** Current offset (start of the next pair). */
  get offset(): number {
    return this.pos;
  }

  /** Span of the current pair's code line. */
  get codeSpan(): SourceSpan {
    return { start: this.codeStart, end: this.codeEnd };
  }

  /** Span of the current pair's value text. */
  get valueSpan(): SourceSpan {
    return { start: this.valueStart, end: this.valueEnd };
  }

  /** The value as written, trailing blanks trimmed. */
  get value(): string {
    return this.text.slice(this.valueStart, this.valueEnd);
  }

  /**
   * The value with leading blanks trimmed too (names, keywords), as `value.trim()`. A name of printable
   * ASCII ends comes from a small cache by the hash of its text: a million LINE keywords are one string.
   */
  get name(): string {
    const text = this.text;
    let start = this.valueStart;
    const end = this.valueEnd;
    while (start < end && (text.charCodeAt(start) === SPACE || text.charCodeAt(start) === TAB)) start++;
    if (start === end) return '';
    const first = text.charCodeAt(start), last = text.charCodeAt(end - 1);
    if (first <= SPACE || first >= 0x7f || last <= SPACE || last >= 0x7f) return this.value.trim();
    let h = 0x811c9dc5;
    for (let i = start; i < end; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
    const slot = (h ^ (h >>> 16)) & (NAME_CACHE_SIZE - 1);
    const cached = this.names[slot];
    if (cached !== undefined && cached.length === end - start && text.startsWith(cached, start)) return cached;
    return (this.names[slot] = text.slice(start, end));
  }

  /** Recently read names by the hash of their text. */
  private readonly names: (string | undefined)[] = new Array<string | undefined>(NAME_CACHE_SIZE).fill(undefined);

  /**
   * The value converted to a number, for group codes whose type is numeric (§6.2); NaN for string
   * codes and for values that are not numbers (those are reported at their line).
   */
  number = Number.NaN;

  report(span: SourceSpan, detail: string): void {
    this.problems.push({ checkId: 'parse-error', messageId: 'dxf', span, data: { detail } });
  }

  /** Start, end of text (blanks trimmed) and the start of the next line, of the line last read. */
  private lineStart = 0;
  private lineEnd = 0;
  private lineNext = 0;

  /** Reads the next line from `pos` into lineStart/lineEnd/lineNext; false at the end of the text. */
  private readLine(): boolean {
    const text = this.text;
    const start = this.pos;
    if (start >= text.length) return false;
    let nl = text.indexOf('\n', start);
    let next: number;
    if (nl < 0) {
      nl = text.length;
      next = text.length;
    } else {
      next = nl + 1;
    }
    let end = nl;
    while (end > start && isBlank(text.charCodeAt(end - 1))) end--;
    this.pos = next;
    this.line++;
    this.lineStart = start;
    this.lineEnd = end;
    this.lineNext = next;
    return true;
  }

  /**
   * Advances to the next group pair. Returns false at the end of the text.
   *
   * The common pair (a code line of digits after optional spaces, a value line ending in LF, a numeric
   * value a plain decimal) is read in one pass over its characters, the number parsed as `parseDecimal`
   * does; any other pair is read by `nextPair` from the same place.
   */
  next(): boolean {
    const text = this.text;
    const n = text.length;
    const cs = this.pos;
    let i = cs;
    let c = i < n ? text.charCodeAt(i) : -1;
    while (c === SPACE) c = ++i < n ? text.charCodeAt(i) : -1;
    const digitsAt = i;
    let code = 0;
    while (c >= 48 && c <= 57) {
      code = code * 10 + (c - 48);
      c = ++i < n ? text.charCodeAt(i) : -1;
    }
    const ce = i;
    while (c === SPACE || c === TAB || c === CR) c = ++i < n ? text.charCodeAt(i) : -1;
    // A code line of digits ending in LF, and a value line after it.
    if (ce === digitsAt || c !== LF || i + 1 >= n) return this.nextPair();
    const vs = i + 1;
    const kind = code < KIND_TABLE_SIZE ? KIND_TABLE[code] : 0;
    // The value line's trimmed end, −1 until known.
    let ve = -1;
    let value = Number.NaN;
    let parsed = kind === 0;
    i = vs;
    if (kind !== 0) {
      // The number as parseDecimal reads it: blanks, sign, digits, point, digits, then only blanks.
      c = text.charCodeAt(i);
      while (c === SPACE || c === TAB) c = ++i < n ? text.charCodeAt(i) : -1;
      const sign = c;
      if (c === MINUS || c === PLUS) c = ++i < n ? text.charCodeAt(i) : -1;
      let m = 0, digits = 0, decimals = 0;
      while (c >= 48 && c <= 57) {
        m = m * 10 + (c - 48);
        digits++;
        c = ++i < n ? text.charCodeAt(i) : -1;
      }
      if (c === POINT) {
        c = ++i < n ? text.charCodeAt(i) : -1;
        while (c >= 48 && c <= 57) {
          m = m * 10 + (c - 48);
          digits++;
          decimals++;
          c = ++i < n ? text.charCodeAt(i) : -1;
        }
      }
      const numberEnd = i;
      while (c === SPACE || c === TAB || c === CR) c = ++i < n ? text.charCodeAt(i) : -1;
      if ((c === LF || c === -1) && digits > 0) {
        ve = numberEnd;
        if (m < 2 ** 53 && decimals < POWERS_OF_TEN.length) {
          value = decimals === 0 ? m : m / POWERS_OF_TEN[decimals];
          if (sign === MINUS) value = -value;
          parsed = kind === 1 || Number.isInteger(value);
        }
      }
    }
    if (ve < 0) {
      // Any other value line: its end, trailing blanks trimmed (`convert` reads a number that is not plain).
      let nl = text.indexOf('\n', i);
      if (nl < 0) nl = n;
      i = nl;
      ve = nl;
      while (ve > vs && isBlank(text.charCodeAt(ve - 1))) ve--;
    }
    this.code = code;
    this.codeStart = cs;
    this.codeEnd = ce;
    this.codeLine = this.line;
    this.valueStart = vs;
    this.valueEnd = ve;
    this.pairEnd = i < n ? i + 1 : n;
    this.pos = this.pairEnd;
    this.line += 2;
    this.number = parsed ? value : this.convert(kind === 2);
    return true;
  }

  /** `next` for any pair: line by line, reporting what is malformed. */
  private nextPair(): boolean {
    for (;;) {
      // Skip blank lines between pairs only at the very end of the file (a trailing newline).
      if (!this.readLine()) return false;
      const cs = this.lineStart, ce = this.lineEnd;
      const lineNo = this.line - 1;
      if (ce === cs && this.restIsBlank()) return false;
      const code = parseCode(this.text, cs, ce);
      if (code < 0) {
        this.report({ start: cs, end: Math.max(ce, cs) },
          `line ${lineNo + 1} should hold a group code (an integer) but reads "${this.text.slice(cs, ce).trim()}"`);
        this.resync();
        continue;
      }
      if (!this.readLine()) {
        this.report({ start: cs, end: ce }, `group code ${code} on line ${lineNo + 1} has no value line (the file is truncated)`);
        return false;
      }
      this.code = code;
      this.codeStart = cs;
      this.codeEnd = ce;
      this.codeLine = lineNo;
      this.valueStart = this.lineStart;
      this.valueEnd = this.lineEnd;
      this.pairEnd = this.lineNext;
      this.number = code < KIND_TABLE_SIZE && KIND_TABLE[code] !== 0 ? this.convert(KIND_TABLE[code] === 2) : Number.NaN;
      return true;
    }
  }

  private convert(integer: boolean): number {
    const fast = parseDecimal(this.text, this.valueStart, this.valueEnd);
    if (!Number.isNaN(fast) && (!integer || Number.isInteger(fast))) return fast;
    const raw = this.text.slice(this.valueStart, this.valueEnd);
    // Number('') is 0: an empty value (trailing blanks are already trimmed) is not a number.
    const v = this.valueEnd > this.valueStart ? Number(raw) : Number.NaN;
    if (!Number.isFinite(v)) {
      this.report({ start: this.valueStart, end: this.valueEnd },
        `group ${this.code} on line ${this.codeLine + 1} needs a number, found "${raw.trim()}"`);
      return Number.NaN;
    }
    if (integer && !Number.isInteger(v)) {
      this.report({ start: this.valueStart, end: this.valueEnd },
        `group ${this.code} on line ${this.codeLine + 1} needs an integer, found "${raw.trim()}"`);
      return Number.NaN;
    }
    return v;
  }

  private restIsBlank(): boolean {
    const text = this.text;
    for (let i = this.pos; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (!isBlank(c) && c !== LF) return false;
    }
    return true;
  }

  /**
   * After a bad code line: skip to the next line that reads `0` and is followed by a keyword line
   * (`LINE`, `ENDSEC`, …), the start of the next entity or section; a value line `0` is not enough.
   */
  private resync(): void {
    for (;;) {
      const before = this.pos;
      const beforeLine = this.line;
      if (!this.readLine()) return;
      if (parseCode(this.text, this.lineStart, this.lineEnd) !== 0) continue;
      const afterCode = this.lineNext;
      if (!this.readLine()) return;
      if (/^[A-Z_$][A-Z0-9_$]*$/.test(this.text.slice(this.lineStart, this.lineEnd).trim())) {
        this.pos = before;
        this.line = beforeLine;
        return;
      }
      this.pos = afterCode;
      this.line = beforeLine + 1;
    }
  }
}

/** True when the text starts with the binary DXF sentinel (REFERENCES.md §6.6). */
export function isBinaryDxf(text: string): boolean {
  return text.startsWith(BINARY_DXF_SENTINEL.slice(0, 18));
}
