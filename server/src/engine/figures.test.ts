import { describe, expect, it } from 'vitest';
import { dxf, line } from '../../../test/support/dxfText';
import { getContourAt, toFigures } from './figures';
import { analyze } from './index';

describe('getContourAt', () => {
  it('finds a DXF contour chained from loose entities on every one of its entities, not only the first', () => {
    // Two separate chains (common practice, no source): a square of 4 LINEs and a triangle of 3, interleaved in the file.
    const square = [line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 10), line(0, 10, 0, 0)];
    const triangle = [line(20, 0, 30, 0), line(30, 0, 20, 10), line(20, 10, 20, 0)];
    const entities = [square[0], triangle[0], square[1], triangle[1], square[2], triangle[2], square[3]];
    const text = dxf(...entities);
    const result = toFigures(analyze(text, 'dxf'));
    expect(result.contours).toHaveLength(2);
    let from = 0;
    entities.forEach((e, i) => {
      const at = text.indexOf(e.join('\n'), from);
      from = at + 1;
      const found = getContourAt(result, at + 3);
      expect(found?.contour.index, `entity ${i}`).toBe(square.includes(e) ? 0 : 1);
    });
    expect(getContourAt(result, text.indexOf('ENTITIES'))).toBeUndefined();
  });
});

describe('toFigures', () => {
  it('keeps every figure and finding, and each segment span in order', () => {
    const text = dxf(line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 0.05));
    const result = analyze(text, 'dxf');
    const figures = toFigures(result);
    expect(figures.findings).toEqual(result.findings);
    expect(figures.summary).toEqual(result.summary);
    const [full] = result.contours;
    const [slim] = figures.contours;
    expect(slim!.metrics).toEqual(full!.metrics);
    expect(slim!.geometry).toEqual(full!.geometry);
    expect('segments' in slim!.contour).toBe(false);
    expect(Array.from(slim!.contour.segmentSpans)).toEqual(full!.contour.segments.flatMap((s) => [s.span.start, s.span.end]));
  });

  it('copies an SVG path contour whose segments are stored without making them: every other field, and the spans from the store (an invariant of our own)', () => {
    const text = '<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20"><path id="p" d="M0 0 L10 0 Q15 5 10 10 C5 12 2 8 0 10 A5 5 0 0 1 0 0Z M12 12 h2"/></svg>';
    const figures = toFigures(analyze(text, 'svg'));
    const result = analyze(text, 'svg');
    for (const [k, { contour }] of result.contours.entries()) {
      expect(contour.stored).toBeDefined();
      const slim = figures.contours[k]!.contour;
      expect('segments' in slim || 'stored' in slim).toBe(false);
      const { segments, stored: _stored, ...rest } = contour;
      expect({ ...slim, segmentSpans: undefined }).toEqual({ ...rest, segmentSpans: undefined });
      expect(Array.from(slim.segmentSpans)).toEqual(segments.flatMap((s) => [s.span.start, s.span.end]));
    }
  });
});
