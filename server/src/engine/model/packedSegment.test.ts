import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { toPlainSegment } from '../../../../test/support/shapes';
import type { Segment } from '../types';
import { PackedSegmentWriter, plainSegments, withSpan, type SegmentSink } from './packedSegment';

const span = { start: 3, end: 9 };

/** The same four segments made by a sink. */
function fourOf(sink: SegmentSink, v: readonly number[]): Segment[] {
  return [
    sink.line(v[0]!, v[1]!, v[2]!, v[3]!, span.start, span.end),
    sink.quad(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, span.start, span.end),
    sink.cubic(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, v[6]!, v[7]!, span.start, span.end),
    sink.arc(v[0]!, v[1]!, v[2]!, v[3]!, v[4]!, v[5]!, v[6]!, v[7]!, v[8]!, v[9]!, v[10]!, v[11]!, span.start, span.end),
  ];
}

describe('packed segments', () => {
  it('read back every field bit for bit, across chunk boundaries, as the plain segments with the same fields (IEEE 754 binary64 is stored exactly; fast-check, seed 81)', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.double(), { minLength: 12, maxLength: 12 }), { minLength: 1, maxLength: 40 }), fc.integer({ min: 1, max: 40 }), (rows, estimate) => {
        const writer = new PackedSegmentWriter(estimate);
        const packed = rows.flatMap((v) => fourOf(writer, v));
        const plain = rows.flatMap((v) => fourOf(plainSegments, v));
        // Compared after all are written: a later chunk must not disturb an earlier segment.
        packed.forEach((s, i) => {
          const a = toPlainSegment(s) as unknown as Record<string, unknown>, b = plain[i] as unknown as Record<string, unknown>;
          expect(Object.keys(a)).toEqual(Object.keys(b));
          for (const k of Object.keys(b)) {
            if (k === 'span') expect(a[k]).toEqual(b[k]);
            else expect(Object.is(a[k], b[k])).toBe(true);
          }
        });
      }),
      { seed: 81, numRuns: 100 },
    );
  });

  it('take another span with withSpan and keep their coordinates, packed or plain', () => {
    const other = { start: 20, end: 30 };
    for (const s of [...fourOf(new PackedSegmentWriter(4), [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]), ...fourOf(plainSegments, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12])]) {
      const moved = withSpan(s, other);
      expect(moved.span).toEqual(other);
      expect({ ...toPlainSegment(moved), span: span }).toEqual(toPlainSegment(s));
      expect(s.span).toEqual(span);
    }
  });
});
