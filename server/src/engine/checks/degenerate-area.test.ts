import { describe, expect, it } from 'vitest';
import degenerateArea from './degenerate-area';
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

describe('degenerate-area', () => {
  it('accepts a square and a bow-tie (whose zero net area is a crossing, not a sliver; REFERENCES.md §1.4)', () => {
    expect(run(degenerateArea, '<path d="M0 0H10V10H0Z"/><path d="M20 0L22 2L22 0L20 2Z"/>')).toEqual([]);
  });
  it('reports a closed contour drawn out and back along one line: area 0 for 20 mm of outline (by hand)', () => {
    expect(run(degenerateArea, '<path d="M0 0L10 0Z"/>')).toEqual([
      { messageId: 'degenerate', at: 'M0 0L10 0Z', data: { areaMm2: 0, perimeterMm: 20 }, related: undefined },
    ]);
  });
});
