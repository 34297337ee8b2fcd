import { describe, expect, it } from 'vitest';
import { fillTemplate, formatNumber } from './format';

describe('formatNumber', () => {
  it('keeps three decimals, trims zeros and never prints -0', () => {
    expect([formatNumber(469.6991), formatNumber(0.5), formatNumber(-0.0001), formatNumber(0)]).toEqual(['469.699', '0.5', '-0.0001', '0']);
  });
});

describe('fillTemplate', () => {
  it('fills names with formatted numbers and strings, and leaves unknown names as written', () => {
    expect(fillTemplate('gap {gapMm} mm on {layer}, {missing}', { gapMm: 0.04000001, layer: 'CUT' })).toBe('gap 0.04 mm on CUT, {missing}');
  });

  it('makes the word agree with the number (English: singular for exactly 1)', () => {
    const t = 'Not analysed: {count|entity|entities}.';
    expect([0, 1, 2].map((count) => fillTemplate(t, { count }))).toEqual([
      'Not analysed: 0 entities.',
      'Not analysed: 1 entity.',
      'Not analysed: 2 entities.',
    ]);
  });
});
