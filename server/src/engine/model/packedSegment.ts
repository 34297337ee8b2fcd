/**
 * Segments that read their coordinates from a shared Float64Array. A segment object with its numbers
 * as fields holds each number as a heap box of its own (V8 keeps no double unboxed in an object), so a
 * line is 5 heap objects and an arc 13; a million-segment drawing is then hundreds of megabytes that
 * every collection walks. These hold the array, an offset and the span's two offsets: one small
 * object a segment (its `span` is made when asked for, a new object each time),
 * the numbers in one block. They satisfy the `Segment` interfaces field for field (getters), so no
 * reader of segments can tell them apart from plain ones, except that they are not plain data: a
 * spread or `Object.keys` sees only `span`. Nothing in the engine copies segments that way; tests
 * compare them through a plain copy (test/support/shapes.ts `toPlainSegment`).
 *
 * Layout at offset o: the coordinates in `Segment` field order after `kind` (line x0 y0 x1 y1; quad
 * … x2 y2; cubic … x3 y3; arc x0 y0 x1 y1 cx cy ux uy vx vy theta0 sweep).
 */
import type { Arc, Cubic, Line, Quad, Segment, SourceSpan } from '../types';
import { keepShape } from '../keepShape';

abstract class PackedSegment {
  constructor(readonly c: Float64Array, readonly o: number, private readonly spanStart: number, private readonly spanEnd: number) {}
  get span(): SourceSpan { return { start: this.spanStart, end: this.spanEnd }; }
  get x0(): number { return this.c[this.o]!; }
  get y0(): number { return this.c[this.o + 1]!; }
  get x1(): number { return this.c[this.o + 2]!; }
  get y1(): number { return this.c[this.o + 3]!; }
}

class PackedLine extends PackedSegment implements Line {
  get kind(): 'line' { return 'line'; }
}

class PackedQuad extends PackedSegment implements Quad {
  get kind(): 'quad' { return 'quad'; }
  get x2(): number { return this.c[this.o + 4]!; }
  get y2(): number { return this.c[this.o + 5]!; }
}

class PackedCubic extends PackedSegment implements Cubic {
  get kind(): 'cubic' { return 'cubic'; }
  get x2(): number { return this.c[this.o + 4]!; }
  get y2(): number { return this.c[this.o + 5]!; }
  get x3(): number { return this.c[this.o + 6]!; }
  get y3(): number { return this.c[this.o + 7]!; }
}

class PackedArc extends PackedSegment implements Arc {
  get kind(): 'arc' { return 'arc'; }
  get cx(): number { return this.c[this.o + 4]!; }
  get cy(): number { return this.c[this.o + 5]!; }
  get ux(): number { return this.c[this.o + 6]!; }
  get uy(): number { return this.c[this.o + 7]!; }
  get vx(): number { return this.c[this.o + 8]!; }
  get vy(): number { return this.c[this.o + 9]!; }
  get theta0(): number { return this.c[this.o + 10]!; }
  get sweep(): number { return this.c[this.o + 11]!; }
}

/** The segment of `kind` whose coordinates are at c[o…] (see the layout above), with the span [spanStart,
 *  spanEnd); c must not change after. */
export function makePackedSegment(kind: Segment['kind'], c: Float64Array, o: number, spanStart: number, spanEnd: number): Segment {
  switch (kind) {
    case 'line': return new PackedLine(c, o, spanStart, spanEnd);
    case 'quad': return new PackedQuad(c, o, spanStart, spanEnd);
    case 'cubic': return new PackedCubic(c, o, spanStart, spanEnd);
    case 'arc': return new PackedArc(c, o, spanStart, spanEnd);
  }
}

/**
 * One packed segment of each kind, kept for the life of the process for its layout (keepShape.ts):
 * without them, a full collection after an analysis's segments became garbage took the optimised code
 * of every function that reads segments (measures, bounds, pieces, hull), and the next analysis ran
 * unoptimised until the compiler caught up (~10 % of the steady state on 1e5 loose DXF entities).
 */
for (const kind of ['line', 'quad', 'cubic', 'arc'] as const) keepShape(makePackedSegment(kind, new Float64Array(12), 0, 0, 0));

/** The same segment with another span (a packed one shares its coordinates). */
export function withSpan(s: Segment, span: SourceSpan): Segment {
  return s instanceof PackedSegment ? makePackedSegment(s.kind, s.c, s.o, span.start, span.end) : { ...s, span };
}

/**
 * Where a reader writes packed segments: chunks of coordinates that are never moved (segments keep
 * reading the chunk they were written to), each twice the last up to MAX_CHUNK numbers, the first
 * sized by the caller's estimate, so a small drawing holds little and a huge one no huge copy.
 */
export class PackedSegmentWriter implements SegmentSink {
  /** The chunk `reserve` last returned an offset into. */
  chunk: Float64Array;
  private used = 0;

  constructor(estimate: number) {
    this.chunk = new Float64Array(Math.min(MAX_CHUNK, Math.max(16, estimate)));
  }

  /** Drops the chunk written last (the segments made keep theirs); the writer is not used again. */
  release(): void {
    this.chunk = new Float64Array(0);
    this.used = 0;
  }

  /** Room for n coordinates: their offset in `chunk` (a new chunk when the current one is full). */
  reserve(n: number): number {
    if (this.used + n > this.chunk.length) {
      this.chunk = new Float64Array(Math.max(n, Math.min(MAX_CHUNK, 2 * this.chunk.length)));
      this.used = 0;
    }
    const o = this.used;
    this.used += n;
    return o;
  }

  line(x0: number, y0: number, x1: number, y1: number, spanStart: number, spanEnd: number): Segment {
    const o = this.reserve(4), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1;
    return new PackedLine(c, o, spanStart, spanEnd);
  }

  quad(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, spanStart: number, spanEnd: number): Segment {
    const o = this.reserve(6), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = x2; c[o + 5] = y2;
    return new PackedQuad(c, o, spanStart, spanEnd);
  }

  cubic(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, spanStart: number, spanEnd: number): Segment {
    const o = this.reserve(8), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = x2; c[o + 5] = y2; c[o + 6] = x3; c[o + 7] = y3;
    return new PackedCubic(c, o, spanStart, spanEnd);
  }

  arc(
    x0: number, y0: number, x1: number, y1: number, cx: number, cy: number,
    ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number, spanStart: number, spanEnd: number,
  ): Segment {
    const o = this.reserve(12), c = this.chunk;
    c[o] = x0; c[o + 1] = y0; c[o + 2] = x1; c[o + 3] = y1; c[o + 4] = cx; c[o + 5] = cy;
    c[o + 6] = ux; c[o + 7] = uy; c[o + 8] = vx; c[o + 9] = vy; c[o + 10] = theta0; c[o + 11] = sweep;
    return new PackedArc(c, o, spanStart, spanEnd);
  }
}

/**
 * Something that makes segments from their fields: packed (PackedSegmentWriter) or plain
 * (`plainSegments`). The span comes as its two offsets, so a packed segment needs no span object.
 */
export interface SegmentSink {
  line(x0: number, y0: number, x1: number, y1: number, spanStart: number, spanEnd: number): Segment;
  quad(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, spanStart: number, spanEnd: number): Segment;
  cubic(x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, x3: number, y3: number, spanStart: number, spanEnd: number): Segment;
  arc(
    x0: number, y0: number, x1: number, y1: number, cx: number, cy: number,
    ux: number, uy: number, vx: number, vy: number, theta0: number, sweep: number, spanStart: number, spanEnd: number,
  ): Segment;
}

/** Plain segment objects, for the few segments made outside a drawing's bulk (fixes, small shapes). */
export const plainSegments: SegmentSink = {
  line: (x0, y0, x1, y1, start, end) => ({ kind: 'line', x0, y0, x1, y1, span: { start, end } }),
  quad: (x0, y0, x1, y1, x2, y2, start, end) => ({ kind: 'quad', x0, y0, x1, y1, x2, y2, span: { start, end } }),
  cubic: (x0, y0, x1, y1, x2, y2, x3, y3, start, end) => ({ kind: 'cubic', x0, y0, x1, y1, x2, y2, x3, y3, span: { start, end } }),
  arc: (x0, y0, x1, y1, cx, cy, ux, uy, vx, vy, theta0, sweep, start, end) => ({ kind: 'arc', x0, y0, x1, y1, cx, cy, ux, uy, vx, vy, theta0, sweep, span: { start, end } }),
};

/** Largest chunk of a PackedSegmentWriter: 512 KB. */
const MAX_CHUNK = 1 << 16;
