import { SaxesParser } from 'saxes';
import type { SourceSpan } from '../../types';
import { keepShape } from '../../keepShape';

/**
 * XML → a light element tree with exact source spans, using `saxes` for well-formedness.
 *
 * Positions: saxes's `position` is a plain index into the JavaScript string (UTF-16 code units, its
 * documentation of `position`/`columnIndex`), while its `column` counts code points. The whole text is
 * written as one chunk, so `position` is directly our offset. At `opentag` it points just past the `>`
 * of the start tag; the start tag's `<` is the last `<` before the tag name (a `<` cannot occur inside
 * a well-formed start tag, XML 1.0 [10] AttValue).
 *
 * Attribute values: saxes gives them decoded and whitespace-normalised (XML 1.0 §3.3.3). To place
 * spans inside a value we rescan the start tag ourselves for each value's raw text between the quotes.
 *
 * Errors: the first well-formedness error stops the scan (as browsers stop rendering an XML document
 * at its first error); every element whose start tag came before it is kept.
 */

export interface SvgAttribute {
  /** Decoded value (entities replaced, whitespace normalised) as saxes returns it. */
  readonly value: string;
  /** The raw value text between the quotes. */
  readonly span: SourceSpan;
}

export interface SvgElement {
  /** The name as written (`path`, `svg:path`, `inkscape:grid`). */
  readonly name: string;
  /** The start tag, from `<` to `>` inclusive. */
  readonly tagSpan: SourceSpan;
  readonly attributes: ReadonlyMap<string, SvgAttribute>;
  readonly children: readonly SvgElement[];
}

export interface XmlError {
  readonly span: SourceSpan;
  /** saxes's message without its `line:column:` prefix. */
  readonly detail: string;
}

export interface ScannedDocument {
  readonly root: SvgElement | null;
  /** Elements by `id`; the first in document order wins, as with getElementById. */
  readonly byId: ReadonlyMap<string, SvgElement>;
  /** General entities: the XML predefined ones plus those declared in the DOCTYPE's internal subset. */
  readonly entities: Readonly<Record<string, string>>;
  readonly error: XmlError | null;
}

interface MutableElement {
  name: string;
  tagSpan: SourceSpan;
  attributes: Map<string, SvgAttribute>;
  children: MutableElement[];
}

class ScanStopped extends Error {}

const PREDEFINED_ENTITIES: Readonly<Record<string, string>> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/**
 * General entities declared in a DOCTYPE internal subset: `<!ENTITY name "value">` (XML 1.0 §4.2;
 * parameter entities `%` and external entities are not expanded). Editors that export SVG with a DTD
 * (namespace URIs and style strings held in entities) rely on these.
 */
export function getDeclaredEntities(doctype: string): Record<string, string> {
  const entities: Record<string, string> = {};
  const re = /<!ENTITY[ \t\r\n]+([^\s%"'<>]+)[ \t\r\n]+(?:"([^"]*)"|'([^']*)')[ \t\r\n]*>/g;
  for (let m = re.exec(doctype); m; m = re.exec(doctype)) {
    const name = m[1]!;
    if (!(name in entities)) entities[name] = m[2] ?? m[3] ?? '';
  }
  return entities;
}

function isTagWhitespace(code: number): boolean {
  return code === 0x20 || code === 0x09 || code === 0x0a || code === 0x0d;
}

/**
 * Raw value spans of the attributes of the start tag text[start, end), keyed by name. The tag is
 * well-formed (saxes accepted it), so names and quotes are where XML 1.0 [40]–[41] puts them.
 */
function getAttributeSpans(text: string, start: number, end: number): Map<string, SourceSpan> {
  const spans = new Map<string, SourceSpan>();
  let i = start + 1;
  while (i < end && !isTagWhitespace(text.charCodeAt(i)) && text.charCodeAt(i) !== 0x2f && text.charCodeAt(i) !== 0x3e) i++;
  for (;;) {
    while (i < end && isTagWhitespace(text.charCodeAt(i))) i++;
    const c = text.charCodeAt(i);
    if (i >= end || c === 0x2f || c === 0x3e) break;
    const nameStart = i;
    while (i < end && text.charCodeAt(i) !== 0x3d && !isTagWhitespace(text.charCodeAt(i))) i++;
    const name = text.slice(nameStart, i);
    while (i < end && text.charCodeAt(i) !== 0x22 && text.charCodeAt(i) !== 0x27) i++;
    const quote = text[i];
    if (quote === undefined || i >= end) break;
    const valueStart = i + 1;
    let valueEnd = text.indexOf(quote, valueStart);
    if (valueEnd < 0 || valueEnd > end) valueEnd = end;
    spans.set(name, { start: valueStart, end: valueEnd });
    i = valueEnd + 1;
  }
  return spans;
}

/** The one-character span before `offset` (two for a surrogate pair), or an empty span at 0. */
function getSpanBefore(text: string, offset: number): SourceSpan {
  const end = Math.min(Math.max(offset, 0), text.length);
  if (end === 0) return { start: 0, end: Math.min(1, text.length) };
  const low = text.charCodeAt(end - 1);
  const start = end >= 2 && low >= 0xdc00 && low <= 0xdfff && (text.charCodeAt(end - 2) & 0xfc00) === 0xd800 ? end - 2 : end - 1;
  return { start, end };
}

/**
 * Attribute values at least this long (UTF-16 units) that hold only plain characters are checked by
 * scanDocument and not handed to saxes, which reads values one character at a time (~7 ns a
 * character here: 150 ms for a 20 MB `d`); shorter ones are not worth an extra chunk.
 * Source: common practice, no source.
 */
const LONG_VALUE = 4096;

/**
 * A value of printable ASCII without quotes, `<` or `&`, or tab, LF and CR: well-formed as an XML
 * attribute value (XML 1.0 [10] AttValue, [2] Char), and nothing in it needs decoding.
 */
const PLAIN_VALUE = /^[\t\n\r\x20\x21\x23-\x25\x28-\x3b\x3d-\x7e]*$/;

/** An attribute whose value kept from saxes is decoded on first use (attribute-value normalisation). */
class PlainAttribute implements SvgAttribute {
  private decoded: string | undefined;

  constructor(private readonly text: string, readonly span: SourceSpan) {}

  /** XML 1.0 §3.3.3: each tab, LF, CR or CR LF becomes one space (the value has no references). */
  get value(): string {
    this.decoded ??= this.text.slice(this.span.start, this.span.end).replace(/\r\n?|[\t\n]/g, ' ');
    return this.decoded;
  }
}

/** Thrown when a kept-back run turns out not to be one whole attribute value: scan again without. */
class KeptRunMisplaced extends Error {}

/**
 * Scans the document. Long plain attribute values (a path's `d` of megabytes) are not written to
 * saxes: the text is written in chunks that stop after such a value's opening quote and resume at its
 * closing quote, when saxes is inside a start tag there. saxes then sees an empty value; positions
 * after the gap are mapped back by the gap's length, the value gets its span from our own rescan of
 * the start tag and is decoded on first use. A run that is not exactly one attribute value (a `="`
 * inside another value) makes the scan start over without gaps.
 */
export function scanDocument(text: string): ScannedDocument {
  try {
    return scanDocumentInChunks(text, true);
  } catch (e) {
    if (!(e instanceof KeptRunMisplaced)) throw e;
    return scanDocumentInChunks(text, false);
  }
}

function scanDocumentInChunks(text: string, keepLongValues: boolean): ScannedDocument {
  // The latest parser is kept for its layout (keepShape.ts); it holds no more than the text.
  const parser = keepShape(new SaxesParser({ position: true }));
  const byId = new Map<string, SvgElement>();
  const stack: MutableElement[] = [];
  let root: MutableElement | null = null;
  let error: XmlError | null = null;
  let tagStartSearchFrom = 0;
  let entities: Record<string, string> = { ...PREDEFINED_ENTITIES };
  let closing = false;
  /** Text kept from saxes so far: saxes position + shift = offset in `text`. */
  let shift = 0;
  let inStartTag = false;
  /** Value spans kept from saxes in the current start tag. */
  const kept: SourceSpan[] = [];

  parser.on('doctype', (doctype) => {
    const declared = getDeclaredEntities(doctype);
    for (const [name, value] of Object.entries(declared)) {
      if (name in PREDEFINED_ENTITIES) continue;
      parser.ENTITIES[name] = value;
    }
    entities = { ...declared, ...PREDEFINED_ENTITIES };
  });
  parser.on('opentagstart', () => {
    tagStartSearchFrom = parser.position + shift - 1;
    inStartTag = true;
  });
  parser.on('opentag', (tag) => {
    inStartTag = false;
    const end = parser.position + shift;
    const start = Math.max(0, text.lastIndexOf('<', tagStartSearchFrom));
    const rawSpans = getAttributeSpans(text, start, end);
    const attributes = new Map<string, SvgAttribute>();
    for (const [name, value] of Object.entries(tag.attributes as Record<string, string>)) {
      attributes.set(name, { value, span: rawSpans.get(name) ?? { start, end } });
    }
    for (const span of kept) {
      const name = [...rawSpans].find(([, s]) => s.start === span.start && s.end === span.end)?.[0];
      if (name === undefined) throw new KeptRunMisplaced();
      attributes.set(name, new PlainAttribute(text, rawSpans.get(name)!));
    }
    kept.length = 0;
    const element: MutableElement = { name: tag.name, tagSpan: { start, end }, attributes, children: [] };
    const parent = stack[stack.length - 1];
    if (parent) parent.children.push(element);
    else root ??= element;
    const id = attributes.get('id')?.value;
    if (id !== undefined && !byId.has(id)) byId.set(id, element);
    stack.push(element);
  });
  parser.on('closetag', () => {
    stack.pop();
  });
  parser.on('error', (err) => {
    const detail = err.message.replace(/^\d+:\d+: /, '').replace(/\.$/, '');
    // At the end of input saxes reports unclosed elements: point at the innermost open start tag.
    const open = stack[stack.length - 1];
    const at = parser.position + shift;
    const span = closing && open && detail.startsWith('unclosed tag') ? open.tagSpan : getSpanBefore(text, at);
    error = { span, detail };
    throw new ScanStopped();
  });

  let written = 0;
  try {
    // Each `=`, optional whitespace and a quote may start a value (XML 1.0 [25] Eq, [10] AttValue).
    for (let eq = keepLongValues && text.length > LONG_VALUE ? text.indexOf('=') : -1; eq >= 0; eq = text.indexOf('=', eq + 1)) {
      let open = eq + 1;
      while (isTagWhitespace(text.charCodeAt(open))) open++;
      const quote = text[open++];
      if (quote !== '"' && quote !== "'") continue;
      const close = text.indexOf(quote, open);
      if (close < 0) break;
      if (close - open < LONG_VALUE || !PLAIN_VALUE.test(text.slice(open, close))) continue;
      parser.write(text.slice(written, open));
      written = open;
      eq = close;
      if (!inStartTag) continue;
      kept.push({ start: open, end: close });
      shift += close - open;
      written = close;
    }
    parser.write(written === 0 ? text : text.slice(written));
    closing = true;
    parser.close();
  } catch (e) {
    if (e instanceof KeptRunMisplaced) throw e;
    if (!(e instanceof ScanStopped)) {
      // saxes raised something other than a reported error: keep what was read, say where it stopped.
      error ??= { span: getSpanBefore(text, parser.position + shift), detail: e instanceof Error ? e.message : String(e) };
    }
  }
  return { root, byId, entities, error };
}

/** The character of a character reference, or undefined when the code point is not valid. */
function getCharacter(codePoint: number): string | undefined {
  return Number.isInteger(codePoint) && codePoint >= 0 && codePoint <= 0x10ffff ? String.fromCodePoint(codePoint) : undefined;
}

/** A decoded attribute value with, for each decoded index i, its raw offset `offsets[i]`. */
export interface DecodedValue {
  readonly value: string;
  /** Length value.length + 1: offsets[value.length] is the raw end. null when value is the raw text itself. */
  readonly offsets: Int32Array | null;
}

/**
 * The value of an attribute for position-keeping parsers (path data, points). Without entity or
 * character references it is the raw text itself (a slice, no decoding), so offsets are exact. With
 * them, references are decoded here and an offset table maps each decoded character back to the raw
 * text: a span that starts or ends at a decoded character lands on the start of its reference.
 * Whitespace is kept as written (path data and number lists treat any XML whitespace alike).
 */
export function getPositionedValue(text: string, attr: SvgAttribute, entities: Readonly<Record<string, string>>): DecodedValue {
  const { start, end } = attr.span;
  const raw = text.slice(start, end);
  // Search the slice, not `text` from `start`: an unbounded search would rescan the rest of the file
  // for every attribute.
  if (!raw.includes('&')) return { value: raw, offsets: null };
  let value = '';
  const offsets: number[] = [];
  let i = start;
  while (i < end) {
    const c = text.charCodeAt(i);
    if (c === 0x26) {
      const semi = text.indexOf(';', i);
      if (semi > i && semi < end) {
        const name = text.slice(i + 1, semi);
        let replacement: string | undefined;
        if (name.startsWith('#x')) replacement = getCharacter(parseInt(name.slice(2), 16));
        else if (name.startsWith('#')) replacement = getCharacter(parseInt(name.slice(1), 10));
        else replacement = entities[name];
        if (replacement !== undefined) {
          for (let k = 0; k < replacement.length; k++) offsets.push(i);
          value += replacement;
          i = semi + 1;
          continue;
        }
      }
    }
    offsets.push(i);
    value += text[i];
    i++;
  }
  offsets.push(end);
  return { value, offsets: Int32Array.from(offsets) };
}
