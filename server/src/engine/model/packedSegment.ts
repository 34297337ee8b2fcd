/**
 * Segments that read their coordinates from a shared Float64Array. A segment object with its numbers
 * as fields holds each number as a heap box of its own (V8 keeps no double unboxed in an object), so a
 * line is 5 heap objects and an arc 13; a million-segment drawing is then hundreds of megabytes that
 * every collection walks. These hold the array, an offset and the span: one small object a segment,
 * the numbers in one block. They satisfy the `Segment` interfaces field for field (getters), so no
 * reader of segments can tell them apart from plain ones, except that they are not plain data: a
 * spread or `Object.keys` sees only `span`. Nothing in the engine copies segments that way; tests
 * compare them through a plain copy (test/support/shapes.ts `toPlainSegment`).
 *
 * Layout at offset o: the coordinates in `Segment` field order after `kind` (line x0 y0 x1 y1; quad
 * … x2 y2; cubic … x3 y3; arc x0 y0 x1 y1 cx cy ux uy vx vy theta0 sweep).
 */
import type { Arc, Cubic, Line, Quad, Segment, SourceSpan } from '../types';

/** Number of coordinates of a segment of each kind, in the layout above. */
export const PACKED_COORDINATES = { line: 4, quad: 6, cubic: 8, arc: 12 } as const;

abstract class PackedSegment {
  constructor(protected readonly c: Float64Array, protected readonly o: number, readonly span: SourceSpan) {}
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

/** The segment of `kind` whose coordinates are at c[o…] (see the layout above); c must not change after. */
export function makePackedSegment(kind: Segment['kind'], c: Float64Array, o: number, span: SourceSpan): Segment {
  switch (kind) {
    case 'line': return new PackedLine(c, o, span);
    case 'quad': return new PackedQuad(c, o, span);
    case 'cubic': return new PackedCubic(c, o, span);
    case 'arc': return new PackedArc(c, o, span);
  }
}
