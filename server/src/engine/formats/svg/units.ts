import { getScalingMatrix, getTranslationMatrix, multiplyMatrices, type Matrix } from '../../geometry/transform';
import type { AssumedUnit, SourceSpan, UnitsInfo } from '../../types';
import { isSvgWhitespace, parseNumberList, scanNumber } from './numbers';

/**
 * Lengths, viewBox and preserveAspectRatio, and the physical size of one user unit.
 *
 * Units: CSS Values and Units, "Absolute lengths": 1in = 2.54cm = 96px, 1cm = 10mm, 1Q = 0.25mm,
 * 1pt = 1/72in, 1pc = 12pt (REFERENCES §5.9). In SVG user space an absolute length converts to user
 * units at 1px = 1 user unit (SVG 2 Coordinate Systems, "Units").
 */

export type LengthUnit = 'px' | 'mm' | 'cm' | 'in' | 'pt' | 'pc' | 'q';

/** Millimetres per unit (CSS Values and Units, absolute lengths; REFERENCES §5.9). */
export const MM_PER_UNIT: Readonly<Record<LengthUnit, number>> = {
  px: 25.4 / 96, // 0.2645833333333333
  mm: 1,
  cm: 10,
  in: 25.4,
  pt: 25.4 / 72, // 0.3527777777777778
  pc: 25.4 / 6, // 4.233333333333333
  q: 0.25,
};

export const MM_PER_PX = MM_PER_UNIT.px;

/** CSS px per unit: 96 per inch. */
export const PX_PER_UNIT: Readonly<Record<LengthUnit, number>> = {
  px: 1,
  mm: 96 / 25.4,
  cm: 960 / 25.4,
  in: 96,
  pt: 96 / 72,
  pc: 16,
  q: 96 / 101.6,
};

/**
 * A length as written: an absolute length (`value` in `unit`, a unitless number being px; `px` is the
 * same in px = user units), or a percentage.
 */
export type Length =
  | { readonly kind: 'absolute'; readonly value: number; readonly unit: LengthUnit; readonly px: number }
  | { readonly kind: 'percent'; readonly percent: number };

export interface ValueError {
  readonly error: string;
}

/**
 * Parses a CSS <length-percentage> attribute value (SVG 2: geometry properties take CSS lengths;
 * a unitless number is user units = px). Leading and trailing whitespace is allowed. Units are ASCII
 * case-insensitive (CSS Values §"Dimensions"). Font- and viewport-relative units are not supported.
 */
export function parseLength(text: string): Length | ValueError {
  let start = 0;
  let end = text.length;
  while (start < end && isSvgWhitespace(text.charCodeAt(start))) start++;
  while (end > start && isSvgWhitespace(text.charCodeAt(end - 1))) end--;
  if (start === end) return { error: 'empty value' };
  const numberEnd = scanNumber(text, start, end);
  if (numberEnd < 0) return { error: `'${text.slice(start, end)}' is not a length` };
  const value = Number(text.slice(start, numberEnd));
  if (!Number.isFinite(value)) return { error: `${text.slice(start, numberEnd)} is out of range` };
  const unitText = text.slice(numberEnd, end);
  if (unitText === '') return { kind: 'absolute', value, unit: 'px', px: value };
  if (unitText === '%') return { kind: 'percent', percent: value };
  const unit = unitText.toLowerCase();
  if (unit in PX_PER_UNIT) {
    return { kind: 'absolute', value, unit: unit as LengthUnit, px: value * PX_PER_UNIT[unit as LengthUnit] };
  }
  if (/^[a-z]+$/.test(unit)) return { error: `the unit '${unitText}' is not supported (use mm, cm, in, pt, pc, px or Q)` };
  return { error: `'${text.slice(start, end)}' is not a length` };
}

export interface ViewBox {
  readonly minX: number;
  readonly minY: number;
  readonly width: number;
  readonly height: number;
}

/** Parses `min-x min-y width height` (SVG 2 Coordinate Systems, "The viewBox attribute"). */
export function parseViewBox(text: string): ViewBox | ValueError {
  const list = parseNumberList(text);
  if (list.error) return { error: list.error.detail };
  if (list.numbers.length !== 4) return { error: `four numbers expected, found ${list.numbers.length}` };
  const [minX, minY, width, height] = list.numbers.map((t) => t.value) as [number, number, number, number];
  // A negative width or height is an error (REFERENCES §5.8); zero disables rendering (the caller decides).
  if (width < 0 || height < 0) return { error: 'a negative width or height' };
  return { minX, minY, width, height };
}

export type Alignment = 'min' | 'mid' | 'max';

export interface AspectRatio {
  /** null for `none` (scale each axis on its own). */
  readonly align: { readonly x: Alignment; readonly y: Alignment } | null;
  readonly slice: boolean;
}

export const DEFAULT_ASPECT_RATIO: AspectRatio = { align: { x: 'mid', y: 'mid' }, slice: false };

const ALIGNMENTS: Readonly<Record<string, Alignment>> = { Min: 'min', Mid: 'mid', Max: 'max' };

/**
 * Parses `[defer] <align> [meet | slice]` (SVG 2 Coordinate Systems, "The preserveAspectRatio
 * attribute"; `defer` applies only to images and is skipped). Keywords are case-sensitive as in the spec.
 */
export function parsePreserveAspectRatio(text: string): AspectRatio | ValueError {
  const words = text.split(/[ \t\r\n\f]+/).filter((w) => w !== '');
  if (words[0] === 'defer') words.shift();
  if (words.length === 0 || words.length > 2) return { error: 'expected an alignment and optionally meet or slice' };
  const [alignWord, mode = 'meet'] = words as [string, string?];
  if (mode !== 'meet' && mode !== 'slice') return { error: `'${mode}' is not meet or slice` };
  const slice = mode === 'slice';
  if (alignWord === 'none') return { align: null, slice };
  const m = /^x(Min|Mid|Max)Y(Min|Mid|Max)$/.exec(alignWord);
  if (!m) return { error: `'${alignWord}' is not an alignment` };
  return { align: { x: ALIGNMENTS[m[1]!]!, y: ALIGNMENTS[m[2]!]! }, slice };
}

function getAlignOffset(align: Alignment, free: number): number {
  return align === 'min' ? 0 : align === 'mid' ? free / 2 : free;
}

/**
 * The map from viewBox coordinates to a viewport (x, y, width, height), per SVG 2 Coordinate Systems,
 * "Computing the equivalent transform of an SVG viewport" (REFERENCES §5.8). The caller ensures that
 * the viewBox width and height are positive.
 */
export function getViewBoxMatrix(vb: ViewBox, ar: AspectRatio, x: number, y: number, width: number, height: number): Matrix {
  let sx = width / vb.width;
  let sy = height / vb.height;
  if (ar.align) {
    sx = sy = ar.slice ? Math.max(sx, sy) : Math.min(sx, sy);
  }
  let tx = x - vb.minX * sx;
  let ty = y - vb.minY * sy;
  if (ar.align) {
    tx += getAlignOffset(ar.align.x, width - vb.width * sx);
    ty += getAlignOffset(ar.align.y, height - vb.height * sy);
  }
  return [sx, 0, 0, sy, tx, ty];
}

export interface RootSizeInput {
  /** width and height as parsed; undefined when missing, `auto` or invalid. */
  readonly width: Length | undefined;
  readonly height: Length | undefined;
  /** A valid viewBox, or undefined. */
  readonly viewBox: ViewBox | undefined;
  readonly aspectRatio: AspectRatio;
  readonly assumedUnit: AssumedUnit;
  /** The root `svg` start tag. */
  readonly span: SourceSpan;
}

export interface RootUnits {
  readonly units: UnitsInfo;
  /** Root user units → mm, y down from the top-left corner of the outermost viewport. */
  readonly matrix: Matrix;
  /** The viewport's size in root user units, for percentages; null where it is not known. */
  readonly viewportWidth: number | null;
  readonly viewportHeight: number | null;
  /** True when a zero width, height or viewBox size disables rendering (SVG 2 "The svg element"). */
  readonly disabled: boolean;
}

/**
 * Physical size of the root's user unit.
 *
 * Declared: width or height is an absolute length (a unitless number is CSS px, 96 per inch). The other
 * one, when missing or a percentage, follows from the viewBox's aspect ratio (SVG 2 / CSS sizing of
 * replaced elements with an intrinsic aspect ratio); with no viewBox it does not affect the scale.
 *
 * Undeclared (both missing, `auto` or percentages — a size relative to an unknown container): one user
 * unit is one `assumedUnit` (`auto` = px for SVG), and the viewport is taken as the viewBox itself, so
 * mm = (user − viewBox origin) × unit. `mmPerUnit` is that unit's size.
 *
 * With preserveAspectRatio="none" and a viewport of another shape, the scale differs per axis; then
 * `mmPerUnit` is the geometric mean √|sx·sy| (the scale of areas), and contours carry the exact map.
 */
export function getRootUnits(input: RootSizeInput): RootUnits {
  const { width, height, viewBox: vb, span } = input;
  const w = width?.kind === 'absolute' ? width.px : null;
  const h = height?.kind === 'absolute' ? height.px : null;
  const vbEmpty = vb !== undefined && (vb.width === 0 || vb.height === 0);

  if (w === null && h === null) {
    const unit = input.assumedUnit === 'auto' ? 'px' : input.assumedUnit;
    const mmPerUnit = MM_PER_UNIT[unit];
    const matrix = vb
      ? multiplyMatrices(getScalingMatrix(mmPerUnit, mmPerUnit), getTranslationMatrix(-vb.minX, -vb.minY))
      : getScalingMatrix(mmPerUnit, mmPerUnit);
    return {
      units: { declared: false, mmPerUnit, assumed: unit, span },
      matrix,
      viewportWidth: vb ? vb.width : null,
      viewportHeight: vb ? vb.height : null,
      disabled: vbEmpty,
    };
  }

  const declared = (mmPerUnit: number, matrix: Matrix, vw: number | null, vh: number | null, disabled: boolean): RootUnits => ({
    units: { declared: true, mmPerUnit, assumed: null, span },
    matrix,
    viewportWidth: vw,
    viewportHeight: vh,
    disabled,
  });
  if (!vb || vbEmpty) {
    const pxToMm = getScalingMatrix(MM_PER_PX, MM_PER_PX);
    return declared(MM_PER_PX, pxToMm, w, h, vbEmpty || w === 0 || h === 0);
  }
  // The viewport in mm straight from the written value and unit, so that width="100mm" with a
  // 100-unit viewBox gives exactly 1 mm per unit (no round trip through px).
  const wMm = width?.kind === 'absolute' ? width.value * MM_PER_UNIT[width.unit] : null;
  const hMm = height?.kind === 'absolute' ? height.value * MM_PER_UNIT[height.unit] : null;
  const vwMm = wMm ?? (hMm! * vb.width) / vb.height;
  const vhMm = hMm ?? (wMm! * vb.height) / vb.width;
  if (vwMm === 0 || vhMm === 0) return declared(MM_PER_PX, getScalingMatrix(MM_PER_PX, MM_PER_PX), vb.width, vb.height, true);
  const matrix = getViewBoxMatrix(vb, input.aspectRatio, 0, 0, vwMm, vhMm);
  const mmPerUnit = matrix[0] === matrix[3] ? matrix[0] : Math.sqrt(Math.abs(matrix[0] * matrix[3]));
  return declared(mmPerUnit, matrix, vb.width, vb.height, false);
}
