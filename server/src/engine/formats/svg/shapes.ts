import type { Arc, Line, Segment, SourceSpan } from '../../types';
import { parseNumberList } from './numbers';
import { getPositionedValue, type SvgElement } from './scan';
import { parseLength } from './units';

/**
 * Basic shapes (rect, circle, ellipse, line, polyline, polygon) as segments in the element's user
 * units, following the equivalent paths of SVG 2 Basic Shapes (REFERENCES §5.6). Arcs are built
 * directly in centre form (types.ts `Arc`), so the end points and centres are the exact sums of the
 * attribute values — no endpoint-to-centre conversion and its rounding.
 */

/** What a shape or viewport reader needs: percentages' reference box and a way to report bad values. */
export interface LengthContext {
  readonly text: string;
  readonly entities: Readonly<Record<string, string>>;
  /** Size of the nearest viewport in user units (the viewBox when there is one); null when unknown. */
  readonly viewportWidth: number | null;
  readonly viewportHeight: number | null;
  /** Reports an invalid attribute value (parse-error / value). */
  reportValue(attribute: string, span: SourceSpan, detail: string): void;
}

/** Which viewport dimension a percentage refers to (SVG 2 Coordinate Systems, "Units"). */
export type PercentBasis = 'width' | 'height' | 'diagonal';

function getPercentBasis(basis: PercentBasis, ctx: LengthContext): number | null {
  const w = ctx.viewportWidth;
  const h = ctx.viewportHeight;
  if (basis === 'width') return w;
  if (basis === 'height') return h;
  // Normalised diagonal √((w² + h²)/2) (SVG 2 Coordinate Systems, "Units").
  return w === null || h === null ? null : Math.sqrt((w * w + h * h) / 2);
}

export interface LengthOptions {
  /** Accept the keyword `auto`. */
  readonly allowAuto?: boolean;
  /** A negative value is an error (SVG 2: width, height, r, rx, ry). */
  readonly nonNegative?: boolean;
}

/**
 * A length attribute in user units. Missing → undefined; `auto` (where allowed) → 'auto'; an invalid
 * value is reported and then treated as missing, as CSS ignores an invalid presentation attribute.
 */
export function readLength(
  el: SvgElement, name: string, basis: PercentBasis, ctx: LengthContext, options: LengthOptions = {},
): number | 'auto' | undefined {
  const attr = el.attributes.get(name);
  if (!attr) return undefined;
  if (options.allowAuto && attr.value.trim() === 'auto') return 'auto';
  const length = parseLength(attr.value);
  if ('error' in length) {
    ctx.reportValue(name, attr.span, length.error);
    return undefined;
  }
  let value: number;
  if (length.kind === 'percent') {
    const base = getPercentBasis(basis, ctx);
    if (base === null) {
      ctx.reportValue(name, attr.span, 'a percentage needs a viewport size, and this drawing declares none');
      return undefined;
    }
    value = (length.percent / 100) * base;
  } else {
    value = length.px;
  }
  if (options.nonNegative && value < 0) {
    ctx.reportValue(name, attr.span, 'a negative value');
    return undefined;
  }
  return value;
}

/** A shape's outline in its own user units. */
export interface ShapeOutline {
  readonly segments: readonly Segment[];
  readonly closed: boolean;
  readonly startX: number;
  readonly startY: number;
  readonly startSpan: SourceSpan;
  readonly endSpan: SourceSpan;
}

export const BASIC_SHAPES: ReadonlySet<string> = new Set(['rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon']);

function line(x0: number, y0: number, x1: number, y1: number, span: SourceSpan): Line {
  return { kind: 'line', x0, y0, x1, y1, span };
}

/** Quarter of the ellipse centred at (cx, cy) with radii rx, ry from angle θ0 to θ0 + π/2 (clockwise on screen). */
function quarter(
  cx: number, cy: number, rx: number, ry: number, theta0: number,
  x0: number, y0: number, x1: number, y1: number, span: SourceSpan,
): Arc {
  return { kind: 'arc', x0, y0, x1, y1, cx, cy, ux: rx, uy: 0, vx: 0, vy: ry, theta0, sweep: Math.PI / 2, span };
}

function getNumber(value: number | 'auto' | undefined, fallback: number): number {
  return typeof value === 'number' ? value : fallback;
}

/**
 * rect (SVG 2 Basic Shapes, "The rect element"; REFERENCES §5.6): rx and ry default to auto; both auto
 * ⇒ 0; one auto ⇒ it takes the other's value; then each is clamped to half the width or height.
 * Zero width or height disables rendering. With no rounding (rx or ry 0) the outline is four lines
 * M(x,y) H V H V Z; otherwise lines and quarter arcs in the path order of §5.6, sides of zero length left out.
 */
function getRectOutline(el: SvgElement, ctx: LengthContext): ShapeOutline | null {
  const span = el.tagSpan;
  const x = getNumber(readLength(el, 'x', 'width', ctx), 0);
  const y = getNumber(readLength(el, 'y', 'height', ctx), 0);
  const w = getNumber(readLength(el, 'width', 'width', ctx, { allowAuto: true, nonNegative: true }), 0);
  const h = getNumber(readLength(el, 'height', 'height', ctx, { allowAuto: true, nonNegative: true }), 0);
  const rxIn = readLength(el, 'rx', 'width', ctx, { allowAuto: true, nonNegative: true });
  const ryIn = readLength(el, 'ry', 'height', ctx, { allowAuto: true, nonNegative: true });
  if (w === 0 || h === 0) return null;
  let rx = typeof rxIn === 'number' ? rxIn : typeof ryIn === 'number' ? ryIn : 0;
  let ry = typeof ryIn === 'number' ? ryIn : typeof rxIn === 'number' ? rxIn : 0;
  rx = Math.min(rx, w / 2);
  ry = Math.min(ry, h / 2);
  const x1 = x + w;
  const y1 = y + h;
  const base = { closed: true, startSpan: span, endSpan: span };
  if (rx === 0 || ry === 0) {
    return {
      ...base,
      startX: x,
      startY: y,
      segments: [line(x, y, x1, y, span), line(x1, y, x1, y1, span), line(x1, y1, x, y1, span), line(x, y1, x, y, span)],
    };
  }
  const xl = x + rx; // left end of the top and bottom sides
  const xr = x1 - rx; // right end
  const yt = y + ry; // top end of the left and right sides
  const yb = y1 - ry; // bottom end
  const segments: Segment[] = [];
  if (xr > xl) segments.push(line(xl, y, xr, y, span));
  segments.push(quarter(xr, yt, rx, ry, -Math.PI / 2, xr, y, x1, yt, span));
  if (yb > yt) segments.push(line(x1, yt, x1, yb, span));
  segments.push(quarter(xr, yb, rx, ry, 0, x1, yb, xr, y1, span));
  if (xr > xl) segments.push(line(xr, y1, xl, y1, span));
  segments.push(quarter(xl, yb, rx, ry, Math.PI / 2, xl, y1, x, yb, span));
  if (yb > yt) segments.push(line(x, yb, x, yt, span));
  segments.push(quarter(xl, yt, rx, ry, Math.PI, x, yt, xl, y, span));
  return { ...base, startX: xl, startY: y, segments };
}

/**
 * An ellipse as four clockwise quarter arcs from "3 o'clock", as SVG 2's equivalent path for circle
 * and ellipse (REFERENCES §5.6): M(cx+rx, cy) A→(cx, cy+ry) A→(cx−rx, cy) A→(cx, cy−ry) A→start Z.
 */
function getEllipseSegments(cx: number, cy: number, rx: number, ry: number, span: SourceSpan): ShapeOutline {
  const right = cx + rx;
  const left = cx - rx;
  const bottom = cy + ry;
  const top = cy - ry;
  return {
    closed: true,
    startX: right,
    startY: cy,
    startSpan: span,
    endSpan: span,
    segments: [
      quarter(cx, cy, rx, ry, 0, right, cy, cx, bottom, span),
      quarter(cx, cy, rx, ry, Math.PI / 2, cx, bottom, left, cy, span),
      quarter(cx, cy, rx, ry, Math.PI, left, cy, cx, top, span),
      quarter(cx, cy, rx, ry, (3 * Math.PI) / 2, cx, top, right, cy, span),
    ],
  };
}

/** circle: r = 0 (or missing) disables rendering, negative is an error (SVG 2 Basic Shapes). */
function getCircleOutline(el: SvgElement, ctx: LengthContext): ShapeOutline | null {
  const cx = getNumber(readLength(el, 'cx', 'width', ctx), 0);
  const cy = getNumber(readLength(el, 'cy', 'height', ctx), 0);
  const r = getNumber(readLength(el, 'r', 'diagonal', ctx, { nonNegative: true }), 0);
  if (r === 0) return null;
  return getEllipseSegments(cx, cy, r, r, el.tagSpan);
}

/** ellipse: rx/ry `auto` takes the other's value; both auto or either 0 disables rendering (SVG 2). */
function getEllipseOutline(el: SvgElement, ctx: LengthContext): ShapeOutline | null {
  const cx = getNumber(readLength(el, 'cx', 'width', ctx), 0);
  const cy = getNumber(readLength(el, 'cy', 'height', ctx), 0);
  const rxIn = readLength(el, 'rx', 'width', ctx, { allowAuto: true, nonNegative: true });
  const ryIn = readLength(el, 'ry', 'height', ctx, { allowAuto: true, nonNegative: true });
  const rx = typeof rxIn === 'number' ? rxIn : typeof ryIn === 'number' ? ryIn : 0;
  const ry = typeof ryIn === 'number' ? ryIn : typeof rxIn === 'number' ? rxIn : 0;
  if (rx === 0 || ry === 0) return null;
  return getEllipseSegments(cx, cy, rx, ry, el.tagSpan);
}

/** line: M x1 y1 L x2 y2, open (SVG 2 Basic Shapes). */
function getLineOutline(el: SvgElement, ctx: LengthContext): ShapeOutline {
  const x1 = getNumber(readLength(el, 'x1', 'width', ctx), 0);
  const y1 = getNumber(readLength(el, 'y1', 'height', ctx), 0);
  const x2 = getNumber(readLength(el, 'x2', 'width', ctx), 0);
  const y2 = getNumber(readLength(el, 'y2', 'height', ctx), 0);
  const span = el.tagSpan;
  return { closed: false, startX: x1, startY: y1, startSpan: span, endSpan: span, segments: [line(x1, y1, x2, y2, span)] };
}

/**
 * polyline / polygon: M first pair, L each following pair; polygon adds Z (its closing side is the
 * implicit close, not a segment, as for a path's Z). Each segment's span is the coordinate pair it
 * ends at, in the `points` value; startSpan / endSpan are the first / last pair. On a syntax error the
 * pairs before it are kept; an odd count drops the last coordinate (SVG 2 Basic Shapes; REFERENCES §5.2).
 * No points disables rendering.
 */
function getPolyOutline(el: SvgElement, ctx: LengthContext, closed: boolean): ShapeOutline | null {
  const attr = el.attributes.get('points');
  if (!attr) return null;
  const { value, offsets } = getPositionedValue(ctx.text, attr, ctx.entities);
  const base = attr.span.start;
  const toOffset = (i: number) => (offsets ? offsets[i]! : base + i);
  const list = parseNumberList(value);
  if (list.error) {
    ctx.reportValue('points', { start: toOffset(list.error.start), end: toOffset(list.error.end) }, list.error.detail);
  }
  const numbers = list.numbers;
  if (numbers.length % 2 === 1) {
    const last = numbers[numbers.length - 1]!;
    ctx.reportValue('points', { start: toOffset(last.start), end: toOffset(last.end) }, 'an odd number of coordinates; the last one is ignored');
  }
  const pairCount = Math.floor(numbers.length / 2);
  if (pairCount === 0) return null;
  const pairSpan = (k: number): SourceSpan => ({ start: toOffset(numbers[2 * k]!.start), end: toOffset(numbers[2 * k + 1]!.end) });
  const segments: Segment[] = [];
  let px = numbers[0]!.value;
  let py = numbers[1]!.value;
  for (let k = 1; k < pairCount; k++) {
    const x = numbers[2 * k]!.value;
    const y = numbers[2 * k + 1]!.value;
    segments.push(line(px, py, x, y, pairSpan(k)));
    px = x;
    py = y;
  }
  return {
    closed,
    startX: numbers[0]!.value,
    startY: numbers[1]!.value,
    startSpan: pairSpan(0),
    endSpan: pairSpan(pairCount - 1),
    segments,
  };
}

/** The outline of a basic shape, or null when it is not rendered (zero size, no points). */
export function getShapeOutline(el: SvgElement, ctx: LengthContext): ShapeOutline | null {
  switch (el.name) {
    case 'rect':
      return getRectOutline(el, ctx);
    case 'circle':
      return getCircleOutline(el, ctx);
    case 'ellipse':
      return getEllipseOutline(el, ctx);
    case 'line':
      return getLineOutline(el, ctx);
    case 'polyline':
      return getPolyOutline(el, ctx, false);
    case 'polygon':
      return getPolyOutline(el, ctx, true);
    default:
      return null;
  }
}
