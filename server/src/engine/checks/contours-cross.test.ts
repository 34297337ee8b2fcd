import { describe, expect, it } from 'vitest';
import contoursCross from './contours-cross';
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

describe('contours-cross', () => {
  it('accepts a hole inside its outline', () => {
    expect(run(contoursCross, '<path d="M0 0H10V10H0Z M2 2H8V8H2Z"/>')).toEqual([]);
  });
  it('reports both crossings of two overlapping squares, on the later contour (by hand: x = 10 meets y = 5 at (10, 5); the closing edge x = 5 meets y = 10 at (5, 10))', () => {
    const f = run(contoursCross, '<path d="M0 0H10V10H0Z"/><path d="M5 5H15V15H5Z"/>');
    expect(f.map((x) => [x.at, x.data.xMm, x.data.yMm, x.data.otherContour])).toEqual([
      ['H15', 10, 5, 0],
      ['Z', 5, 10, 0],
    ]);
  });
});
