import { describe, expect, it } from 'vitest';
import selfCrossing from './self-crossing';
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

describe('self-crossing', () => {
  it('accepts a square', () => {
    expect(run(selfCrossing, '<path d="M0 0H10V10H0Z"/>')).toEqual([]);
  });
  it('reports the bow-tie crossing at (1, 1) on the later segment, with the other as related (REFERENCES.md §1.4)', () => {
    expect(run(selfCrossing, '<path d="M0 0L2 2L2 0L0 2Z"/>')).toEqual([
      { messageId: 'crossing', at: 'L0 2', data: { xMm: 1, yMm: 1 }, related: ['L2 2'] },
    ]);
  });
  it('does not report a touch (self-touch does)', () => {
    expect(run(selfCrossing, '<path d="M0 0L4 0L4 4L2 0L0 4Z"/>')).toEqual([]);
  });
});
