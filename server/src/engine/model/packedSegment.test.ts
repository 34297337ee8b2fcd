import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { toPlainSegment } from '../../../../test/support/shapes';
import type { Segment } from '../types';
import { getSegmentAt, getSegmentCount, plainSegments, SegmentStore, SegmentView, withSpan, withStoredSegments, type SegmentSink } from './packedSegment';

const span = { start: 3, end: 9 };

/** The same four segments given to a sink. */
function fourOf<T>(sink: SegmentSink<T>, v: readonly number[]): T[] {
  return [
    sink.line(v[0]!, v[1]!, v[2]!, v[3]!, span.start, span.end),
    sink.quad(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, span.start, span.end),
    sink.cubic(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, v[6]!, v[7]!, span.start, span.end),
    sink.arc(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, v[6]!, v[7]!, v[8]!, v[9]!, v[10]!, v[11]!, span.start, span.end),
  ];
}

describe('packed segments', () => {
  it('read back every field bit for bit, across chunk boundaries, made or viewed, as the plain segments with the same fields (IEEE 754 binary64 is stored exactly; fast-check, seed 81)', () => {
    const view = new SegmentView();
    fc.assert(
      fc.property(fc.array(fc.array(fc.double(), { minLength: 12, maxLength: 12 }), { minLength: 1, maxLength: 40 }), fc.integer({ min: 1, max: 40 }), (rows, estimate) => {
        const store = new SegmentStore(estimate);
        for (const v of rows) fourOf(store, v);
        const plain = rows.flatMap((v) => fourOf(plainSegments, v));
        expect(store.count).toBe(plain.length);
        // Compared after all are written: a later chunk must not disturb an earlier segment.
        plain.forEach((p, i) => {
          for (const s of [store.makeSegment(i), store.load(view, i) as unknown as Segment]) {
            const a = toPlainSegment(s) as unknown as Record<string, unknown>, b = p as unknown as Record<string, unknown>;
            expect(Object.keys(a)).toEqual(Object.keys(b));
            for (const k of Object.keys(b)) {
              if (k === 'span') expect(a[k]).toEqual(b[k]);
              else expect(Object.is(a[k], b[k])).toBe(true);
            }
          }
        });
      }),
      { seed: 81, numRuns: 100 },
    );
  });

  it('take another span with withSpan and keep their coordinates, packed or plain', () => {
    const other = { start: 20, end: 30 };
    const store = new SegmentStore(4);
    fourOf(store, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    for (const s of [0, 1, 2, 3].map((i) => store.makeSegment(i)).concat(fourOf(plainSegments, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]))) {
      const moved = withSpan(s, other);
      expect(moved.span).toEqual(other);
      expect({ ...toPlainSegment(moved), span: span }).toEqual(toPlainSegment(s));
      expect(s.span).toEqual(span);
    }
  });

  it('make the segments of a stored contour on first read, once, and read them in place the same: field for field, by getSegmentAt (an invariant of our own)', () => {
    const store = new SegmentStore(8);
    fourOf(store, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    fourOf(store, [-1, -2, -3, -4, -5, -6, -7, -8, -9, -10, -11, -12]);
    const contour = withStoredSegments({ index: 0, closed: false }, { store, first: 2, count: 5 });
    expect(getSegmentCount(contour)).toBe(5);
    const made = contour.segments;
    expect(made).toBe(contour.segments);
    expect(made.map((s) => s.kind)).toEqual(['cubic', 'arc', 'line', 'quad', 'cubic']);
    const view = new SegmentView();
    made.forEach((s, i) => expect(toPlainSegment(getSegmentAt(contour, i, view))).toEqual(toPlainSegment(s)));
    // A spread reads the segments like a data field and keeps where they are stored.
    const copy = { ...contour, closed: true };
    expect(copy.segments).toBe(made);
    expect(copy.stored).toBe(contour.stored);
    const plain = { segments: [plainSegments.line(0, 0, 1, 1, 0, 1)] };
    expect(getSegmentCount(plain)).toBe(1);
    expect(getSegmentAt(plain, 0, view)).toBe(plain.segments[0]);
  });
});
