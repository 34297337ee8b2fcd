import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
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

/** The first implementations (regular-expression trimming and replacement), kept as the reference. */
function referenceFormatNumber(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const abs = Math.abs(v);
  let s: string;
  if (abs >= 10 ** -digits) s = v.toFixed(digits);
  else if (abs >= 1e-9) s = v.toPrecision(3);
  else return v.toExponential(2);
  if (s.includes('.') && !s.includes('e')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

function referenceFillTemplate(template: string, data: Readonly<Record<string, string | number | boolean>>): string {
  return template.replace(/\{(\w+)(?:\|([^|}]*)\|([^|}]*))?\}/g, (whole, name: string, one?: string, many?: string) => {
    const v = data[name];
    if (v === undefined) return whole;
    const text = typeof v === 'number' ? referenceFormatNumber(v) : String(v);
    return one === undefined ? text : `${text} ${v === 1 ? one : many}`;
  });
}

describe('formatNumber and fillTemplate against their regular-expression reference', () => {
  const numbers = fc.oneof(
    fc.double(),
    fc.integer(),
    fc.double({ min: -1e-3, max: 1e-3 }),
    fc.constantFrom(1e21, -1e21, 2 ** 53, 1e300, -0, 0.0005, -0.0005, 0.9995, 1e-9, 9.9e-10, 123456789.0004),
  );

  it('formats every number as the reference does, at 0 to 6 digits (fast-check, seed 61)', () => {
    fc.assert(fc.property(numbers, fc.integer({ min: 0, max: 6 }), (v, digits) => {
      expect(formatNumber(v, digits)).toBe(referenceFormatNumber(v, digits));
    }), { seed: 61, numRuns: 20000 });
  });

  it('prints integers without decimals, the exact value beyond 2^53 and exponents from 1e21', () => {
    expect([formatNumber(42), formatNumber(-7), formatNumber(2 ** 60), formatNumber(1e21)]).toEqual(['42', '-7', '1152921504606846976', '1e+21']);
  });

  it('fills templates as the reference does, the same template many times over (fast-check, seed 67)', () => {
    const templates = fc.constantFrom(
      'Contour #{contour} is open: its end is {gapMm} mm from its start.',
      'Not analysed: {count|entity|entities}; {count|one|} {missing} {a}{b}',
      'no placeholders',
      '{a}',
      '{} {a|x} {a|x|y|z} {a||} {b}',
    );
    const data = fc.record({ contour: numbers, gapMm: numbers, count: fc.oneof(fc.constant(1), numbers), a: fc.oneof(fc.string(), fc.boolean(), numbers), b: fc.string() }, { requiredKeys: [] });
    fc.assert(fc.property(templates, data, (t, d) => {
      expect(fillTemplate(t, d)).toBe(referenceFillTemplate(t, d));
    }), { seed: 67, numRuns: 5000 });
  });
});
