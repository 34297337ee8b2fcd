import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { wrapSvg } from '../../../test/support/checkCases';
import { AnalysisCancelled, analyze, analyzeOutlines, getFormatForPath, measureShapes, toFigures, withShapes } from './index';

describe('analyze', () => {
  it('sorts findings by span start, then end, and keeps the check order for equal spans', () => {
    // The last lineto repeats the point before it and ends on the start: near-closed ("touching")
    // and zero-length-segment cover the same text; near-closed runs first.
    const text = wrapSvg('<path d="M0 0 L10 0 L10 10 L0 0 L0 0"/><path d="M20 0 L30 0 L30 30"/>');
    const { findings } = analyze(text, 'svg');
    const at = findings.map((f) => [f.checkId, text.slice(f.span.start, f.span.end)]);
    expect(at).toEqual([
      ['near-closed', 'L0 0'],
      ['zero-length-segment', 'L0 0'],
      ['open-contour', 'L30 30'],
    ]);
    for (let i = 1; i < findings.length; i++) {
      const a = findings[i - 1]!.span, b = findings[i]!.span;
      expect(a.start < b.start || (a.start === b.start && a.end <= b.end)).toBe(true);
    }
  });

  it('leaves out checks set to off and applies severity overrides', () => {
    const text = wrapSvg('<path d="M0 0 L10 0 L10 10 L0 0 L0 0"/>');
    const { findings } = analyze(text, 'svg', { severity: { 'near-closed': 'off', 'zero-length-segment': 'error' } });
    expect(findings.map((f) => [f.checkId, f.severity, f.message])).toEqual([['zero-length-segment', 'error', 'Segment of contour #0 has zero length (0 mm).']]);
  });

  it('interleaves the findings of different checks by position', () => {
    // Open contours (open-contour) and repeated points (zero-length-segment) alternate in the text,
    // apart by comments of growing length; each check reports in document order, the sort interleaves.
    const pads = [0, 100, 3000, 70_000, 20, 10];
    const body = pads.map((pad, i) => `<!--${' '.repeat(pad)}--><g transform="translate(${50 * i})">` + (i % 2 === 0 ? '<path d="M0 0 L10 0 L10 20"/>' : '<path d="M0 0 L10 0 L10 0 L0 20Z"/>') + '</g>');
    const { findings } = analyze(wrapSvg(body.join('')), 'svg');
    expect(findings.map((f) => f.checkId)).toEqual(['open-contour', 'zero-length-segment', 'open-contour', 'zero-length-segment', 'open-contour', 'zero-length-segment']);
    for (let i = 1; i < findings.length; i++) expect(findings[i - 1]!.span.start).toBeLessThan(findings[i]!.span.start);
  });
});

describe('analyzeOutlines and measureShapes: the analysis in two steps', () => {
  const dir = fileURLToPath(new URL('../../../samples/', import.meta.url));
  const samples = readdirSync(dir).filter((f) => getFormatForPath(f));

  it('give together exactly what analyze gives, for every sample (an invariant of our own)', () => {
    expect(samples.length).toBeGreaterThanOrEqual(9);
    for (const file of samples) {
      const text = readFileSync(dir + file, 'utf8');
      const format = getFormatForPath(file)!;
      const outlines = analyzeOutlines(text, format);
      const whole = analyze(text, format);
      const { contours, ...rest } = whole;
      expect(outlines, file).toEqual({ ...rest, contours: contours.map(({ contour, metrics, geometry: { roundness: _r, hull: _h, ...outline } }) => ({ contour, metrics, geometry: outline })) });
      expect(withShapes(toFigures(outlines), measureShapes(outlines)), file).toEqual(toFigures(whole));
    }
  });

  it('leave the roundness and hull out of the first step', () => {
    const [c] = analyzeOutlines(wrapSvg('<rect width="20" height="10"/>'), 'svg').contours;
    expect(Object.keys(c!.geometry).sort()).toEqual(['depth', 'overlaps', 'parent', 'selfIntersections']);
  });

  it('stop measuring shapes between contours once cancelled', () => {
    const outlines = analyzeOutlines(wrapSvg('<rect width="20" height="10"/><rect x="30" width="20" height="10"/>'), 'svg');
    let polls = 0;
    // The first poll comes after the first contour's shape.
    expect(() => measureShapes(outlines, () => ++polls >= 1)).toThrow(AnalysisCancelled);
    expect(polls).toBe(1);
    expect(measureShapes(outlines, () => false)).toHaveLength(2);
  });
});
