import { IDENTITY_MATRIX, multiplyMatrices, type Matrix } from '../../geometry/transform';
import { isSvgWhitespace, scanNumber } from './numbers';
import { PX_PER_UNIT, type LengthUnit } from './units';

/**
 * The `transform` attribute: a list of transform functions (SVG 1.1 §7.6 grammar and matrices;
 * SVG 2 / CSS Transforms Module Level 1 §"The SVG transform attribute", which adds units on arguments
 * and the CSS functions translateX/Y, scaleX/Y and skew). REFERENCES §5.7.
 *
 * - matrix(a b c d e f); translate(tx [ty = 0]); scale(sx [sy = sx]); rotate(α [cx cy]) =
 *   translate(cx, cy)·rotate(α)·translate(−cx, −cy); skewX(α) = [1 0 tan α 1 0 0];
 *   skewY(α) = [1 tan α 0 1 0 0]; angles in degrees unless a unit (deg, rad, grad, turn) says otherwise.
 * - The list multiplies left to right: `M1 M2` = M1·M2, applied to a point rightmost first.
 * - Separators between functions and between arguments are comma-wsp; a sign also separates numbers.
 */

export type TransformResult = { readonly matrix: Matrix } | { readonly error: string };

interface Argument {
  readonly value: number;
  readonly unit: string;
}

const ANGLE_DEG_PER_UNIT: Readonly<Record<string, number>> = {
  '': 1,
  deg: 1,
  rad: 180 / Math.PI,
  grad: 0.9, // 400 grad = 360°
  turn: 360,
};

/**
 * cos and sin of an angle in degrees, exact at multiples of 90° (Math.cos(π/2) is 6.1e-17, which
 * would put a tiny skew into `rotate(90)`; REFERENCES §5.7 notes the same rounding).
 */
function getCosSin(deg: number): [number, number] {
  const r = ((deg % 360) + 360) % 360;
  if (r === 0) return [1, 0];
  if (r === 90) return [0, 1];
  if (r === 180) return [-1, 0];
  if (r === 270) return [0, -1];
  const rad = (deg * Math.PI) / 180;
  return [Math.cos(rad), Math.sin(rad)];
}

function getAngleDeg(arg: Argument, fn: string): number | string {
  const perUnit = ANGLE_DEG_PER_UNIT[arg.unit.toLowerCase()];
  if (perUnit === undefined) return `${fn}() takes an angle, not '${arg.unit}'`;
  return arg.value * perUnit;
}

function getLengthPx(arg: Argument, fn: string): number | string {
  if (arg.unit === '') return arg.value;
  const perUnit = PX_PER_UNIT[arg.unit.toLowerCase() as LengthUnit] as number | undefined;
  if (perUnit === undefined) return `${fn}() takes an absolute length, not '${arg.unit}'`;
  return arg.value * perUnit;
}

function getPlain(arg: Argument, fn: string): number | string {
  if (arg.unit !== '') return `${fn}() takes plain numbers, not '${arg.unit}'`;
  return arg.value;
}

function getSkewTangent(deg: number, fn: string): number | string {
  const r = ((deg % 180) + 180) % 180;
  if (r === 90) return `${fn}(${deg}) is infinitely skewed`;
  if (r === 0) return 0;
  if (r === 45) return 1;
  if (r === 135) return -1;
  return Math.tan((deg * Math.PI) / 180);
}

/** Argument counts accepted by each function. */
const ARITY: Readonly<Record<string, readonly number[]>> = {
  matrix: [6],
  translate: [1, 2],
  translateX: [1],
  translateY: [1],
  scale: [1, 2],
  scaleX: [1],
  scaleY: [1],
  rotate: [1, 3],
  skew: [1, 2],
  skewX: [1],
  skewY: [1],
};

function getFunctionMatrix(fn: string, args: readonly Argument[]): Matrix | string {
  const values: number[] = [];
  const want = (i: number, read: (arg: Argument, fn: string) => number | string): string | null => {
    const v = read(args[i]!, fn);
    if (typeof v === 'string') return v;
    values[i] = v;
    return null;
  };
  switch (fn) {
    case 'matrix': {
      for (let i = 0; i < 6; i++) {
        const e = want(i, getPlain);
        if (e) return e;
      }
      return values as unknown as Matrix;
    }
    case 'translate':
    case 'translateX':
    case 'translateY': {
      for (let i = 0; i < args.length; i++) {
        const e = want(i, getLengthPx);
        if (e) return e;
      }
      if (fn === 'translateY') return [1, 0, 0, 1, 0, values[0]!];
      return [1, 0, 0, 1, values[0]!, values[1] ?? 0];
    }
    case 'scale':
    case 'scaleX':
    case 'scaleY': {
      for (let i = 0; i < args.length; i++) {
        const e = want(i, getPlain);
        if (e) return e;
      }
      if (fn === 'scaleX') return [values[0]!, 0, 0, 1, 0, 0];
      if (fn === 'scaleY') return [1, 0, 0, values[0]!, 0, 0];
      return [values[0]!, 0, 0, values[1] ?? values[0]!, 0, 0];
    }
    case 'rotate': {
      const angle = getAngleDeg(args[0]!, fn);
      if (typeof angle === 'string') return angle;
      const [cos, sin] = getCosSin(angle);
      const rotation: Matrix = [cos, sin, -sin, cos, 0, 0];
      if (args.length === 1) return rotation;
      for (let i = 1; i < 3; i++) {
        const e = want(i, getLengthPx);
        if (e) return e;
      }
      const cx = values[1]!;
      const cy = values[2]!;
      return multiplyMatrices(multiplyMatrices([1, 0, 0, 1, cx, cy], rotation), [1, 0, 0, 1, -cx, -cy]);
    }
    default: {
      // skew, skewX, skewY
      const tangents: number[] = [];
      for (const arg of args) {
        const angle = getAngleDeg(arg, fn);
        if (typeof angle === 'string') return angle;
        const t = getSkewTangent(angle, fn);
        if (typeof t === 'string') return t;
        tangents.push(t);
      }
      if (fn === 'skewY') return [1, tangents[0]!, 0, 1, 0, 0];
      return [1, tangents[1] ?? 0, tangents[0]!, 1, 0, 0];
    }
  }
}

function isNameChar(code: number): boolean {
  return (code >= 0x41 && code <= 0x5a) || (code >= 0x61 && code <= 0x7a);
}

/** Parses a transform list; an empty or all-whitespace list is the identity. */
export function parseTransformList(text: string): TransformResult {
  const n = text.length;
  let i = 0;
  let matrix = IDENTITY_MATRIX;
  const skipWsp = () => {
    while (i < n && isSvgWhitespace(text.charCodeAt(i))) i++;
  };
  skipWsp();
  let first = true;
  while (i < n) {
    if (!first) {
      // comma-wsp between functions (optional in SVG 1.1's grammar: `transforms` allows wsp*)
      if (text.charCodeAt(i) === 0x2c) {
        i++;
        skipWsp();
        if (i >= n) return { error: 'a comma with no transform after it' };
      }
    }
    first = false;
    const nameStart = i;
    while (i < n && isNameChar(text.charCodeAt(i))) i++;
    const fn = text.slice(nameStart, i);
    const arity = ARITY[fn];
    if (!arity) {
      return { error: fn === '' ? `unexpected '${text.slice(i, i + 1)}'` : `unknown transform function '${fn}'` };
    }
    skipWsp();
    if (text.charCodeAt(i) !== 0x28) return { error: `'(' expected after ${fn}` };
    i++;
    skipWsp();
    const args: Argument[] = [];
    while (i < n && text.charCodeAt(i) !== 0x29) {
      if (args.length > 0 && text.charCodeAt(i) === 0x2c) {
        i++;
        skipWsp();
        if (text.charCodeAt(i) === 0x29) return { error: `${fn}(): a comma with no number after it` };
      }
      const numberEnd = scanNumber(text, i, n);
      if (numberEnd < 0) return { error: `${fn}(): '${text.slice(i, i + 1)}' is not a number` };
      const value = Number(text.slice(i, numberEnd));
      if (!Number.isFinite(value)) return { error: `${fn}(): ${text.slice(i, numberEnd)} is out of range` };
      i = numberEnd;
      const unitStart = i;
      while (i < n && isNameChar(text.charCodeAt(i))) i++;
      args.push({ value, unit: text.slice(unitStart, i) });
      skipWsp();
    }
    if (i >= n) return { error: `')' expected to close ${fn}(` };
    i++; // ')'
    if (!arity.includes(args.length)) {
      return { error: `${fn}() takes ${arity.join(' or ')} arguments, not ${args.length}` };
    }
    const m = getFunctionMatrix(fn, args);
    if (typeof m === 'string') return { error: m };
    matrix = multiplyMatrices(matrix, m);
    skipWsp();
  }
  if (!matrix.every(Number.isFinite)) return { error: 'the transform is out of range' };
  return { matrix };
}
