import { describe, expect, it } from 'vitest';
import doubleCut from './double-cut';
import { readSvg } from '../formats/svg/readSvg';
import { measureContour } from '../geometry/measure';
import { wrapSvg } from '../../../../test/support/checkCases';
import { DEFAULT_OPTIONS } from '../index';
import type { CheckDefinition } from './defineCheck';
import type { RawFinding } from '../types';

/** Runs one check on an SVG snippet (1 user unit = 1 mm) and returns its findings with the text they cover. */
function run(check: CheckDefinition, svg: string) {
  const text = wrapSvg(svg);
  const read = readSvg(text, { assumedUnit: 'auto' });
  const contours = read.contours.map((contour) => ({ contour, metrics: measureContour(contour, read.yAxis) }));
  const found: RawFinding[] = [];
  check.run!({ read, contours, options: DEFAULT_OPTIONS, report: (f) => found.push({ ...f, checkId: check.id }) });
  return found.map((f) => ({ messageId: f.messageId, at: text.slice(f.span.start, f.span.end), data: f.data, related: f.related?.map((r) => text.slice(r.span.start, r.span.end)) }));
}

describe('double-cut', () => {
  it('accepts two squares sharing only a corner', () => {
    expect(run(doubleCut, '<path d="M0 0H10V10H0Z"/><path d="M10 10H20V20H10Z"/>')).toEqual([]);
  });
  it('reports a duplicated circle as cut twice over its whole length 2πr (REFERENCES.md §2.1)', () => {
    const f = run(doubleCut, '<circle cx="10" cy="10" r="5"/><circle cx="10" cy="10" r="5"/>');
    expect(f).toHaveLength(1);
    expect(f[0]!.messageId).toBe('otherContour');
    expect(f[0]!.data.lengthMm).toBeCloseTo(10 * Math.PI, 9);
    expect(f[0]!.data.otherContour).toBe(0);
  });
  it('reports a spike that doubles back along the previous line (REFERENCES.md §4.8)', () => {
    expect(run(doubleCut, '<path d="M0 0L4 0L2 0L2 3Z"/>')).toEqual([
      { messageId: 'sameContour', at: 'L2 0', data: { lengthMm: 2 }, related: ['L4 0'] },
    ]);
  });
  it('reports two squares sharing 6 mm of an edge (by hand)', () => {
    const f = run(doubleCut, '<path d="M0 0H10V5H0Z"/><path d="M4 0H14V-5H4Z"/>');
    expect(f.map((x) => x.data.lengthMm)).toEqual([6]);
  });
});
