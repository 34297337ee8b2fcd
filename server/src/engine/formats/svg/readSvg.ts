import {
  getTranslationMatrix, multiplyMatrices, transformPoint, transformSegments, type Matrix,
} from '../../geometry/transform';
import type {
  AssumedUnit, Contour, Fix, RawFinding, ReadResult, Segment, SourceSpan, UnitsInfo,
} from '../../types';
import { withSpan, withStoredSegments, type StoredSegments } from '../../model/packedSegment';
import { parsePathData } from './pathData';
import { getPositionedValue, scanDocument, type ScannedDocument, type SvgElement } from './scan';
import { BASIC_SHAPES, getShapeOutline, readLength, type LengthContext } from './shapes';
import { parseTransformList } from './transform';
import {
  DEFAULT_ASPECT_RATIO, MM_PER_UNIT, getRootUnits, getViewBoxMatrix, parseLength, parsePreserveAspectRatio,
  parseViewBox, type AspectRatio, type Length, type ViewBox,
} from './units';

/**
 * Reads an SVG document into contours in mm (SVG's own axes: y down from the top-left corner of the
 * outermost viewport).
 *
 * What is drawn: path, rect, circle, ellipse, line, polyline and polygon inside svg, g, a, switch (its
 * first child without unmet requiredExtensions) and use. Never drawn: anything else — defs, symbol
 * (unless used), clipPath, mask, pattern, marker, metadata, title, desc, style, script, foreignObject,
 * text — and elements with display="none" (attribute or inline style) or under one. `visibility` and
 * clipping (nested viewports, clip paths) do not change what a cutter cuts here and are ignored.
 * Style sheets (`<style>` rules) are not applied. Elements with a namespace prefix (`svg:path`) are
 * not recognised.
 *
 * `use`: the instance's contours keep the spans of the referenced element's text (the user sees and
 * edits the original), while `elementSpan` is the outermost `use` start tag that placed them (the
 * instance's place in the document). A use that is part of a reference cycle is reported and not drawn.
 *
 * Bad input never throws: malformed XML stops the read at the first error (everything before it is
 * drawn); invalid attribute values are reported and treated as missing.
 */
export function readSvg(text: string, options: { assumedUnit: AssumedUnit }): ReadResult {
  const reader = new SvgReader(text, scanDocument(text), options.assumedUnit);
  return reader.read();
}

/**
 * Elements instantiated through `use` before the reader stops expanding them: a guard against
 * documents whose nested uses multiply exponentially (10 levels × 10 uses = 10¹⁰ shapes).
 * Source: common practice, no source; far above any real cutting file.
 */
const MAX_USE_INSTANCES = 100_000;

/**
 * Elements nested deeper than this, counting through use instances, are not drawn: the walk is
 * recursive, and some 4000 levels exhaust the call stack. Drawings nest a few dozen levels.
 * Source: common practice, no source.
 */
const MAX_NESTING_DEPTH = 512;

interface WalkState {
  /** User units of the current element's parent coordinate system → mm. */
  readonly matrix: Matrix;
  readonly viewportWidth: number | null;
  readonly viewportHeight: number | null;
  /** The outermost `use` start tag when inside a use instance. */
  readonly useSpan: SourceSpan | null;
}

const SVG_HREF_NAMES = ['href', 'xlink:href'] as const;

/** The `reportError` of a valid or absent `transform`. */
const NOTHING_TO_REPORT = (): void => {};

/** display from the attribute, overridden by an inline style declaration (CSS cascade: style wins). */
function isDisplayNone(el: SvgElement): boolean {
  let display = el.attributes.get('display')?.value.trim();
  const style = el.attributes.get('style')?.value;
  if (style !== undefined && style.includes('display')) {
    for (const declaration of style.split(';')) {
      const colon = declaration.indexOf(':');
      if (colon < 0 || declaration.slice(0, colon).trim().toLowerCase() !== 'display') continue;
      display = declaration.slice(colon + 1).replace(/!\s*important\s*$/i, '').trim();
    }
  }
  return display?.toLowerCase() === 'none';
}

class SvgReader {
  private readonly contours: Contour[] = [];
  private readonly problems: RawFinding[] = [];
  private readonly reported = new Set<string>();
  private readonly circularUse = new Map<SvgElement, boolean>();
  private useInstances = 0;
  /** Elements being walked, the current one included; the first one past MAX_NESTING_DEPTH is reported. */
  private depth = 0;
  private depthReported = false;

  constructor(
    private readonly text: string,
    private readonly doc: ScannedDocument,
    private readonly assumedUnit: AssumedUnit,
  ) {}

  read(): ReadResult {
    const { doc } = this;
    if (doc.error) this.report('xml', doc.error.span, { detail: doc.error.detail });
    const root = doc.root;
    let units: UnitsInfo;
    if (root?.name === 'svg') {
      units = this.readRoot(root);
    } else {
      const unit = this.assumedUnit === 'auto' ? 'px' : this.assumedUnit;
      const span = root ? root.tagSpan : { start: 0, end: 0 };
      units = { declared: false, mmPerUnit: MM_PER_UNIT[unit], assumed: unit, span };
      if (root) this.report('unsupported', root.tagSpan, { detail: `the root element is <${root.name}>, not <svg>` });
    }
    return { format: 'svg', yAxis: 'down', units, contours: this.contours, problems: this.problems };
  }

  // ── problems ────────────────────────────────────────────────────────────────────────────────

  /** Adds a parse-error finding once (a shape drawn by several `use`s reports its problem once). */
  private report(messageId: string, span: SourceSpan, data: Record<string, string>): void {
    const key = `${messageId}\u0000${span.start}\u0000${span.end}\u0000${Object.values(data).join('\u0000')}`;
    if (this.reported.has(key)) return;
    this.reported.add(key);
    this.problems.push({ checkId: 'parse-error', messageId, span, data });
  }

  private lengthContext(state: Pick<WalkState, 'viewportWidth' | 'viewportHeight'>): LengthContext {
    return {
      text: this.text,
      entities: this.doc.entities,
      viewportWidth: state.viewportWidth,
      viewportHeight: state.viewportHeight,
      reportValue: (attribute, span, detail) => this.report('value', span, { attribute, detail }),
    };
  }

  // ── viewports and transforms ────────────────────────────────────────────────────────────────

  /**
   * The element's CTM from its parent's `matrix` and its `transform` attribute, and how to report an
   * invalid list, which is ignored (as browsers do): at once (`withTransform`), or by a path only when
   * it draws something.
   */
  private applyTransform(el: SvgElement, matrix: Matrix): { matrix: Matrix; reportError: () => void } {
    const attr = el.attributes.get('transform');
    if (!attr) return { matrix, reportError: NOTHING_TO_REPORT };
    const result = parseTransformList(attr.value);
    if (!('error' in result)) return { matrix: multiplyMatrices(matrix, result.matrix), reportError: NOTHING_TO_REPORT };
    return { matrix, reportError: () => this.report('value', attr.span, { attribute: 'transform', detail: result.error }) };
  }

  /** The element's CTM; an invalid `transform` is reported and ignored. */
  private withTransform(el: SvgElement, matrix: Matrix): Matrix {
    const t = this.applyTransform(el, matrix);
    t.reportError();
    return t.matrix;
  }

  private readViewBox(el: SvgElement): ViewBox | undefined {
    const attr = el.attributes.get('viewBox');
    if (!attr) return undefined;
    const vb = parseViewBox(attr.value);
    if ('error' in vb) {
      this.report('value', attr.span, { attribute: 'viewBox', detail: vb.error });
      return undefined;
    }
    return vb;
  }

  private readAspectRatio(el: SvgElement): AspectRatio {
    const attr = el.attributes.get('preserveAspectRatio');
    if (!attr) return DEFAULT_ASPECT_RATIO;
    const ar = parsePreserveAspectRatio(attr.value);
    if ('error' in ar) {
      this.report('value', attr.span, { attribute: 'preserveAspectRatio', detail: ar.error });
      return DEFAULT_ASPECT_RATIO;
    }
    return ar;
  }

  /** width/height of the outermost svg: missing, `auto`, invalid or negative → undefined. */
  private readRootLength(el: SvgElement, name: string): Length | undefined {
    const attr = el.attributes.get(name);
    if (!attr || attr.value.trim() === 'auto') return undefined;
    const length = parseLength(attr.value);
    if ('error' in length) {
      this.report('value', attr.span, { attribute: name, detail: length.error });
      return undefined;
    }
    if ((length.kind === 'absolute' ? length.value : length.percent) < 0) {
      this.report('value', attr.span, { attribute: name, detail: 'a negative value' });
      return undefined;
    }
    return length;
  }

  private readRoot(root: SvgElement): UnitsInfo {
    const rootUnits = getRootUnits({
      width: this.readRootLength(root, 'width'),
      height: this.readRootLength(root, 'height'),
      viewBox: this.readViewBox(root),
      aspectRatio: this.readAspectRatio(root),
      assumedUnit: this.assumedUnit,
      span: root.tagSpan,
    });
    if (!rootUnits.disabled && !isDisplayNone(root)) {
      // SVG 2 allows `transform` on svg; on the outermost one it is applied to the content, in user units.
      const state: WalkState = {
        matrix: this.withTransform(root, rootUnits.matrix),
        viewportWidth: rootUnits.viewportWidth,
        viewportHeight: rootUnits.viewportHeight,
        useSpan: null,
      };
      this.walkChildren(root, state);
    }
    return rootUnits.units;
  }

  /**
   * A nested viewport: an inner `svg` (x, y, width, height, viewBox, preserveAspectRatio) or a used
   * `symbol`. `size` carries a referencing use's width/height, which override the element's own
   * (SVG 2 Structural, "The use element"). width/height default to 100% (auto); a zero size disables
   * rendering. Without a known viewport size, a viewBox maps one to one.
   */
  private walkViewport(el: SvgElement, state: WalkState, size: { width?: number; height?: number } | null): void {
    const ctx = this.lengthContext(state);
    const isSymbol = el.name === 'symbol';
    const x = isSymbol ? 0 : this.getNumber(readLength(el, 'x', 'width', ctx));
    const y = isSymbol ? 0 : this.getNumber(readLength(el, 'y', 'height', ctx));
    const ownWidth = isSymbol ? undefined : readLength(el, 'width', 'width', ctx, { allowAuto: true, nonNegative: true });
    const ownHeight = isSymbol ? undefined : readLength(el, 'height', 'height', ctx, { allowAuto: true, nonNegative: true });
    const width = size?.width ?? (typeof ownWidth === 'number' ? ownWidth : state.viewportWidth);
    const height = size?.height ?? (typeof ownHeight === 'number' ? ownHeight : state.viewportHeight);
    if (width === 0 || height === 0) return;
    const vb = this.readViewBox(el);
    const ar = this.readAspectRatio(el);
    let matrix = this.withTransform(el, state.matrix);
    let viewportWidth = width;
    let viewportHeight = height;
    if (vb) {
      if (vb.width === 0 || vb.height === 0) return;
      const vbMatrix = getViewBoxMatrix(vb, ar, x, y, width ?? vb.width, height ?? vb.height);
      matrix = multiplyMatrices(matrix, vbMatrix);
      viewportWidth = vb.width;
      viewportHeight = vb.height;
    } else if (x !== 0 || y !== 0) {
      matrix = multiplyMatrices(matrix, getTranslationMatrix(x, y));
    }
    this.walkChildren(el, { matrix, viewportWidth, viewportHeight, useSpan: state.useSpan });
  }

  private getNumber(value: number | 'auto' | undefined): number {
    return typeof value === 'number' ? value : 0;
  }

  // ── the tree walk ───────────────────────────────────────────────────────────────────────────

  private walkChildren(el: SvgElement, state: WalkState): void {
    for (const child of el.children) this.walk(child, state);
  }

  private walk(el: SvgElement, state: WalkState): void {
    if (this.depth >= MAX_NESTING_DEPTH) {
      if (!this.depthReported) this.report('unsupported', el.tagSpan, { detail: `elements nested more than ${MAX_NESTING_DEPTH} deep; this one and those inside it are not drawn` });
      this.depthReported = true;
      return;
    }
    this.depth++;
    this.walkElement(el, state);
    this.depth--;
  }

  private walkElement(el: SvgElement, state: WalkState): void {
    if (isDisplayNone(el)) return;
    switch (el.name) {
      case 'g':
      case 'a':
        this.walkChildren(el, { ...state, matrix: this.withTransform(el, state.matrix) });
        return;
      case 'switch': {
        // SVG 2 Struct, "The switch element": the first direct child whose conditions hold. Only
        // requiredExtensions can fail here (no extension is supported); systemLanguage counts as met.
        const chosen = el.children.find((c) => !c.attributes.get('requiredExtensions')?.value.trim());
        if (chosen) this.walk(chosen, { ...state, matrix: this.withTransform(el, state.matrix) });
        return;
      }
      case 'svg':
        this.walkViewport(el, state, null);
        return;
      case 'use':
        this.walkUse(el, state);
        return;
      case 'path':
        this.addPath(el, state);
        return;
      default:
        if (BASIC_SHAPES.has(el.name)) this.addShape(el, state);
    }
  }

  private getUseTarget(use: SvgElement): SvgElement | undefined {
    const attr = SVG_HREF_NAMES.map((n) => use.attributes.get(n)).find((a) => a !== undefined);
    const href = attr?.value.trim();
    if (!attr || !href) return undefined;
    if (!href.startsWith('#')) {
      this.report('unsupported', attr.span, { detail: `use of another document (${href})` });
      return undefined;
    }
    const target = this.doc.byId.get(href.slice(1));
    if (!target) this.report('value', attr.span, { attribute: attr === use.attributes.get('href') ? 'href' : 'xlink:href', detail: `no element has the id '${href.slice(1)}'` });
    return target;
  }

  /** Target of a use without reporting (for the cycle search). */
  private findUseTarget(use: SvgElement): SvgElement | undefined {
    const href = (use.attributes.get('href') ?? use.attributes.get('xlink:href'))?.value.trim();
    return href?.startsWith('#') ? this.doc.byId.get(href.slice(1)) : undefined;
  }

  /**
   * True when drawing the use's target would reach this same use again (through children and
   * further uses): a circular reference, an error in SVG 2 Structural ("The use element"). The search
   * visits each element at most once.
   */
  private isCircularUse(use: SvgElement): boolean {
    const known = this.circularUse.get(use);
    if (known !== undefined) return known;
    const seen = new Set<SvgElement>();
    const first = this.findUseTarget(use);
    const pending: SvgElement[] = first ? [first] : [];
    let circular = false;
    while (pending.length > 0 && !circular) {
      const el = pending.pop()!;
      if (seen.has(el)) continue;
      seen.add(el);
      if (el === use) circular = true;
      for (const child of el.children) pending.push(child);
      if (el.name === 'use') {
        const next = this.findUseTarget(el);
        if (next) pending.push(next);
      }
    }
    this.circularUse.set(use, circular);
    return circular;
  }

  /**
   * use (SVG 2 Structural, "The use element"): the target drawn in the use's coordinate system after
   * its transform and translate(x, y); a symbol or svg target becomes a viewport sized by the use's
   * width/height (default 100%).
   */
  private walkUse(use: SvgElement, state: WalkState): void {
    const target = this.getUseTarget(use);
    if (!target) return;
    if (this.isCircularUse(use)) {
      const attr = use.attributes.get('href') ?? use.attributes.get('xlink:href')!;
      this.report('value', attr.span, { attribute: attr === use.attributes.get('href') ? 'href' : 'xlink:href', detail: 'the reference is circular (the element contains this use)' });
      return;
    }
    if (++this.useInstances > MAX_USE_INSTANCES) {
      this.report('unsupported', use.tagSpan, { detail: `more than ${MAX_USE_INSTANCES} use instances; the rest are not drawn` });
      return;
    }
    const ctx = this.lengthContext(state);
    const x = this.getNumber(readLength(use, 'x', 'width', ctx));
    const y = this.getNumber(readLength(use, 'y', 'height', ctx));
    let matrix = this.withTransform(use, state.matrix);
    if (x !== 0 || y !== 0) matrix = multiplyMatrices(matrix, getTranslationMatrix(x, y));
    const inner: WalkState = { ...state, matrix, useSpan: state.useSpan ?? use.tagSpan };
    if (target.name === 'symbol' || target.name === 'svg') {
      if (isDisplayNone(target)) return;
      const w = readLength(use, 'width', 'width', ctx, { allowAuto: true, nonNegative: true });
      const h = readLength(use, 'height', 'height', ctx, { allowAuto: true, nonNegative: true });
      const size: { width?: number; height?: number } = {};
      if (typeof w === 'number') size.width = w;
      if (typeof h === 'number') size.height = h;
      this.walkViewport(target, inner, size);
    } else {
      this.walk(target, inner);
    }
  }

  // ── contours ────────────────────────────────────────────────────────────────────────────────

  /** The segments (as objects, or stored) are already mapped by `matrix`; the start point is mapped here. */
  private addContour(el: SvgElement, state: WalkState, matrix: Matrix, c: {
    closed: boolean; startX: number; startY: number;
    span: SourceSpan; startSpan: SourceSpan; endSpan: SourceSpan; closeFix?: Fix | undefined;
  } & ({ segments: readonly Segment[] } | { stored: StoredSegments })): void {
    const [startX, startY] = transformPoint(matrix, c.startX, c.startY);
    const id = el.attributes.get('id')?.value;
    const fields = {
      index: this.contours.length,
      closed: c.closed,
      startX,
      startY,
      span: c.span,
      startSpan: c.startSpan,
      endSpan: c.endSpan,
      elementSpan: state.useSpan ?? el.tagSpan,
      element: el.name,
      ...(id !== undefined ? { id } : {}),
      ...(c.closeFix ? { closeFix: c.closeFix } : {}),
    };
    this.contours.push('stored' in c ? withStoredSegments(fields, c.stored) : { ...fields, segments: c.segments });
  }

  private addShape(el: SvgElement, state: WalkState): void {
    const outline = getShapeOutline(el, this.lengthContext(state));
    if (!outline) return;
    const matrix = this.withTransform(el, state.matrix);
    this.addContour(el, state, matrix, { ...outline, segments: transformSegments(outline.segments, matrix), span: el.tagSpan });
  }

  /**
   * path: `d` through parsePathData with its offset in the file. When the value holds entity or
   * character references, the parser sees the decoded text and every span is mapped back through
   * the decoder's offset table (scan.ts `getPositionedValue`), so spans and quick-fix edits still
   * land on the right raw text.
   */
  private addPath(el: SvgElement, state: WalkState): void {
    const attr = el.attributes.get('d');
    if (!attr) return;
    const { value, offsets } = getPositionedValue(this.text, attr, this.doc.entities);
    const base = attr.span.start;
    // Segments are built in final coordinates; an invalid transform is reported below, only for a
    // path that draws something.
    const { matrix, reportError } = this.applyTransform(el, state.matrix);
    const parsed = parsePathData(value, base, matrix);
    const last = value.length;
    const mapOffset = (o: number) => offsets![Math.min(Math.max(o - base, 0), last)]!;
    const mapSpan = offsets
      ? (s: SourceSpan): SourceSpan => ({ start: mapOffset(s.start), end: mapOffset(s.end) })
      : (s: SourceSpan): SourceSpan => s;
    if (parsed.error) this.report('pathData', mapSpan(parsed.error.span), { detail: parsed.error.detail });
    if (parsed.subpaths.length === 0) return;
    reportError();
    for (const sub of parsed.subpaths) {
      const segments = offsets ? { segments: sub.segments.map((s) => withSpan(s, mapSpan(s.span))) } : { stored: sub.stored };
      const closeFix = sub.closeFix && offsets
        ? { title: sub.closeFix.title, edits: sub.closeFix.edits.map((e) => ({ span: mapSpan(e.span), newText: e.newText })) }
        : sub.closeFix;
      this.addContour(el, state, matrix, {
        ...segments,
        closed: sub.closed,
        startX: sub.startX,
        startY: sub.startY,
        span: mapSpan(sub.span),
        startSpan: mapSpan(sub.startSpan),
        endSpan: mapSpan(sub.endSpan),
        closeFix,
      });
    }
  }
}
