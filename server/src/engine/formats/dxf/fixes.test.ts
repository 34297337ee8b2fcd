/**
 * The DXF quick fixes of issue 4, each applied to the text and re-analysed through the facade: the
 * problem is gone and the text differs only where the fix says. Group codes: REFERENCES.md §6.4
 * (LINE 10/20, 11/21; LWPOLYLINE 90 count, 70 flags bit 1 = closed; POLYLINE/VERTEX/SEQEND).
 */
import { describe, expect, it } from 'vitest';
import { applyEdits } from '../../../../../test/support/applyEdits';
import { dxf, line } from '../../../../../test/support/dxfText';
import { analyze } from '../../index';
import type { AnalysisResult, Finding } from '../../types';

const ids = (r: AnalysisResult) => r.findings.map((f) => f.checkId);
const only = (r: AnalysisResult, id: string): Finding => {
  const found = r.findings.filter((f) => f.checkId === id);
  expect(found, id).toHaveLength(1);
  return found[0];
};

describe('DXF quick fixes, applied and re-analysed', () => {
  it('near-closed chain: moves the free end of the last LINE onto the start, editing its y value line only', () => {
    // A 10 × 10 square of loose LINEs whose last LINE stops 0.05 mm short of the start.
    const text = dxf(line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 10), line(0, 10, 0, 0.05));
    const before = analyze(text, 'dxf');
    const f = only(before, 'near-closed');
    expect(f.data.gapMm).toBeCloseTo(0.05, 12);
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('\n21\n0.05\n', '\n21\n0\n'));
    const after = analyze(fixed, 'dxf');
    expect(ids(after)).toEqual([]);
    expect(after.contours[0].contour.closed).toBe(true);
    expect(after.contours[0].metrics.areaMm2).toEqual({ value: 100 }); // 10 × 10 square, shoelace
  });

  it('near-closed chain with a reversed last piece: moves the end value lines of the piece that holds the free end', () => {
    // The closing LINE is drawn backwards, from near the start (0, 0.05) to (0, 10).
    const text = dxf(line(0, 0, 10, 0), line(10, 0, 10, 10), line(10, 10, 0, 10), line(0, 0.05, 0, 10));
    const f = only(analyze(text, 'dxf'), 'near-closed');
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('\n20\n0.05\n', '\n20\n0\n'));
    expect(ids(analyze(fixed, 'dxf'))).toEqual([]);
  });

  it('near-closed clamped SPLINE: moves its last control point (the curve\'s end) onto the first', () => {
    // Degree 1, clamped knots: the curve runs through its control points (REFERENCES.md §6.4 SPLINE groups).
    const text = dxf(['0', 'SPLINE', '8', 'CUT', '70', 8, '71', 1, '72', 6, '73', 4, '40', 0, '40', 0, '40', 1, '40', 2, '40', 3, '40', 3,
      '10', 0, '20', 0, '30', 0, '10', 10, '20', 0, '30', 0, '10', 10, '20', 10, '30', 0, '10', 0, '20', 0.05, '30', 0]);
    const f = only(analyze(text, 'dxf'), 'near-closed');
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('10\n0\n20\n0.05\n', '10\n0\n20\n0\n'));
    const after = analyze(fixed, 'dxf');
    expect(ids(after)).toEqual([]);
    expect(after.contours[0].contour.closed).toBe(true); // its ends now meet, as loose pieces' ends do
    expect(after.contours[0].metrics.areaMm2).toEqual({ value: 50 }); // right triangle ½·10·10
  });

  it('LWPOLYLINE whose last vertex nearly equals the first: sets the closed flag and drops that vertex', () => {
    const text = dxf(['0', 'LWPOLYLINE', '8', 'CUT', '90', 5, '70', 0, '10', 0, '20', 0, '10', 10, '20', 0, '10', 10, '20', 10, '10', 0, '20', 10, '10', 0.03, '20', 0.04]);
    const f = only(analyze(text, 'dxf'), 'near-closed');
    expect(f.data.gapMm).toBeCloseTo(0.05, 12); // 3-4-5 triangle, hundredths of a mm
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('90\n5\n70\n0\n', '90\n4\n70\n1\n').replace('10\n0.03\n20\n0.04\n', ''));
    const after = analyze(fixed, 'dxf');
    expect(ids(after)).toEqual([]);
    expect(after.contours[0].metrics.areaMm2).toEqual({ value: 100 });
  });

  it('LWPOLYLINE without a 70 group: inserts the flag before its first vertex, padded like its code lines', () => {
    const text = dxf(['0', 'LWPOLYLINE', '8', 'CUT', '90', 4, '10', 0, '20', 0, '10', 10, '20', 0, '10', 10, '20', 10, '10', 0, '20', 0]);
    const f = only(analyze(text, 'dxf'), 'near-closed');
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('90\n4\n10\n0\n', '90\n3\n70\n1\n10\n0\n').replace('10\n10\n20\n10\n10\n0\n20\n0\n', '10\n10\n20\n10\n'));
    const after = analyze(fixed, 'dxf');
    expect(ids(after)).toEqual([]);
    expect(after.contours[0].metrics.areaMm2).toEqual({ value: 50 }); // right triangle ½·10·10
  });

  it('POLYLINE whose last VERTEX repeats the first: sets the closed flag and removes that VERTEX entity', () => {
    const vertex = (x: number, y: number) => ['0', 'VERTEX', '8', 'CUT', '10', x, '20', y, '30', 0];
    const text = dxf(['0', 'POLYLINE', '8', 'CUT', '66', 1, '10', 0, '20', 0, '30', 0, '70', 0,
      ...vertex(0, 0), ...vertex(10, 0), ...vertex(10, 10), ...vertex(0, 10), ...vertex(0, 0), '0', 'SEQEND', '8', 'CUT']);
    const f = only(analyze(text, 'dxf'), 'near-closed');
    expect(f.messageId).toBe('touching');
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(text.replace('30\n0\n70\n0\n', '30\n0\n70\n1\n').replace('0\nVERTEX\n8\nCUT\n10\n0\n20\n0\n30\n0\n0\nSEQEND', '0\nSEQEND'));
    const after = analyze(fixed, 'dxf');
    expect(ids(after)).toEqual([]);
    expect(after.contours[0].contour.closed).toBe(true);
    expect(after.contours[0].metrics.areaMm2).toEqual({ value: 100 });
  });

  it('exact duplicate entity: removes the copy and nothing else', () => {
    const circle = ['0', 'CIRCLE', '8', 'CUT', '10', 5, '20', 5, '40', 2];
    const text = dxf(circle, line(0, 0, 1, 0), circle);
    const f = only(analyze(text, 'dxf'), 'duplicate-entity');
    const fixed = applyEdits(text, f.fixes![0].edits);
    expect(fixed).toBe(dxf(circle, line(0, 0, 1, 0)));
    const after = analyze(fixed, 'dxf');
    expect(after.findings.filter((x) => x.checkId === 'duplicate-entity')).toEqual([]);
    // The rest is analysed as before: the lone LINE is still an open contour.
    expect(ids(after)).toEqual(['open-contour']);
  });
});

describe('DXF findings on chained contours', () => {
  it('puts a chain\'s gap finding on the entity at the gap, with related information at the other end', () => {
    const text = dxf(line(10, 0, 10, 10), line(0, 0, 10, 0), line(10, 10, 0, 10), line(0, 10, 0, 0.05));
    const f = only(analyze(text, 'dxf'), 'near-closed');
    expect(text.slice(f.span.start, f.span.end)).toBe(line(0, 10, 0, 0.05).join('\n') + '\n');
    expect(f.related).toHaveLength(1);
    expect(text.slice(f.related![0].span.start, f.related![0].span.end)).toBe(line(0, 0, 10, 0).join('\n') + '\n');
  });
});
