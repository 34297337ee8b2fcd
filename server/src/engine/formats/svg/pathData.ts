import type { Fix, Segment, SourceSpan } from '../../types';
import { arcFromSvgEndpoints, getSvgArcCentre, SVG_ARC, svgArcCentre } from '../../geometry/arc';
import { isIdentityMatrix, type Matrix } from '../../geometry/transform';
import { plainSegments, SegmentStore, withStoredSegments, type SegmentSink, type StoredSegments } from '../../model/packedSegment';
import { getCloseFix, type ArgumentGroup, type DrawCommand, type FollowingMoveto } from './closePath';
import { keepShape } from '../../keepShape';

/**
 * Position-keeping reader for SVG path data (the `d` attribute).
 *
 * Grammar: SVG 2 Paths chapter, "The grammar for path data" (#PathDataBNF), and SVG 1.1 §8.3.9
 * (REFERENCES §5.1). Numbers follow SVG 1.1 (`sign? (digits? '.' digits | digits '.'?) exponent?`,
 * so SVG 1.1's trailing point `23.` is accepted); separators are comma-wsp with at most one comma,
 * allowed between numbers and between argument groups but not after a command letter nor before
 * one; arc flags are the single characters `0`/`1`. Error handling: SVG 2 "Error handling in path
 * data" / SVG 1.1 Appendix F.5 (REFERENCES §5.2) — every complete argument group before the first
 * error is kept, the error is reported at the character where the grammar breaks, and reading stops.
 *
 * Speed: one pass over the data's code units as bytes (`getPathBytes`), no regular expressions, one
 * string slice only for numbers the exact fast path below cannot convert.
 */

/** One subpath of a `d` attribute; spans are file offsets. */
export interface PathSubpath {
  /**
   * Drawn segments, mapped by the matrix given to `parsePathData` (built once, in final
   * coordinates); H/V and zero-radius arcs are lines, arcs with coinciding ends zero-length lines.
   * Made on first read from `stored`, where the reader keeps them as numbers.
   */
  readonly segments: readonly Segment[];
  readonly stored: StoredSegments;
  /** Ended by Z/z. */
  closed: boolean;
  /** Start point (the moveto, or after a Z the previous subpath's start), user units (not mapped). */
  startX: number;
  startY: number;
  /** From the moveto letter (or the first drawing command after a Z) to the end of the last command, Z included. */
  span: SourceSpan;
  /** The moveto letter and its first coordinate pair; for a subpath that starts after a Z, its first argument group. */
  startSpan: SourceSpan;
  /** The last drawing command's last argument group (with its letter when it is the first group), or the Z. */
  endSpan: SourceSpan;
  /** Edits that close this subpath with no sliver (open subpaths with at least one segment). */
  closeFix?: Fix;
}

/** The first error in the data: where the grammar breaks and what was expected there (no trailing period). */
export interface PathDataError {
  span: SourceSpan;
  detail: string;
}

export interface ParsedPathData {
  subpaths: PathSubpath[];
  error?: PathDataError;
}

/**
 * Reads path data. `baseOffset` is the file offset of `d[0]`; every span returned is a file offset.
 * Segments are mapped by `matrix` as they are built (the arithmetic of `transformSegment`, one
 * object per segment), so a huge path is not copied a second time. Never throws: the first error
 * ends reading and is returned with what was read before it.
 */
export function parsePathData(d: string, baseOffset: number, matrix: Matrix | null = null): ParsedPathData {
  const parser = new PathDataParser(d, baseOffset, matrix !== null && !isIdentityMatrix(matrix) ? matrix : null);
  parser.run();
  const parsed = parser.error ? { subpaths: parser.subpaths, error: parser.error } : { subpaths: parser.subpaths };
  parser.release();
  return parsed;
}

// Character codes.
const TAB = 9, LF = 10, FF = 12, CR = 13, SPACE = 32, PLUS = 43, COMMA = 44, MINUS = 45, DOT = 46;
const DIGIT_0 = 48, DIGIT_1 = 49, DIGIT_9 = 57, UPPER_E = 69, LOWER_E = 101;
const UPPER_M = 77, LOWER_M = 109, UPPER_Z = 90, LOWER_Z = 122, LOWER_A = 97;

/** Segment kinds while a group is turned into a segment. */
const LINE = 0, QUAD = 1, CUBIC = 2, ARC = 3;

/** SVG 2 wsp: tab, line feed, form feed, carriage return, space. */
function isWsp(c: number): boolean {
  return c === SPACE || c === LF || c === CR || c === TAB || c === FF;
}

function isNumberStart(c: number): boolean {
  return (c >= DIGIT_0 && c <= DIGIT_9) || c === DOT || c === MINUS || c === PLUS;
}

/** Exact powers of ten up to 10^22, the largest one a double holds exactly. */
const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
  1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];
/** Most digits whose integer value is below 2^53, so it is exact in a double. */
const MAX_EXACT_DIGITS = 15;

/**
 * The drawing command (upper case) of a command letter's character code, or null for M, Z and
 * anything else: a table look-up instead of a string's toUpperCase per command.
 */
function getDrawCommand(code: number): DrawCommand | null {
  switch (code) {
    case 76: case 108: return 'L';
    case 72: case 104: return 'H';
    case 86: case 118: return 'V';
    case 67: case 99: return 'C';
    case 83: case 115: return 'S';
    case 81: case 113: return 'Q';
    case 84: case 116: return 'T';
    case 65: case 97: return 'A';
    default: return null;
  }
}

/** Number of arguments per group, by upper-case command letter. */
function getArity(upper: string): number {
  switch (upper) {
    case 'M': case 'L': case 'T': return 2;
    case 'H': case 'V': return 1;
    case 'C': return 6;
    case 'S': case 'Q': return 4;
    case 'A': return 7;
    default: return 0;
  }
}

interface SubpathBuilder {
  /** Position in the store of the subpath's first segment. */
  first: number;
  closed: boolean;
  startX: number;
  startY: number;
  spanStart: number; // local offset
  spanEnd: number;   // local offset
  startSpan: SourceSpan;
  /** The endSpan's local offsets: a span object for each command would be garbage but for the last. */
  endStart: number;
  endEnd: number;
}

const ENCODER = new TextEncoder();
const NO_BYTES = new Uint8Array(0);
const NO_SEGMENTS = new SegmentStore(0);

/**
 * One byte per UTF-16 code unit of `d`: the unit itself when it is ASCII, 0xFF (which no path data
 * character is) when not, so offsets stay those of the string and the reader meets a non-ASCII
 * character as the error it is. Reading bytes is about twice as fast as `charCodeAt` on the slice of
 * a document's text that `d` usually is (7.5–9.4 → 3.2–3.5 ms over the digits of 1e5 line commands);
 * making them costs ~2 ms there. Path data is nearly always ASCII: one encoding call.
 */
function getPathBytes(d: string): Uint8Array {
  const bytes = new Uint8Array(d.length);
  const { read, written } = ENCODER.encodeInto(d, bytes);
  if (read === d.length && written === d.length) return bytes;
  for (let i = 0; i < d.length; i++) {
    const c = d.charCodeAt(i);
    bytes[i] = c < 0x80 ? c : 0xff;
  }
  return bytes;
}

class PathDataParser {
  subpaths: PathSubpath[] = [];
  error: PathDataError | undefined;

  private readonly n: number;
  private i = 0;
  /** Current point and current subpath's start point. */
  private cx = 0;
  private cy = 0;
  private sx = 0;
  private sy = 0;
  /** Previous command's last control point, for S/T reflection: 1 after C/S, 2 after Q/T, 0 otherwise. */
  private ctrlKind = 0;
  private px = 0;
  private py = 0;
  private sub: SubpathBuilder | null = null;

  /** The argument group being read and the last complete one (buffers swapped after each group). */
  private args = new Float64Array(7);
  private tokStart = new Int32Array(7);
  private tokEnd = new Int32Array(7);
  private lastArgs = new Float64Array(7);
  private lastTokStart = new Int32Array(7);
  private lastTokEnd = new Int32Array(7);
  private lastCommand: DrawCommand = 'L';
  private lastRelative = false;
  private lastStart = 0;
  private lastEnd = 0;
  /**
   * The last segment in user units (the close fix edits the text, so it works before the matrix):
   * its kind, and x1, y1, x2, y2 (control points), its end point x, y and its start point x0, y0 as
   * read. The segment builders read its numbers from here: a double passed to a function that is
   * not inlined is boxed on the heap (~32 B a segment, a million segments' garbage).
   */
  private lastKind = LINE;
  private readonly lastPoints = new Float64Array(8);

  /** Where the drawn segments go; its first chunk of coordinates is sized at one coordinate per two
   *  characters of path data (typical data needs less; more chunks come as needed). */
  private store: SegmentStore;

  /** The data's code units as bytes, read instead of the string (see getPathBytes). */
  private codes: Uint8Array;

  constructor(private d: string, private readonly base: number, private readonly matrix: Matrix | null) {
    this.n = d.length;
    this.codes = getPathBytes(d);
    this.store = new SegmentStore(d.length >> 1);
    keepShape(this);
  }

  /** Drops the path read (text, subpaths, coordinates): the latest parser is kept for its layout
   *  (keepShape.ts), not its data. */
  release(): void {
    this.d = '';
    this.codes = NO_BYTES;
    this.subpaths = [];
    this.error = undefined;
    this.sub = null;
    this.store = NO_SEGMENTS;
  }

  run(): void {
    this.skipWsp();
    if (this.i >= this.n) return; // empty: rendering disabled, no error (SVG 2 Paths, 'd' property)
    if (this.isNone()) return;
    const first = this.codes[this.i]!;
    if (first !== UPPER_M && first !== LOWER_M) {
      this.failAtChar(this.i, `path data must start with a moveto ('M' or 'm'), found ${this.describe(this.i)}`);
      return;
    }
    let afterGroups = false;
    let afterClose = false;
    for (;;) {
      this.skipWsp();
      if (this.i >= this.n) break;
      const at = this.i;
      const c = this.codes[at]!;
      let ok: boolean;
      if (c === UPPER_M || c === LOWER_M) {
        ok = this.readMoveto(c === LOWER_M, at);
        afterGroups = true;
        afterClose = false;
      } else if (c === UPPER_Z || c === LOWER_Z) {
        this.readClosepath(at);
        ok = true;
        afterGroups = false;
        afterClose = true;
      } else {
        const upper = getDrawCommand(c);
        if (upper !== null) {
          if (afterClose) this.finishSubpath(null); // a drawing command after Z starts a new subpath
          this.i = at + 1;
          this.skipWsp(); // a command letter may be followed by wsp only
          ok = this.readGroups(upper, c >= LOWER_A, at);
          afterGroups = true;
          afterClose = false;
        } else {
          const what = afterGroups ? 'a number or a command letter' : afterClose ? "a command letter after 'Z'" : 'a command letter';
          this.failAtChar(at, `expected ${what}, found ${this.describe(at)}`);
          ok = false;
        }
      }
      if (!ok) break;
    }
    this.finishSubpath(null);
  }

  /** True when the whole data is the keyword `none` (ASCII case-insensitive, surrounding wsp allowed). */
  private isNone(): boolean {
    const codes = this.codes;
    let end = this.n;
    while (end > this.i && isWsp(codes[end - 1]!)) end--;
    return end - this.i === 4 && this.d.slice(this.i, end).toLowerCase() === 'none';
  }

  private skipWsp(): void {
    const codes = this.codes, n = this.n;
    let i = this.i;
    while (i < n && isWsp(codes[i]!)) i++;
    this.i = i;
  }

  /** Skips comma-wsp? (wsp with at most one comma); returns true when it consumed a comma. */
  private skipCommaWsp(): boolean {
    const codes = this.codes, n = this.n;
    let i = this.i;
    while (i < n && isWsp(codes[i]!)) i++;
    let comma = false;
    if (i < n && codes[i] === COMMA) {
      comma = true;
      i++;
      while (i < n && isWsp(codes[i]!)) i++;
    }
    this.i = i;
    return comma;
  }

  /** Reads a moveto: its first pair starts a subpath, further pairs are implicit linetos. */
  private readMoveto(relative: boolean, letter: number): boolean {
    this.i = letter + 1;
    this.skipWsp();
    const cmd = relative ? 'm' : 'M';
    if (!this.readNumber(cmd, 0)) return false;
    this.skipCommaWsp();
    if (!this.readNumber(cmd, 1)) return false;
    const x = relative ? this.cx + this.args[0] : this.args[0];
    const y = relative ? this.cy + this.args[1] : this.args[1];
    const pairEnd = this.i;
    const comma = this.skipCommaWsp();
    const restStart = this.i < this.n && isNumberStart(this.codes[this.i]!) ? this.i : -1;
    this.finishSubpath(relative ? { letterStart: letter, pairEnd, restStart, x, y } : null);
    this.sub = {
      first: this.store.count,
      closed: false,
      startX: x,
      startY: y,
      spanStart: letter,
      spanEnd: pairEnd,
      startSpan: this.span(letter, pairEnd),
      endStart: letter,
      endEnd: pairEnd,
    };
    this.cx = this.sx = x;
    this.cy = this.sy = y;
    this.ctrlKind = 0;
    if (restStart >= 0) return this.readGroups('L', relative, restStart);
    if (comma) {
      this.failAtChar(this.i, `expected a number after ',' in '${cmd}', found ${this.describe(this.i)}`);
      return false;
    }
    return true;
  }

  private readClosepath(letter: number): void {
    this.i = letter + 1;
    const sub = this.sub;
    if (sub) {
      sub.closed = true;
      sub.spanEnd = this.i;
      sub.endStart = letter;
      sub.endEnd = this.i;
    }
    this.cx = this.sx;
    this.cy = this.sy;
    this.ctrlKind = 0;
  }

  /**
   * Reads argument groups of one command, starting at `this.i`, until something other than a
   * number follows. `groupStart` is where the first group's text starts (its letter, if any).
   */
  private readGroups(cmd: DrawCommand, relative: boolean, groupStart: number): boolean {
    const codes = this.codes, n = this.n;
    const arity = getArity(cmd);
    const name = relative ? cmd.toLowerCase() : cmd;
    let start = groupStart;
    for (;;) {
      for (let k = 0; k < arity; k++) {
        if (k > 0) this.skipCommaWsp();
        const ok = cmd === 'A' && (k === 3 || k === 4) ? this.readFlag(name, k) : this.readNumber(name, k);
        if (!ok) return false;
      }
      this.emit(cmd, relative, start, this.i);
      const comma = this.skipCommaWsp();
      if (this.i < n && isNumberStart(codes[this.i]!)) {
        start = this.i;
        continue;
      }
      if (comma) {
        this.failAtChar(this.i, `expected a number after ',' in '${name}', found ${this.describe(this.i)}`);
        return false;
      }
      return true;
    }
  }

  /** Reads an arc flag, the single character 0 or 1 (no separator needed after it). */
  private readFlag(name: string, k: number): boolean {
    const c = this.i < this.n ? this.codes[this.i]! : -1;
    if (c !== DIGIT_0 && c !== DIGIT_1) {
      this.failAtChar(this.i, `expected an arc flag (0 or 1) in '${name}', found ${this.describe(this.i)}`);
      return false;
    }
    this.args[k] = c - DIGIT_0;
    this.tokStart[k] = this.i;
    this.tokEnd[k] = ++this.i;
    return true;
  }

  /** Reads one number into args[k]; on failure records the error and returns false. */
  private readNumber(name: string, k: number): boolean {
    const codes = this.codes, n = this.n;
    const s = this.i;
    let i = s;
    let c = i < n ? codes[i]! : -1;
    if (!isNumberStart(c)) {
      this.failAtChar(s, `expected a number in '${name}', found ${this.describe(s)}`);
      return false;
    }
    let negative = false;
    if (c === MINUS || c === PLUS) {
      negative = c === MINUS;
      c = ++i < n ? codes[i]! : -1;
    }
    let mantissa = 0;
    let digits = 0;
    let fraction = 0;
    while (c >= DIGIT_0 && c <= DIGIT_9) {
      mantissa = mantissa * 10 + (c - DIGIT_0);
      digits++;
      c = ++i < n ? codes[i]! : -1;
    }
    if (c === DOT) {
      c = ++i < n ? codes[i]! : -1;
      while (c >= DIGIT_0 && c <= DIGIT_9) {
        mantissa = mantissa * 10 + (c - DIGIT_0);
        digits++;
        fraction++;
        c = ++i < n ? codes[i]! : -1;
      }
    }
    if (digits === 0) {
      this.fail(s, i, `'${this.d.slice(s, i)}' is not a number (it has no digits)`);
      return false;
    }
    let exponent = false;
    if (c === LOWER_E || c === UPPER_E) {
      exponent = true;
      c = ++i < n ? codes[i]! : -1;
      if (c === MINUS || c === PLUS) c = ++i < n ? codes[i]! : -1;
      if (!(c >= DIGIT_0 && c <= DIGIT_9)) {
        this.fail(s, i, `'${this.d.slice(s, i)}' is not a number (its exponent has no digits)`);
        return false;
      }
      while (c >= DIGIT_0 && c <= DIGIT_9) c = ++i < n ? codes[i]! : -1;
    }
    let value: number;
    if (!exponent && digits <= MAX_EXACT_DIGITS) {
      // Both operands are exact doubles, so the one division is correctly rounded: the same
      // double as Number(text) (IEEE 754 §5.1; the classic exact fast path of decimal conversion).
      value = fraction === 0 ? mantissa : mantissa / POW10[fraction]!;
      if (negative) value = -value;
    } else {
      const text = this.d.slice(s, i);
      value = Number(text);
      if (!Number.isFinite(value)) {
        this.fail(s, i, `the number '${text}' is too large`);
        return false;
      }
    }
    this.args[k] = value;
    this.tokStart[k] = s;
    this.tokEnd[k] = i;
    this.i = i;
    return true;
  }

  /** Turns the complete group in `args` into a segment and moves the current point. */
  private emit(cmd: DrawCommand, relative: boolean, start: number, end: number): void {
    const a = this.args;
    const p = this.lastPoints;
    const x0 = this.cx, y0 = this.cy;
    const ox = relative ? x0 : 0, oy = relative ? y0 : 0;
    let kind: number;
    let x: number, y: number;
    switch (cmd) {
      case 'L':
        x = ox + a[0]!; y = oy + a[1]!;
        kind = LINE;
        this.ctrlKind = 0;
        break;
      case 'H':
        x = ox + a[0]!; y = y0;
        kind = LINE;
        this.ctrlKind = 0;
        break;
      case 'V':
        x = x0; y = oy + a[0]!;
        kind = LINE;
        this.ctrlKind = 0;
        break;
      case 'C':
        p[0] = ox + a[0]!; p[1] = oy + a[1]!;
        p[2] = ox + a[2]!; p[3] = oy + a[3]!;
        x = ox + a[4]!; y = oy + a[5]!;
        kind = CUBIC;
        this.ctrlKind = 1; this.px = p[2]!; this.py = p[3]!;
        break;
      case 'S':
        // First control point: the previous C/S second control point reflected about the current point.
        p[0] = this.ctrlKind === 1 ? 2 * x0 - this.px : x0;
        p[1] = this.ctrlKind === 1 ? 2 * y0 - this.py : y0;
        p[2] = ox + a[0]!; p[3] = oy + a[1]!;
        x = ox + a[2]!; y = oy + a[3]!;
        kind = CUBIC;
        this.ctrlKind = 1; this.px = p[2]!; this.py = p[3]!;
        break;
      case 'Q':
        p[0] = ox + a[0]!; p[1] = oy + a[1]!;
        x = ox + a[2]!; y = oy + a[3]!;
        kind = QUAD;
        this.ctrlKind = 2; this.px = p[0]!; this.py = p[1]!;
        break;
      case 'T':
        // Control point: the previous Q/T control point reflected about the current point.
        p[0] = this.ctrlKind === 2 ? 2 * x0 - this.px : x0;
        p[1] = this.ctrlKind === 2 ? 2 * y0 - this.py : y0;
        x = ox + a[0]!; y = oy + a[1]!;
        kind = QUAD;
        this.ctrlKind = 2; this.px = p[0]!; this.py = p[1]!;
        break;
      case 'A':
        x = ox + a[5]!; y = oy + a[6]!;
        // Coinciding ends: kept as a zero-length line; a zero radius: a line (SVG 1.1 F.6.2).
        kind = getSvgArcCentre(x0, y0, a[0]!, a[1]!, a[2]!, a[3] === 1, a[4] === 1, x, y) === SVG_ARC ? ARC : LINE;
        this.ctrlKind = 0;
        break;
    }
    p[4] = x; p[5] = y; p[6] = x0; p[7] = y0;
    this.lastKind = kind;
    let sub = this.sub;
    if (sub === null) {
      // First drawing command after a Z: a new subpath from the previous subpath's start.
      sub = this.sub = {
        first: this.store.count, closed: false, startX: this.sx, startY: this.sy,
        spanStart: start, spanEnd: end, startSpan: this.span(start, end), endStart: start, endEnd: end,
      };
    }
    const spanStart = this.base + start, spanEnd = this.base + end;
    if (this.matrix === null) this.buildSegment(kind, spanStart, spanEnd, this.store);
    else this.buildMappedSegment(kind, spanStart, spanEnd, this.matrix);
    sub.spanEnd = end;
    sub.endStart = start;
    sub.endEnd = end;
    this.cx = x;
    this.cy = y;
    // Remember this group for the close fix; swap the buffers so the next group cannot overwrite it.
    const args = this.args, ts = this.tokStart, te = this.tokEnd;
    this.args = this.lastArgs; this.tokStart = this.lastTokStart; this.tokEnd = this.lastTokEnd;
    this.lastArgs = args; this.lastTokStart = ts; this.lastTokEnd = te;
    this.lastCommand = cmd;
    this.lastRelative = relative;
    this.lastStart = start;
    this.lastEnd = end;
  }

  /** The segment of kind `kind` in lastPoints (and svgArcCentre for arcs), as read, given to `sink`. */
  private buildSegment<T>(kind: number, spanStart: number, spanEnd: number, sink: SegmentSink<T>): T {
    const p = this.lastPoints, x0 = p[6]!, y0 = p[7]!;
    switch (kind) {
      case QUAD:
        return sink.quad(x0, y0, p[0]!, p[1]!, p[4]!, p[5]!, spanStart, spanEnd);
      case CUBIC:
        return sink.cubic(x0, y0, p[0]!, p[1]!, p[2]!, p[3]!, p[4]!, p[5]!, spanStart, spanEnd);
      case ARC: {
        const c = svgArcCentre;
        return sink.arc(x0, y0, p[4]!, p[5]!, c[0]!, c[1]!, c[2]!, c[3]!, c[4]!, c[5]!, c[6]!, c[7]!, spanStart, spanEnd);
      }
      default:
        return sink.line(x0, y0, p[4]!, p[5]!, spanStart, spanEnd);
    }
  }

  /** buildSegment's segment mapped by m, stored once (the same arithmetic as transformSegment). */
  private buildMappedSegment(kind: number, spanStart: number, spanEnd: number, m: Matrix): void {
    const [a, b, c, d, e, f] = m;
    const p = this.lastPoints, w = this.store, x0 = p[6]!, y0 = p[7]!;
    const mx0 = a * x0 + c * y0 + e, my0 = b * x0 + d * y0 + f;
    const mx = a * p[4]! + c * p[5]! + e, my = b * p[4]! + d * p[5]! + f;
    switch (kind) {
      case QUAD:
        return w.quad(mx0, my0, a * p[0]! + c * p[1]! + e, b * p[0]! + d * p[1]! + f, mx, my, spanStart, spanEnd);
      case CUBIC:
        return w.cubic(
          mx0, my0,
          a * p[0]! + c * p[1]! + e, b * p[0]! + d * p[1]! + f,
          a * p[2]! + c * p[3]! + e, b * p[2]! + d * p[3]! + f,
          mx, my, spanStart, spanEnd,
        );
      case ARC: {
        const k = svgArcCentre;
        return w.arc(
          mx0, my0, mx, my,
          a * k[0]! + c * k[1]! + e, b * k[0]! + d * k[1]! + f,
          a * k[2]! + c * k[3]!, b * k[2]! + d * k[3]!,
          a * k[4]! + c * k[5]!, b * k[4]! + d * k[5]!,
          k[6]!, k[7]!, spanStart, spanEnd,
        );
      }
      default:
        return w.line(mx0, my0, mx, my, spanStart, spanEnd);
    }
  }

  /** Ends the current subpath; `next` describes a relative moveto that follows it directly. */
  private finishSubpath(next: FollowingMoveto | null): void {
    const sub = this.sub;
    if (sub === null) return;
    this.sub = null;
    const count = this.store.count - sub.first;
    const result: PathSubpath = withStoredSegments({
      closed: sub.closed,
      startX: sub.startX,
      startY: sub.startY,
      span: this.span(sub.spanStart, sub.spanEnd),
      startSpan: sub.startSpan,
      endSpan: this.span(sub.endStart, sub.endEnd),
    }, { store: this.store, first: sub.first, count });
    if (!sub.closed && count > 0) {
      const arity = getArity(this.lastCommand);
      const group: ArgumentGroup = {
        command: this.lastCommand,
        relative: this.lastRelative,
        start: this.lastStart,
        end: this.lastEnd,
        args: Array.from(this.lastArgs.subarray(0, arity)),
        tokenStarts: Array.from(this.lastTokStart.subarray(0, arity)),
        tokenEnds: Array.from(this.lastTokEnd.subarray(0, arity)),
        x0: this.lastPoints[6]!,
        y0: this.lastPoints[7]!,
      };
      const last = this.lastKind === ARC
        ? arcFromSvgEndpoints(group.x0, group.y0, group.args[0]!, group.args[1]!, group.args[2]!, group.args[3] === 1, group.args[4] === 1, this.lastPoints[4]!, this.lastPoints[5]!, this.span(this.lastStart, this.lastEnd))!
        : this.buildSegment(this.lastKind, this.base + this.lastStart, this.base + this.lastEnd, plainSegments);
      result.closeFix = getCloseFix(this.d, this.base, sub.startX, sub.startY, last, group, next);
    }
    this.subpaths.push(result);
  }

  private span(start: number, end: number): SourceSpan {
    return { start: this.base + start, end: this.base + end };
  }

  /** The character at `at` quoted for a message, or "the end of the path data". */
  private describe(at: number): string {
    if (at >= this.n) return 'the end of the path data';
    return `'${String.fromCodePoint(this.d.codePointAt(at)!)}'`;
  }

  /** Error at one character (a whole code point), or an empty span at the end of the data. */
  private failAtChar(at: number, detail: string): void {
    const end = at >= this.n ? at : at + (this.d.codePointAt(at)! > 0xffff ? 2 : 1);
    this.fail(at, end, detail);
  }

  private fail(start: number, end: number, detail: string): void {
    if (this.error === undefined) this.error = { span: this.span(start, end), detail };
  }
}
