import { describe, expect, it } from 'vitest';
import { transformPoint } from '../../geometry/transform';
import {
  DEFAULT_ASPECT_RATIO, MM_PER_UNIT, getRootUnits, getViewBoxMatrix, parseLength, parsePreserveAspectRatio, parseViewBox,
  type AspectRatio, type Length, type ViewBox,
} from './units';

const span = { start: 0, end: 4 };

function ar(text: string): AspectRatio {
  const r = parsePreserveAspectRatio(text);
  if ('error' in r) throw new Error(r.error);
  return r;
}

function len(text: string): Length {
  const r = parseLength(text);
  if ('error' in r) throw new Error(r.error);
  return r;
}

function vb(text: string): ViewBox {
  const r = parseViewBox(text);
  if ('error' in r) throw new Error(r.error);
  return r;
}

describe('units', () => {
  it('uses CSS absolute lengths: 1in = 25.4mm = 96px, 1pt = 1/72in, 1pc = 16px, 1Q = 0.25mm (REFERENCES §5.9)', () => {
    expect(MM_PER_UNIT.px).toBeCloseTo(0.2645833333333333, 15);
    expect(MM_PER_UNIT.pt).toBeCloseTo(0.3527777777777778, 15);
    expect(len('1in')).toMatchObject({ px: 96 });
    expect(len('1pc')).toMatchObject({ px: 16 });
    expect((len('100mm') as { px: number }).px).toBeCloseTo(377.9527559055118, 12);
    expect((len('4Q') as { px: number }).px).toBeCloseTo(96 / 25.4, 12);
    expect(len(' 12 ')).toEqual({ kind: 'absolute', value: 12, unit: 'px', px: 12 });
    expect(len('50%')).toEqual({ kind: 'percent', percent: 50 });
    expect(parseLength('2em')).toHaveProperty('error');
    expect(parseLength('1 0')).toHaveProperty('error');
  });

  it('maps a viewBox per SVG 2 "equivalent transform" (REFERENCES §5.8 check values)', () => {
    const box = vb('0 0 100 50');
    const at = (text: string) => transformPoint(getViewBoxMatrix(box, ar(text), 0, 0, 200, 200), 10, 10);
    expect(at('xMidYMid meet')).toEqual([20, 70]);
    expect(at('xMidYMid slice')).toEqual([-60, 40]);
    expect(at('none')).toEqual([20, 40]);
    expect(at('xMinYMin meet')).toEqual([20, 20]);
    expect(at('xMaxYMax')).toEqual([20, 120]);
    expect(DEFAULT_ASPECT_RATIO).toEqual(ar('xMidYMid meet'));
  });

  it('rejects a negative viewBox size and a bad alignment (SVG 2 Coordinate Systems)', () => {
    expect(parseViewBox('0 0 -1 5')).toHaveProperty('error');
    expect(parseViewBox('0 0 1')).toHaveProperty('error');
    expect(parsePreserveAspectRatio('xMidYmid')).toHaveProperty('error');
  });

  it('gives exactly 1 mm per unit for width="100mm" height="50mm" viewBox="−50 −25 100 50" (REFERENCES §5.8)', () => {
    const r = getRootUnits({
      width: len('100mm'), height: len('50mm'), viewBox: vb('-50 -25 100 50'),
      aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'auto', span,
    });
    expect(r.units).toEqual({ declared: true, mmPerUnit: 1, assumed: null, span });
    expect(transformPoint(r.matrix, -50, -25)).toEqual([0, 0]);
  });

  it('gives 0.1 mm per unit for a 1000-unit viewBox on width="100mm" with no height (aspect ratio from the viewBox, SVG 2 sizing)', () => {
    const r = getRootUnits({ width: len('100mm'), height: undefined, viewBox: vb('0 0 1000 500'), aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'mm', span });
    expect(r.units.declared).toBe(true);
    expect(r.units.mmPerUnit).toBeCloseTo(0.1, 15);
  });

  it('takes unitless width as px: 96 user units = 1 in = 25.4 mm (CSS Values: 96 px per inch)', () => {
    const r = getRootUnits({ width: len('96'), height: len('96'), viewBox: undefined, aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'mm', span });
    expect(transformPoint(r.matrix, 96, 0)[0]).toBeCloseTo(25.4, 12);
    expect(r.units.declared).toBe(true);
  });

  it('assumes the chosen unit when the size is missing or a percentage, with the viewBox origin at the top-left', () => {
    const r = getRootUnits({ width: len('100%'), height: undefined, viewBox: vb('10 20 30 40'), aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'in', span });
    expect(r.units).toEqual({ declared: false, mmPerUnit: 25.4, assumed: 'in', span });
    const [x, y] = transformPoint(r.matrix, 11, 20);
    expect(x).toBeCloseTo(25.4, 12);
    expect(y).toBe(0);
    const auto = getRootUnits({ width: undefined, height: undefined, viewBox: undefined, aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'auto', span });
    expect(auto.units).toEqual({ declared: false, mmPerUnit: 25.4 / 96, assumed: 'px', span });
  });

  it('disables rendering for a zero width or viewBox size (SVG 2 "The svg element")', () => {
    expect(getRootUnits({ width: len('0'), height: len('5'), viewBox: undefined, aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'auto', span }).disabled).toBe(true);
    expect(getRootUnits({ width: len('5mm'), height: len('5mm'), viewBox: vb('0 0 0 5'), aspectRatio: DEFAULT_ASPECT_RATIO, assumedUnit: 'auto', span }).disabled).toBe(true);
  });
});
