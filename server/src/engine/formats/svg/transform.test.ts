import { describe, expect, it } from 'vitest';
import { transformPoint, type Matrix } from '../../geometry/transform';
import { parseTransformList } from './transform';

function matrixOf(text: string): Matrix {
  const r = parseTransformList(text);
  if ('error' in r) throw new Error(r.error);
  return r.matrix;
}

function expectPoint(m: Matrix, x: number, y: number, ex: number, ey: number) {
  const [px, py] = transformPoint(m, x, y);
  expect(px).toBeCloseTo(ex, 12);
  expect(py).toBeCloseTo(ey, 12);
}

describe('parseTransformList', () => {
  it('multiplies a list left to right: translate(10,20) rotate(90) scale(2) = matrix(0 2 −2 0 10 20) (REFERENCES §5.7)', () => {
    expect(matrixOf('translate(10,20) rotate(90) scale(2)')).toEqual([0, 2, -2, 0, 10, 20]);
    expectPoint(matrixOf('translate(10,20) rotate(90) scale(2)'), 1, 0, 10, 22);
  });

  it('rotates about a centre: rotate(90,5,5) maps (10,5) to (5,10) (REFERENCES §5.7)', () => {
    expectPoint(matrixOf('rotate(90,5,5)'), 10, 5, 5, 10);
  });

  it('skews: skewX(45) maps (0,1) to (1,1), skewY(45) maps (1,0) to (1,1) (REFERENCES §5.7)', () => {
    expectPoint(matrixOf('skewX(45)'), 0, 1, 1, 1);
    expectPoint(matrixOf('skewY(45)'), 1, 0, 1, 1);
  });

  it('reads matrix(a b c d e f) as x′ = ax + cy + e, y′ = bx + dy + f (SVG 1.1 §7.6)', () => {
    expectPoint(matrixOf('matrix(1 2 3 4 5 6)'), 1, 1, 9, 12);
  });

  it('defaults translate ty to 0 and scale sy to sx (SVG 1.1 §7.6)', () => {
    expect(matrixOf('translate(7)')).toEqual([1, 0, 0, 1, 7, 0]);
    expect(matrixOf('scale(3)')).toEqual([3, 0, 0, 3, 0, 0]);
  });

  it('accepts commas, whitespace and signs as separators (SVG 1.1 §7.6 grammar)', () => {
    expect(matrixOf(' translate( 1 , 2 ) ,scale(2)')).toEqual(matrixOf('translate(1 2) scale(2)'));
    expect(matrixOf('translate(1-2)')).toEqual([1, 0, 0, 1, 1, -2]);
    expect(matrixOf('translate(1,2)scale(2)')).toEqual([2, 0, 0, 2, 1, 2]);
    expect(matrixOf('')).toEqual([1, 0, 0, 1, 0, 0]);
  });

  it('accepts CSS angle and length units: rotate(0.25turn) = rotate(90), translate(1in) = 96 px (CSS Transforms 1; CSS Values: 1in = 96px)', () => {
    expect(matrixOf('rotate(0.25turn)')).toEqual(matrixOf('rotate(90)'));
    expect(matrixOf('translate(1in, 0)')).toEqual([1, 0, 0, 1, 96, 0]);
  });

  it('rotates multiples of 90° exactly (cos 90° would otherwise be 6.1e-17, REFERENCES §5.7)', () => {
    expect(matrixOf('rotate(-90)')).toEqual([0, -1, 1, 0, 0, 0]);
  });

  it.each([
    ['rotate(1,2)', 'takes 1 or 3'],
    ['translate(1', "')' expected"],
    ['spin(3)', "unknown transform function 'spin'"],
    ['scale(2px)', 'plain numbers'],
    ['skewX(90)', 'infinitely skewed'],
    ['translate(1,)', 'comma'],
  ])('reports %s as an error (%s)', (text, message) => {
    const r = parseTransformList(text);
    expect('error' in r && r.error).toContain(message);
  });
});
