import { describe, expect, it } from 'vitest';
import { analyze } from '../index';

// CSS Values and Units Level 3, "Absolute lengths": 1in = 96px = 25.4mm, so 1px = 25.4/96 mm.
describe('units-assumed', () => {
  const noSize = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100"><path d="M0 0H10V10H0Z"/></svg>';

  it('reports a file without width and height at its root tag, assuming CSS px', () => {
    const result = analyze(noSize, 'svg');
    const found = result.findings.filter((f) => f.checkId === 'units-assumed');
    expect(found).toHaveLength(1);
    expect(noSize.slice(found[0]!.span.start, found[0]!.span.end)).toBe('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100">');
    expect(found[0]!.data.unit).toBe('px');
    expect(found[0]!.data.mmPerUnit).toBeCloseTo(25.4 / 96, 15);
    expect(result.units).toMatchObject({ declared: false, assumed: 'px' });
  });

  it('uses the assumed unit the user chose', () => {
    const result = analyze(noSize, 'svg', { assumedUnit: 'mm' });
    expect(result.units.mmPerUnit).toBe(1);
    // 10 × 10 square at 1 mm per unit: perimeter 40 mm.
    expect(result.contours[0]!.metrics.perimeterMm.value).toBeCloseTo(40, 12);
  });

  it('is silent when the root declares a physical size', () => {
    const sized = '<svg xmlns="http://www.w3.org/2000/svg" width="10cm" height="10cm" viewBox="0 0 100 100"/>';
    expect(analyze(sized, 'svg').findings.filter((f) => f.checkId === 'units-assumed')).toEqual([]);
  });

  it('can be turned off by a severity setting', () => {
    expect(analyze(noSize, 'svg', { severity: { 'units-assumed': 'off' } }).findings).toEqual([]);
  });
});
