import { describe, expect, it } from 'vitest';
import { wrapSvg } from '../../../../test/support/checkCases';
import { analyze } from '../index';

const parseErrors = (text: string) => analyze(text, 'svg').findings.filter((f) => f.checkId === 'parse-error');

// Error handling per SVG 2 Paths, "Error handling in path data" (REFERENCES §5.2): render up to the
// command holding the first error, report it, keep analysing the rest of the file.
describe('parse-error', () => {
  it('points at the first character that breaks the path data and keeps the segments before it', () => {
    const text = wrapSvg('<path d="M 10,10 L 20,20,30"/>');
    const [f] = parseErrors(text);
    expect(f).toBeDefined();
    expect(f!.severity).toBe('error');
    expect(f!.messageId).toBe('pathData');
    expect(f!.span.start).toBeGreaterThan(text.indexOf(',30'));
    const result = analyze(text, 'svg');
    // M 10,10 L 20,20 survives: one segment of length √200.
    expect(result.contours[0]!.metrics.lengthMm).toBeCloseTo(Math.hypot(10, 10), 12);
  });

  it('reports malformed XML at its position and still measures the elements before it', () => {
    const text = wrapSvg('<rect width="10" height="20"/>\n<circle r="5" cx="0" cy="0"');
    const errors = parseErrors(text);
    expect(errors.length).toBeGreaterThan(0);
    expect(errors[0]!.messageId).toBe('xml');
    expect(errors[0]!.span.start).toBeGreaterThanOrEqual(text.indexOf('<circle'));
    // The rectangle: perimeter 2(a + b) = 60 mm.
    expect(analyze(text, 'svg').contours[0]!.metrics.perimeterMm.value).toBeCloseTo(60, 12);
  });

  it('fills every message without placeholders or NaN', () => {
    const text = wrapSvg('<path d="M0 0 L1e"/><polyline points="0,0 10"/><rect width="abc" height="5"/>');
    const errors = parseErrors(text);
    expect(errors.length).toBeGreaterThanOrEqual(2);
    for (const e of errors) expect(e.message).not.toMatch(/\{\w+\}|NaN|undefined/);
  });

  it('never throws on text that is not XML at all', () => {
    for (const junk of ['', '\u0000\u0001\u0002', 'MZ\u0090\u0000', '<<<>>>', '<svg', 'a'.repeat(10000)]) {
      expect(() => analyze(junk, 'svg')).not.toThrow();
    }
  });
});
